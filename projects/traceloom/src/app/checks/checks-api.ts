import { HttpClient, httpResource, type HttpResourceRef } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type {
  ComparisonDto,
  ComparisonRequest,
  ReferenceComparisonDto,
  ReferenceDto,
  ReferencePatch,
  ReferencePreview,
  ReferenceSummary,
} from '@traceloom/shared/api';

export type {
  ComparisonDto,
  ReferenceComparisonDto,
  ReferenceDto,
  ReferencePatch,
  ReferencePreview,
  ReferenceRow,
  ReferenceRowError,
  ReferenceSummary,
  RowVerdictDto,
} from '@traceloom/shared/api';

/** The descriptive fields sent along with an uploaded file. */
export interface ReferenceFields {
  title: string;
  normalization: string;
  variable: string;
  note: string;
}

/** Reference tables and comparisons. */
@Injectable({ providedIn: 'root' })
export class ChecksApi {
  private readonly http = inject(HttpClient);

  /** The reference tables of the study `studyId()` as a resource (call in an injection context). */
  referencesResource(studyId: () => string): HttpResourceRef<ReferenceSummary[] | undefined> {
    return httpResource<ReferenceSummary[]>(
      () => `/api/studies/${encodeURIComponent(studyId())}/references`,
    );
  }

  /** The reference table with id `id()` as a resource (call in an injection context). */
  referenceResource(id: () => string): HttpResourceRef<ReferenceDto | undefined> {
    return httpResource<ReferenceDto>(() => `/api/references/${encodeURIComponent(id())}`);
  }

  /** Every comparison of the reference table `id()` with a run, as a resource. */
  referenceComparisonsResource(
    id: () => string,
  ): HttpResourceRef<ReferenceComparisonDto[] | undefined> {
    return httpResource<ReferenceComparisonDto[]>(
      () => `/api/references/${encodeURIComponent(id())}/comparisons`,
    );
  }

  update(id: string, patch: ReferencePatch): Observable<ReferenceDto> {
    return this.http.patch<ReferenceDto>(`/api/references/${encodeURIComponent(id)}`, patch);
  }

  remove(id: string): Observable<void> {
    return this.http.delete<void>(`/api/references/${encodeURIComponent(id)}`);
  }

  /** Parses the file on the server without storing it (`?dryRun=1`). */
  preview(studyId: string, file: File, fields: ReferenceFields): Observable<ReferencePreview> {
    return this.http.post<ReferencePreview>(
      `/api/studies/${encodeURIComponent(studyId)}/references`,
      uploadBody(file, fields),
      { params: { dryRun: 1 } },
    );
  }

  upload(studyId: string, file: File, fields: ReferenceFields): Observable<ReferenceDto> {
    return this.http.post<ReferenceDto>(
      `/api/studies/${encodeURIComponent(studyId)}/references`,
      uploadBody(file, fields),
    );
  }

  /** The stored comparisons of the run `runId()` as a resource (call in an injection context). */
  comparisonsResource(runId: () => string): HttpResourceRef<ComparisonDto[] | undefined> {
    return httpResource<ComparisonDto[]>(
      () => `/api/runs/${encodeURIComponent(runId())}/comparisons`,
    );
  }

  compare(runId: string, body: ComparisonRequest): Observable<ComparisonDto> {
    return this.http.post<ComparisonDto>(
      `/api/runs/${encodeURIComponent(runId)}/comparisons`,
      body,
    );
  }
}

function uploadBody(file: File, fields: ReferenceFields): FormData {
  const body = new FormData();
  body.append('file', file, file.name);
  if (fields.title.trim()) body.append('title', fields.title.trim());
  if (fields.normalization.trim()) body.append('normalization', fields.normalization.trim());
  if (fields.variable.trim()) body.append('variable', fields.variable.trim());
  if (fields.note.trim()) body.append('note', fields.note.trim());
  return body;
}

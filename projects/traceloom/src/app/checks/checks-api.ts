import type { MismatchJson } from '@traceloom/shared/format';
import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { SeriesJson } from './series-diff';
import type { PersonRef } from '../gases/gases-api';

/** One parsed row of a reference table (with the file line it came from). */
export interface ReferenceRow {
  line: number;
  N: number;
  value: string;
  note: string | null;
}

/** A row-level problem of an uploaded table. */
export interface ReferenceRowError {
  line: number;
  message: string;
  field?: string;
}

/** A reference table in a study's list. */
export interface ReferenceSummary {
  id: string;
  studyId: string;
  title: string;
  filename: string;
  normalization: string;
  variable: string;
  createdAt: string;
  createdBy: PersonRef;
  rowCount?: number;
}

/** A stored reference table with its rows. */
export interface ReferenceDto extends ReferenceSummary {
  contentType: string;
  note: string | null;
  rows: ReferenceRow[];
}

/** The dry-run answer of an upload: what would be stored, and what is wrong. */
export interface ReferencePreview {
  rows: ReferenceRow[];
  errors: ReferenceRowError[];
}

/** The descriptive fields sent along with an uploaded file. */
export interface ReferenceFields {
  title: string;
  normalization: string;
  variable: string;
  note: string;
}

/** The verdict for one N of a comparison. */
export interface ComparisonRow {
  N: number;
  /** null: not compared (the computed row is not determined at the order). */
  agrees: boolean | null;
  agreesBelow: string | null;
  firstMismatch: MismatchJson | null;
  /** A differing series row: normalization × Z(N) as computed and the table's value, whole. */
  series?: { computed: SeriesJson; supplied: SeriesJson };
}

/** A stored comparison of a run with a reference table or with its grand function. */
export interface ComparisonDto {
  id: string;
  runId: string;
  referenceId: string | null;
  kind: 'reference' | 'grand';
  normalization: string | null;
  rows: ComparisonRow[];
  summary: { agreeing: number; total: number };
  createdAt: string;
}

/** One comparison of a reference table with a run, as the table's page lists it. */
export interface ReferenceComparison {
  id: string;
  runId: string;
  gasId: string;
  gasTitle: string;
  gasVersion: number;
  normalization: string;
  summary: { agreeing: number; total: number };
  createdAt: string;
}

/** The editable fields of a stored reference table. */
export interface ReferencePatch {
  title?: string;
  normalization?: string;
  note?: string;
}

/** Reference tables and comparisons. */
@Injectable({ providedIn: 'root' })
export class ChecksApi {
  private readonly http = inject(HttpClient);

  references(studyId: string): Observable<ReferenceSummary[]> {
    return this.http.get<ReferenceSummary[]>(
      `/api/studies/${encodeURIComponent(studyId)}/references`,
    );
  }

  reference(id: string): Observable<ReferenceDto> {
    return this.http.get<ReferenceDto>(`/api/references/${encodeURIComponent(id)}`);
  }

  update(id: string, patch: ReferencePatch): Observable<ReferenceDto> {
    return this.http.patch<ReferenceDto>(`/api/references/${encodeURIComponent(id)}`, patch);
  }

  remove(id: string): Observable<void> {
    return this.http.delete<void>(`/api/references/${encodeURIComponent(id)}`);
  }

  referenceComparisons(id: string): Observable<ReferenceComparison[]> {
    return this.http.get<ReferenceComparison[]>(
      `/api/references/${encodeURIComponent(id)}/comparisons`,
    );
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

  comparisons(runId: string): Observable<ComparisonDto[]> {
    return this.http.get<ComparisonDto[]>(`/api/runs/${encodeURIComponent(runId)}/comparisons`);
  }

  compare(
    runId: string,
    body: { referenceId: string } | { grand: true },
  ): Observable<ComparisonDto> {
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

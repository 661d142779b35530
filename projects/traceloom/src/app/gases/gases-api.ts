import { HttpClient, httpResource, type HttpResourceRef } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { ComputeResult } from '@traceloom/shared/engine';
import type { GasDto, GasSpecInput, GasSummary, GasVersionDto } from '@traceloom/shared/api';

export type {
  GasDto,
  GasSummary,
  GasVersionDto,
  GasVersionRef,
  PersonRef,
} from '@traceloom/shared/api';

/** The gas endpoints and the synchronous preview (`/api/compute`). */
@Injectable({ providedIn: 'root' })
export class GasesApi {
  private readonly http = inject(HttpClient);

  /** The study's gases (deleted ones are not listed). */
  list(studyId: string): Observable<GasSummary[]> {
    return this.http.get<GasSummary[]>(`/api/studies/${encodeURIComponent(studyId)}/gases`);
  }

  /**
   * The gases of the study `studyId()` (deleted ones are not listed) as a resource (call in an
   * injection context): re-read when the study changes, the previous request cancelled.
   */
  listResource(studyId: () => string): HttpResourceRef<GasSummary[] | undefined> {
    return httpResource<GasSummary[]>(() => `/api/studies/${encodeURIComponent(studyId())}/gases`);
  }

  /** Creates a gas (version 1). */
  create(studyId: string, spec: GasSpecInput): Observable<GasDto> {
    return this.http.post<GasDto>(`/api/studies/${encodeURIComponent(studyId)}/gases`, { spec });
  }

  /**
   * The gas `id()` as a resource (call in an injection context); idle while there is no id (a
   * new gas), a new id cancels the previous request.
   */
  gasResource(id: () => string | undefined): HttpResourceRef<GasDto | undefined> {
    return httpResource<GasDto>(() => {
      const gasId = id();
      return gasId ? `/api/gases/${encodeURIComponent(gasId)}` : undefined;
    });
  }

  /** Saves the spec as a new version; old versions and their runs stay. */
  update(id: string, spec: GasSpecInput): Observable<GasDto> {
    return this.http.put<GasDto>(`/api/gases/${encodeURIComponent(id)}`, { spec });
  }

  /**
   * Version `version()` of the gas `id()` as a resource; idle while either is missing, another
   * version cancels the previous request.
   */
  versionResource(
    id: () => string | undefined,
    version: () => number | null,
  ): HttpResourceRef<GasVersionDto | undefined> {
    return httpResource<GasVersionDto>(() => {
      const gasId = id();
      const v = version();
      return gasId && v !== null
        ? `/api/gases/${encodeURIComponent(gasId)}/versions/${encodeURIComponent(v)}`
        : undefined;
    });
  }

  /** The small synchronous computation behind the live preview (strict server caps). */
  compute(spec: GasSpecInput): Observable<ComputeResult> {
    return this.http.post<ComputeResult>('/api/compute', { spec });
  }
}

import { HttpClient, httpResource, type HttpResourceRef } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { studyResource } from '../core/study-resource';
import { Observable } from 'rxjs';
import type {
  AuditEventDto,
  DatasetCreateRequest,
  DatasetDto,
  DatasetPatchRequest,
  DatasetSummaryDto,
  ExportFormat,
  LockPreviewDto,
  MailboxMessageDto,
  PublicDatasetDto,
  ReviewInboxEntryDto,
  StudyDto,
  VerifyAnswerDto,
} from '@traceloom/shared/api';

export type {
  ExportFormat,
  MailboxMessageDto,
  PublicDatasetDto,
  VerifyAnswerDto,
} from '@traceloom/shared/api';

const enc = encodeURIComponent;

/** The dataset, review, audit and mailbox endpoints. */
@Injectable({ providedIn: 'root' })
export class DatasetsApi {
  private readonly http = inject(HttpClient);

  /** A draft dataset from a finished run. */
  create(runId: string, body: DatasetCreateRequest): Observable<DatasetDto> {
    return this.http.post<DatasetDto>(`/api/runs/${enc(runId)}/datasets`, body);
  }

  /** Datasets the caller may see (of one study when given). */
  list(studyId?: string): Observable<DatasetSummaryDto[]> {
    return this.http.get<DatasetSummaryDto[]>('/api/datasets', {
      params: studyId ? { studyId } : {},
    });
  }

  /** The dataset with id `id()` as a resource (call in an injection context). */
  datasetResource(id: () => string): HttpResourceRef<DatasetDto | undefined> {
    return httpResource<DatasetDto>(() => `/api/datasets/${enc(id())}`);
  }

  /** The study with id `id()` (none while it is undefined) as a resource. */
  studyResource(id: () => string | undefined): HttpResourceRef<StudyDto | undefined> {
    return studyResource(id);
  }

  /** One dataset with checks, reviews and comments. */
  get(id: string): Observable<DatasetDto> {
    return this.http.get<DatasetDto>(`/api/datasets/${enc(id)}`);
  }

  /** Title and description of a draft. */
  update(id: string, body: DatasetPatchRequest): Observable<DatasetDto> {
    return this.http.patch<DatasetDto>(`/api/datasets/${enc(id)}`, body);
  }

  /** Deletes a draft. */
  remove(id: string): Observable<void> {
    return this.http.delete<void>(`/api/datasets/${enc(id)}`);
  }

  /** Asks reviewers to review. */
  requestReview(id: string, reviewerIds: string[]): Observable<DatasetDto> {
    return this.http.post<DatasetDto>(`/api/datasets/${enc(id)}/review-requests`, { reviewerIds });
  }

  /** A comment on the dataset, or on row N. */
  comment(id: string, body: string, N?: number): Observable<DatasetDto> {
    return this.http.post<DatasetDto>(
      `/api/datasets/${enc(id)}/comments`,
      N === undefined ? { body } : { body, N },
    );
  }

  /** A reviewer's verdict. */
  review(id: string, verdict: 'approve' | 'changes', comment: string): Observable<DatasetDto> {
    return this.http.post<DatasetDto>(`/api/datasets/${enc(id)}/reviews`, { verdict, comment });
  }

  /** A steward's written waiver of a failing check row. */
  waive(id: string, check: string, N: number | null, reason: string): Observable<DatasetDto> {
    const body = N === null ? { check, reason } : { check, N, reason };
    return this.http.post<DatasetDto>(`/api/datasets/${enc(id)}/waivers`, body);
  }

  /** Locks (steward); answers the hash. */
  lock(id: string, confirmed: { lockedAt: string; hash: string }): Observable<{ hash: string }> {
    return this.http.post<{ hash: string }>(`/api/datasets/${enc(id)}/lock`, confirmed);
  }

  /** The hash the lock would give now and what it freezes (steward, before confirming). */
  lockPreview(id: string): Observable<LockPreviewDto> {
    return this.http.get<LockPreviewDto>(`/api/datasets/${enc(id)}/lock-preview`);
  }

  /** Withdraws (steward). */
  withdraw(id: string): Observable<{ state: string }> {
    return this.http.post<{ state: string }>(`/api/datasets/${enc(id)}/withdraw`, {});
  }

  /** Recomputes the stored spec and compares. */
  verify(id: string): Observable<VerifyAnswerDto> {
    return this.http.post<VerifyAnswerDto>(`/api/datasets/${enc(id)}/verify`, {});
  }

  /** The export file's text. */
  exportText(id: string, format: ExportFormat): Observable<string> {
    return this.http.get(`/api/datasets/${enc(id)}/export`, {
      params: { format },
      responseType: 'text',
    });
  }

  /** The caller's review requests. */
  inbox(): Observable<ReviewInboxEntryDto[]> {
    return this.http.get<ReviewInboxEntryDto[]>('/api/review-requests');
  }

  /** Audit events (steward, admin). */
  audit(query: {
    targetType?: string;
    targetId?: string;
    limit?: number;
  }): Observable<AuditEventDto[]> {
    const params: Record<string, string> = {};
    if (query.targetType) params['targetType'] = query.targetType;
    if (query.targetId) params['targetId'] = query.targetId;
    if (query.limit) params['limit'] = String(query.limit);
    return this.http.get<AuditEventDto[]>('/api/audit', { params });
  }

  /** The local mail fake's messages (admin). */
  mailbox(): Observable<MailboxMessageDto[]> {
    return this.http.get<MailboxMessageDto[]>('/api/dev/mailbox');
  }

  /** The study a dataset belongs to (for choosing reviewers among its members). */
  study(id: string): Observable<StudyDto> {
    return this.http.get<StudyDto>(`/api/studies/${enc(id)}`);
  }

  /** A locked dataset by its hash, without sign-in. */
  /** A locked dataset by the hash `hash()`, without sign-in, as a resource. */
  publicDatasetResource(hash: () => string): HttpResourceRef<PublicDatasetDto | undefined> {
    return httpResource<PublicDatasetDto>(() => `/api/public/datasets/${enc(hash())}`);
  }

  publicDataset(hash: string): Observable<PublicDatasetDto> {
    return this.http.get<PublicDatasetDto>(`/api/public/datasets/${enc(hash)}`);
  }
}

/** How each state is named on screen. */
export const STATE_LABELS: Record<DatasetSummaryDto['state'], string> = {
  draft: 'Draft',
  in_review: 'In review',
  locked: 'Locked',
  withdrawn: 'Withdrawn',
};

/** Icons of the states (decoration beside the label). */
export const STATE_ICONS: Record<DatasetSummaryDto['state'], string> = {
  draft: 'edit_note',
  in_review: 'rate_review',
  locked: 'lock',
  withdrawn: 'block',
};

/**
 * A dataset's state as a person reads it: an approved dataset in review says so ("Approved,
 * ready to lock" when nothing blocks the lock), so a steward sees what awaits them.
 */
export function stateLabel(
  d: Pick<DatasetSummaryDto, 'state' | 'approved' | 'readyToLock'>,
): string {
  if (d.readyToLock) return 'Approved, ready to lock';
  if (d.approved) return 'Approved, not lockable yet';
  return STATE_LABELS[d.state];
}

/** The icon beside `stateLabel` (decoration only). */
export function stateIcon(d: Pick<DatasetSummaryDto, 'state' | 'approved'>): string {
  return d.approved ? 'verified' : STATE_ICONS[d.state];
}

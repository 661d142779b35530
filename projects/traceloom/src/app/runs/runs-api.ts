import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { ComputeResult, GasSpecInput } from '@traceloom/shared/engine';
import { Session } from '../core/session';
import type { PersonRef } from '../gases/gases-api';

/** Where a run is in its life. */
export type RunStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

/** How far a run has come. */
export interface RunProgress {
  done: number;
  total: number;
  phase: string | null;
  /** What done and total count (cycle types of the class table, products of the recursion). */
  unit?: string;
}

/** One run of a gas (API contract, GET /api/gases/:id/runs). */
export interface RunSummary {
  id: string;
  gasId: string;
  gasVersion: number;
  status: RunStatus;
  progress: RunProgress;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  durationMs: number | null;
  createdBy: PersonRef;
  error: string | { code?: string; message: string; field?: string } | null;
}

/** The result as the run endpoint returns it: classes only when asked for one N. */
export type RunResult = Omit<ComputeResult, 'classes'> & {
  classes?: ComputeResult['classes'];
  classCounts?: Record<string, number>;
};

/** A run with its spec and (once done) its result. */
export interface RunDto extends RunSummary {
  studyId: string;
  spec: GasSpecInput;
  result: RunResult | null;
  /** Cycle types per N of the class table (given when `?classes` is not asked for). */
  classCounts?: Record<string, number>;
}

/** What `POST /api/gases/:id/runs` answers: the queued run and the warnings of its estimate. */
export interface RunStarted {
  id: string;
  status: RunStatus;
  warnings?: string[];
}

/** `POST /api/compute/estimate`: the class table's cost, the order advice, warnings, refusal. */
export interface RunEstimateDto {
  estimate: {
    cycleTypes: number;
    seriesLength: number;
    classCoefficients: number;
    classMemoryMb: number;
    classSeconds: number;
    orderAdvice: { undetermined: number[]; orderNeeded: string | null; message: string } | null;
    summary: string;
  };
  warnings: string[];
  refusal: { field: string; message: string } | null;
}

/** One server-sent event of a run: progress while it works, then the end. */
export type RunEvent =
  | {
      type: 'progress';
      status: RunStatus;
      done: number;
      total: number;
      phase: string | null;
      unit?: string;
    }
  | { type: 'end'; status: RunStatus; error: RunSummary['error'] };

/** True while a run may still change. */
export function isActive(status: RunStatus): boolean {
  return status === 'queued' || status === 'running';
}

/** A run's error as one sentence. */
export function runErrorText(error: RunSummary['error']): string | null {
  if (!error) return null;
  if (typeof error === 'string') return error;
  return error.field ? `${error.field}: ${error.message}` : error.message;
}

/** The run endpoints, including the progress stream. */
@Injectable({ providedIn: 'root' })
export class RunsApi {
  private readonly http = inject(HttpClient);
  private readonly session = inject(Session);

  /** Queues a run of the gas (its latest version unless `version` is given). */
  start(gasId: string, version?: number): Observable<RunStarted> {
    const body = version === undefined ? {} : { version };
    return this.http.post<RunStarted>(`/api/gases/${encodeURIComponent(gasId)}/runs`, body);
  }

  /** What a run of the spec would cost and determine, judged against the run limits. */
  estimate(spec: GasSpecInput): Observable<RunEstimateDto> {
    return this.http.post<RunEstimateDto>('/api/compute/estimate', { spec });
  }

  list(gasId: string): Observable<RunSummary[]> {
    return this.http.get<RunSummary[]>(`/api/gases/${encodeURIComponent(gasId)}/runs`);
  }

  get(id: string): Observable<RunDto> {
    return this.http.get<RunDto>(`/api/runs/${encodeURIComponent(id)}`);
  }

  /** The run with only the class-table rows of one N in `result.classes`. */
  classes(id: string, n: number): Observable<RunDto> {
    return this.http.get<RunDto>(`/api/runs/${encodeURIComponent(id)}`, {
      params: { classes: n },
    });
  }

  cancel(id: string): Observable<RunSummary> {
    return this.http.post<RunSummary>(`/api/runs/${encodeURIComponent(id)}/cancel`, {});
  }

  /**
   * The run's server-sent events. EventSource cannot send headers, so the token goes in the
   * query (`access_token`), as the API allows for this one route. Completes after `end`.
   */
  events(id: string): Observable<RunEvent> {
    return new Observable<RunEvent>((subscriber) => {
      const token = this.session.token() ?? '';
      const url = `/api/runs/${encodeURIComponent(id)}/events?access_token=${encodeURIComponent(token)}`;
      const source = new EventSource(url);
      source.addEventListener('progress', (e) => {
        const data = JSON.parse((e as MessageEvent<string>).data) as Omit<
          Extract<RunEvent, { type: 'progress' }>,
          'type'
        >;
        subscriber.next({ type: 'progress', ...data });
      });
      source.addEventListener('end', (e) => {
        const data = JSON.parse((e as MessageEvent<string>).data) as Omit<
          Extract<RunEvent, { type: 'end' }>,
          'type'
        >;
        subscriber.next({ type: 'end', ...data });
        source.close();
        subscriber.complete();
      });
      source.onerror = () => {
        // A closed stream after `end` is normal; otherwise report so the caller can poll instead.
        if (source.readyState === EventSource.CLOSED) {
          subscriber.error(new Error('The progress stream closed.'));
        }
      };
      return () => source.close();
    });
  }
}

import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { createParser } from 'eventsource-parser';
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

/** The navigation state a started run's page receives: the warnings the start answered. */
export interface RunStartState {
  startWarnings: string[];
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
   * The run's server-sent events, read with `fetch` so the token travels in the Authorization
   * header, never in a URL. Completes after `end`; errors when the stream fails or the server
   * closes it first (token expired or revoked: `closed`), so the caller can fall back to polling.
   */
  events(id: string): Observable<RunEvent> {
    return new Observable<RunEvent>((subscriber) => {
      const abort = new AbortController();
      const parser = createParser({
        onEvent: (message) => {
          const data = JSON.parse(message.data) as Record<string, unknown>;
          if (message.event === 'progress') {
            subscriber.next({ type: 'progress', ...data } as RunEvent);
          } else if (message.event === 'end') {
            subscriber.next({ type: 'end', ...data } as RunEvent);
            subscriber.complete();
            abort.abort();
          } else if (message.event === 'closed') {
            subscriber.error(new Error(`The progress stream closed: ${String(data['reason'])}.`));
            abort.abort();
          }
        },
      });
      const read = async () => {
        const res = await fetch(`/api/runs/${encodeURIComponent(id)}/events`, {
          headers: {
            Authorization: `Bearer ${this.session.token() ?? ''}`,
            Accept: 'text/event-stream',
          },
          signal: abort.signal,
        });
        if (!res.ok || !res.body) throw new Error(`The progress stream answered ${res.status}.`);
        const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
        for (;;) {
          const { done, value } = await reader.read();
          if (done) break;
          parser.feed(value);
        }
        if (!subscriber.closed) subscriber.error(new Error('The progress stream closed.'));
      };
      read().catch((err: unknown) => {
        if (!abort.signal.aborted) subscriber.error(err);
      });
      return () => abort.abort();
    });
  }
}

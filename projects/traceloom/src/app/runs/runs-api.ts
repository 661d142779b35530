import { HttpClient, httpResource, type HttpResourceRef } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { createParser } from 'eventsource-parser';
import { Observable } from 'rxjs';
import type {
  GasSpecInput,
  RunDto,
  RunEstimateDto,
  RunEvent,
  RunStarted,
  RunSummary,
} from '@traceloom/shared/api';
import { Session } from '../core/session';

export type {
  RunDto,
  RunEstimateDto,
  RunEvent,
  RunProgress,
  RunResult,
  RunStarted,
  RunStatus,
  RunSummary,
} from '@traceloom/shared/api';
export { isActive } from '@traceloom/shared/api';

/** The navigation state a started run's page receives: the warnings the start answered. */
export interface RunStartState {
  startWarnings: string[];
}

/** A run's error as one sentence (the server words it so), or null. */
export function runErrorText(error: RunSummary['error']): string | null {
  return error || null;
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

  /**
   * The run with id `id()` as a resource (call in an injection context, e.g. a component's
   * field): re-read when the id changes, a reload keeps the last answer on screen.
   */
  runResource(id: () => string): HttpResourceRef<RunDto | undefined> {
    return httpResource<RunDto>(() => `/api/runs/${encodeURIComponent(id())}`);
  }

  /** The runs of the gas `gasId()` as a resource (call in an injection context). */
  runListResource(gasId: () => string): HttpResourceRef<RunSummary[] | undefined> {
    return httpResource<RunSummary[]>(() => `/api/gases/${encodeURIComponent(gasId())}/runs`);
  }

  get(id: string): Observable<RunDto> {
    return this.http.get<RunDto>(`/api/runs/${encodeURIComponent(id)}`);
  }

  /**
   * The run `id()` with only the class-table rows of N = `n()` in `result.classes`, as a
   * resource (call in an injection context); idle while `n()` is null. Choosing another N
   * cancels the previous request.
   */
  classesResource(id: () => string, n: () => number | null): HttpResourceRef<RunDto | undefined> {
    return httpResource<RunDto>(() => {
      const N = n();
      return N === null
        ? undefined
        : { url: `/api/runs/${encodeURIComponent(id())}`, params: { classes: N } };
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

import { phaseName } from '@traceloom/shared/format';
import { DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { Subscription, catchError, interval, map, switchMap, takeWhile } from 'rxjs';
import { messageOf } from '../core/api-error';
import { RunEvent, RunStatus, RunsApi, isActive, runErrorText } from './runs-api';

/** Polling interval when the event stream is not available. */
const POLL_MS = 1000;

/**
 * One run's live progress from the server-sent events (polling if the stream fails), with a
 * cancel button while it is active.
 */
@Component({
  selector: 'tl-run-progress',
  imports: [DecimalPipe, MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './run-progress.html',
  styleUrl: './run-progress.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RunProgressPanel {
  private readonly api = inject(RunsApi);

  readonly runId = input.required<string>();
  readonly canCancel = input(false);
  /** Emits the final status once the run ends. */
  readonly finished = output<RunStatus>();

  protected readonly status = signal<RunStatus>('queued');
  protected readonly done = signal(0);
  protected readonly total = signal(0);
  protected readonly phase = signal<string | null>(null);
  /** What done and total count (cycle types, products); null where they count rows. */
  protected readonly unit = signal<string | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly cancelling = signal(false);
  protected readonly active = computed(() => isActive(this.status()));
  protected readonly percent = computed(() =>
    this.total() > 0 ? Math.min(100, (100 * this.done()) / this.total()) : 0,
  );

  private subscription: Subscription | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.subscription?.unsubscribe());
    effect(() => this.follow(this.runId()));
  }

  protected cancel(): void {
    this.cancelling.set(true);
    this.api.cancel(this.runId()).subscribe({
      next: (run) => {
        this.cancelling.set(false);
        this.apply({ type: 'end', status: run.status, error: run.error });
      },
      error: (err: unknown) => {
        this.cancelling.set(false);
        this.error.set(messageOf(err));
      },
    });
  }

  private follow(id: string): void {
    this.subscription?.unsubscribe();
    this.status.set('queued');
    this.error.set(null);
    const poll = interval(POLL_MS).pipe(
      switchMap(() => this.api.get(id)),
      map((run): RunEvent =>
        isActive(run.status)
          ? { type: 'progress', status: run.status, ...run.progress }
          : { type: 'end', status: run.status, error: run.error },
      ),
      takeWhile((e) => e.type !== 'end', true),
    );
    this.subscription = this.api
      .events(id)
      .pipe(catchError(() => poll))
      .subscribe({
        next: (event) => this.apply(event),
        error: (err: unknown) => this.error.set(messageOf(err)),
      });
  }

  private apply(event: RunEvent): void {
    if (!this.active()) return;
    this.status.set(event.status);
    if (event.type === 'progress') {
      this.done.set(event.done);
      this.total.set(event.total);
      this.phase.set(event.phase ? phaseName(event.phase) : null);
      this.unit.set(event.unit ?? null);
      return;
    }
    this.error.set(runErrorText(event.error));
    if (event.status === 'done') this.done.set(this.total());
    this.finished.emit(event.status);
  }
}

import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Router, RouterLink } from '@angular/router';
import { ApiError, messageOf } from '../core/api-error';
import { AsyncState } from '../shared/async-state';
import { RunProgressPanel } from './run-progress';
import { RunStartState, RunStatus, RunSummary, RunsApi, isActive, runErrorText } from './runs-api';
import { STATUS_ICONS, STATUS_LABELS, durationText } from '../shared/run-status';

/** Starting a run of a gas, following it live, and the gas's run history. */
@Component({
  selector: 'tl-gas-runs',
  imports: [DatePipe, MatButtonModule, MatIconModule, AsyncState, RouterLink, RunProgressPanel],
  templateUrl: './gas-runs.html',
  styleUrl: './gas-runs.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GasRuns {
  private readonly api = inject(RunsApi);
  private readonly router = inject(Router);

  readonly gasId = input.required<string>();
  readonly latestVersion = input.required<number>();
  /** An older version on screen: the run button runs that one. */
  readonly viewedVersion = input<number | null>(null);
  readonly canRun = input(false);

  protected readonly runList = this.api.runListResource(() => this.gasId());
  /** The gas's runs, newest first. */
  protected readonly runs = computed<RunSummary[]>(() =>
    this.runList.hasValue()
      ? [...this.runList.value()].sort((a, b) => b.createdAt.localeCompare(a.createdAt))
      : [],
  );
  protected readonly starting = signal(false);
  protected readonly startError = signal<string | null>(null);
  /** The run followed live (the newest active one). */
  protected readonly followed = signal<string | null>(null);
  protected readonly version = computed(() => this.viewedVersion() ?? this.latestVersion());
  protected readonly labels = STATUS_LABELS;
  protected readonly icons = STATUS_ICONS;
  protected readonly runErrorText = runErrorText;
  protected readonly durationText = durationText;

  constructor() {
    effect(() => {
      const active = this.runs().find((r) => isActive(r.status));
      if (active && !untracked(this.followed)) this.followed.set(active.id);
    });
  }

  protected start(): void {
    this.starting.set(true);
    this.startError.set(null);
    const version = this.viewedVersion() ?? undefined;
    this.api.start(this.gasId(), version).subscribe({
      next: (run) => {
        this.starting.set(false);
        // The run's page follows it live and shows its results when done; it keeps the warnings.
        const state: RunStartState = { startWarnings: run.warnings ?? [] };
        void this.router.navigate(['/runs', run.id], { state });
      },
      error: (err: unknown) => {
        this.starting.set(false);
        this.startError.set(
          err instanceof ApiError && err.code === 'too_many_runs'
            ? `${err.message} Wait for one of your runs to finish, or cancel one.`
            : messageOf(err),
        );
      },
    });
  }

  protected onFinished(_status: RunStatus): void {
    this.runList.reload();
  }

  protected reload(): void {
    this.runList.reload();
  }
}

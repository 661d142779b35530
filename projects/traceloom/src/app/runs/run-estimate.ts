import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import type { GasSpecInput } from '@traceloom/shared/engine';
import { catchError, debounceTime, distinctUntilChanged, map, of, switchMap } from 'rxjs';
import { RunEstimateDto, RunsApi } from './runs-api';

/** Debounce of the estimate while a spec is being edited. */
export const ESTIMATE_DEBOUNCE_MS = 600;

/**
 * What a run of a spec would cost and determine, asked of the server before the run: the class
 * table's cycle types, coefficients, memory and time; the rows the order is too low for and the
 * order that reaches N_max; a refusal when the class table cannot fit in a run.
 */
@Component({
  selector: 'tl-run-estimate',
  imports: [MatIconModule],
  template: `
    @if (judged(); as j) {
      <section class="estimate" aria-label="Before the run" data-testid="run-estimate">
        @if (j.refusal; as r) {
          <p class="refusal" role="alert" data-testid="run-estimate-refusal">
            <mat-icon aria-hidden="true" fontIcon="block" /><span>{{ r.message }}</span>
          </p>
        }
        @for (w of j.warnings; track w) {
          <p class="warning" data-testid="run-estimate-warning">
            <mat-icon aria-hidden="true" fontIcon="warning" /><span>{{ w }}</span>
          </p>
        }
        @if (showCost() && !j.refusal && j.estimate.cycleTypes > 0) {
          <p class="cost" data-testid="run-estimate-cost">
            <mat-icon aria-hidden="true" fontIcon="speed" /><span>{{ j.estimate.summary }}</span>
          </p>
        }
      </section>
    }
  `,
  styles: `
    .estimate p {
      display: flex;
      gap: 0.5rem;
      align-items: flex-start;
      margin: 0.25rem 0;
    }
    .refusal {
      color: var(--mat-sys-error);
    }
    .warning mat-icon {
      color: var(--tl-amber);
      flex: none;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RunEstimate {
  private readonly api = inject(RunsApi);

  /** The spec a run would compute; null while the form is invalid. */
  readonly spec = input<GasSpecInput | null>(null);
  /** Also show the cost sentence when nothing is wrong (the editor does). */
  readonly showCost = input(false);

  protected readonly judged = toSignal(
    toObservable(computed(() => this.spec())).pipe(
      debounceTime(ESTIMATE_DEBOUNCE_MS),
      distinctUntilChanged((a, b) => JSON.stringify(a) === JSON.stringify(b)),
      switchMap((spec) =>
        spec
          ? this.api.estimate(spec).pipe(catchError(() => of<RunEstimateDto | null>(null)))
          : of(null),
      ),
      map((j) => j),
    ),
    { initialValue: null },
  );
}

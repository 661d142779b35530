import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { NumericInfoJson } from '@traceloom/shared/format';

/** `result.numeric` of a numeric run, or null (series runs). */
export function numericInfo(result: unknown): NumericInfoJson | null {
  const info = (result as { numeric?: unknown } | null)?.numeric;
  return typeof info === 'object' && info !== null && 'precision' in info
    ? (info as NumericInfoJson)
    : null;
}

/**
 * The caution line of a numeric run: the digits asked for, how the errors were estimated and the
 * quadrature rule, and that an error estimate is not a proof.
 */
@Component({
  selector: 'tl-numeric-caution',
  imports: [MatIconModule],
  template: `
    <p data-testid="run-numeric-caution">
      <mat-icon aria-hidden="true" fontIcon="warning" />
      <span>
        Numeric run: {{ precision() }} significant digits asked for; each value shows only its
        determined digits, ± its estimated absolute error.
        @if (info(); as i) {
          @if (i.errorEstimate) {
            Errors: {{ i.errorEstimate }}
          }
          @if (i.rule) {
            Quadrature: {{ i.rule }}{{ pointsText() }}.
          }
        }
        An error estimate is evidence, not proof; routes and checks agree within the stated
        tolerance.
      </span>
    </p>
  `,
  styles: `
    p {
      display: flex;
      gap: 8px;
      align-items: flex-start;
      margin: 0;
    }
    /* a long caution must not squeeze the icon to nothing */
    mat-icon {
      flex: none;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NumericCaution {
  /** The run's result (its `numeric` part is read). */
  readonly result = input<unknown>(null);
  /** The precision of the spec, shown when the result has no `numeric` part yet. */
  readonly digits = input<number | undefined>(undefined);

  protected readonly info = computed(() => numericInfo(this.result()));
  protected readonly precision = computed(() => this.info()?.precision ?? this.digits() ?? '?');
  protected readonly pointsText = computed(() => {
    const p = this.info()?.points;
    const list = Array.isArray(p) ? p.join(', ') : p === undefined ? '' : String(p);
    return list ? ` (${list} points)` : '';
  });
}

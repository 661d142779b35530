import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { plainPower } from '@traceloom/shared/format';
import { seriesDiff, type SeriesJson } from './series-diff';

/**
 * One row of a check whose sides differ: the computed and the supplied series side by side,
 * term by term, every differing coefficient marked in words and by a symbol, not only colour.
 */
@Component({
  selector: 'tl-series-side-by-side',
  template: `
    <table class="side" [attr.aria-label]="caption()" data-testid="side-by-side">
      <caption>
        {{
          caption()
        }}:
        {{
          differing()
        }}
        differing coefficient{{
          differing() === 1 ? '' : 's'
        }}
      </caption>
      <thead>
        <tr>
          <th scope="col">Term</th>
          <th scope="col">Computed</th>
          <th scope="col">Supplied</th>
          <th scope="col"><span class="tl-visually-hidden">Verdict</span></th>
        </tr>
      </thead>
      <tbody>
        @for (line of shown(); track line.exponent) {
          <tr [class]="'is-' + line.state.replace(' ', '-')" data-testid="side-by-side-line">
            <td>{{ term(line.exponent) }}</td>
            <td class="num">{{ line.computed ?? 'not determined' }}</td>
            <td class="num">{{ line.supplied ?? 'not determined' }}</td>
            <td>
              {{
                line.state === 'differs' ? '✗ differs' : line.state === 'agrees' ? '✓' : line.state
              }}
            </td>
          </tr>
        }
      </tbody>
    </table>
    @if (beyond() > 0) {
      <p class="beyond">
        {{ beyond() }} more term{{ beyond() === 1 ? '' : 's' }} lie beyond what both sides determine
        (computed to {{ known(computedValue()) }}, supplied to {{ known(suppliedValue()) }}): not
        compared.
      </p>
    }
  `,
  styles: `
    .side {
      border-collapse: collapse;
      margin: 4px 0 12px;
      font: var(--mat-sys-body-medium);
    }
    caption {
      text-align: left;
      font: var(--mat-sys-title-small);
      padding: 4px 0;
      white-space: nowrap;
    }
    th,
    td {
      padding: 2px 12px 2px 0;
      text-align: left;
    }
    .num {
      font-variant-numeric: tabular-nums;
      text-align: right;
    }
    tr.is-differs td {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
      font-weight: 500;
    }
    tr.is-not-compared td {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SeriesSideBySide {
  readonly computedValue = input.required<SeriesJson>();
  readonly suppliedValue = input.required<SeriesJson>();
  readonly variable = input('q');
  readonly caption = input('Both sides');

  protected readonly lines = computed(() => seriesDiff(this.computedValue(), this.suppliedValue()));
  /** Only where both sides are determined; the rest is summed up in one sentence. */
  protected readonly shown = computed(() => this.lines().filter((l) => l.state !== 'not compared'));
  protected readonly beyond = computed(() => this.lines().length - this.shown().length);
  protected readonly differing = computed(
    () => this.lines().filter((l) => l.state === 'differs').length,
  );

  protected known(value: SeriesJson): string {
    return value.order === null ? 'all orders (exact)' : `O(${this.term(value.order)})`;
  }

  protected term(exponent: string): string {
    return plainPower(this.variable(), exponent) || '1';
  }
}

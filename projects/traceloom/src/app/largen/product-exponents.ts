import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ProductFormJson } from '@traceloom/shared/engine';

/** Exponents a_n listed on screen (the JSON export has them all). */
export const EXPONENTS_SHOWN = 24;

/**
 * The exponents a_n of a product form prod (1 - q^n)^(-a_n), the range where they are determined,
 * and the pattern that holds on every known n (or why there is none).
 */
@Component({
  selector: 'tl-product-exponents',
  template: `
    <p [attr.data-testid]="testId() + '-product'">
      Exponents a_n, determined for n &lt; {{ product().determinedBelow }}:
      @for (e of shown(); track e.n) {
        <span class="exp">a({{ e.n }}) = {{ e.a }}</span>
      }
      @if (product().exponents.length > shown().length) {
        <span
          >… (first {{ shown().length }} of {{ product().exponents.length }} shown; the JSON export
          lists all)</span
        >
      }
    </p>
    <p [attr.data-testid]="testId() + '-pattern'">
      @if (product().pattern; as pattern) {
        <strong>{{ pattern }}</strong> —
      }
      {{ product().patternNote }}.
    </p>
  `,
  styles: `
    .exp {
      display: inline-block;
      margin-right: 12px;
      font-variant-numeric: tabular-nums;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProductExponents {
  readonly product = input.required<ProductFormJson>();
  /** Prefix of the data-testid attributes (`<prefix>-product`, `<prefix>-pattern`). */
  readonly testId = input('product');

  protected readonly shown = computed(() => this.product().exponents.slice(0, EXPONENTS_SHOWN));
}

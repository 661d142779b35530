import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import type { SeriesProductJson, ValueJson } from '@traceloom/shared/engine';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { messageOf } from '../core/api-error';
import { ExportButtons } from '../exports/export-buttons';
import { Tex } from '../shared/tex';
import { tableLatex, toCsv, valueTex, valueText, type ExportTable } from '@traceloom/shared/format';
import { productTex } from './large-n-format';
import { ProductApi, type ProductFormDto, type ProductTarget } from './product-api';
import { ProductExponents } from './product-exponents';

/** Terms of each c_N(q) shown in the grand function's table. */
const FACTOR_TERMS = 6;

/**
 * "Write as a product" on the Large N tab: the product form prod (1 - q^n)^(-a_n) of any canonical
 * row or cycle weight (leading term divided out), or the grand function as a double product in
 * kappa and the variable, computed by the server on request.
 */
@Component({
  selector: 'tl-product-request',
  imports: [
    ExportButtons,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ProductExponents,
    ReactiveFormsModule,
    Tex,
  ],
  templateUrl: './product-request.html',
  styleUrl: './product-request.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProductRequest {
  private readonly api = inject(ProductApi);
  readonly runId = input.required<string>();
  readonly variable = input('q');
  /** Highest N of the canonical table. */
  readonly nMax = input.required<number>();
  /** Number of cycle weights Z_1.. in the result. */
  readonly weightCount = input.required<number>();

  protected readonly kind = new FormControl<'row' | 'weight' | 'grand'>('row', {
    nonNullable: true,
  });
  protected readonly index = new FormControl<number | null>(1, [
    Validators.required,
    Validators.pattern(/^\d+$/),
  ]);
  protected readonly form = new FormGroup({ kind: this.kind, index: this.index });
  private readonly kindValue = toSignal(this.kind.valueChanges, { initialValue: this.kind.value });
  protected readonly indexName = computed(() => (this.kindValue() === 'weight' ? 'L' : 'N'));
  protected readonly range = computed(() =>
    this.kindValue() === 'weight'
      ? { from: 1, to: this.weightCount() }
      : { from: 0, to: this.nMax() },
  );

  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly fieldError = signal<string | null>(null);
  protected readonly answer = signal<ProductFormDto | null>(null);

  /** Asks the server for the chosen product form; bad indices are named before sending. */
  protected show(): void {
    this.fieldError.set(null);
    this.error.set(null);
    const kind = this.kind.value;
    let target: ProductTarget = { of: 'grand' };
    if (kind !== 'grand') {
      const raw = this.index.value;
      const { from, to } = this.range();
      const name = this.indexName();
      if (raw === null || !Number.isInteger(raw) || raw < from || raw > to) {
        this.fieldError.set(`${name}: must be a whole number from ${from} to ${to}.`);
        return;
      }
      target = kind === 'row' ? { of: 'row', N: raw } : { of: 'weight', L: raw };
    }
    this.busy.set(true);
    this.api.productForm(this.runId(), target).subscribe({
      next: (dto) => {
        this.busy.set(false);
        this.answer.set(dto);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.answer.set(null);
        this.error.set(messageOf(err));
      },
    });
  }

  /** f = c q^v prod (1 - q^n)^(-a_n) in LaTeX. */
  protected seriesTex(a: ProductFormDto): string {
    if (a.target === 'grand') return '';
    const name = a.target === 'row' ? `Z(${a.N})` : `Z_{${a.L}}`;
    const lead = leadingTerm(a);
    const c =
      lead.terms[0]![0] === '0' && lead.terms[0]![1] === '1' ? '' : valueTex(lead, this.variable());
    return `${name} = ${c}\\; ${productTex(this.variable(), a.product.step)}`;
  }
  /** The answer as an export table: n and a_n, or N and c_N. */
  protected exportTable(a: ProductFormDto): ExportTable {
    if (a.target === 'grand') {
      return {
        columns: ['N', 'c_N'],
        rows: a.factors.map((f) => [String(f.N), valueText(f.value, this.variable())]),
      };
    }
    return { columns: ['n', 'a_n'], rows: a.product.exponents.map((e) => [e.n, e.a]) };
  }
  /** The answer as CSV (called on click). */
  protected csvText(a: ProductFormDto): () => string {
    return () => toCsv(this.exportTable(a));
  }
  /** The answer as LaTeX in the export layout (called on click). */
  protected latexText(a: ProductFormDto): () => string {
    return () => tableLatex(this.exportTable(a), [], this.exportTitle(a));
  }
  /** File name base of the exports. */
  protected exportTitle(a: ProductFormDto): string {
    return a.target === 'grand' ? 'grand function product' : `${a.of} product`;
  }
  /** The leading term divided out, as plain text. */
  protected leadText(a: SeriesProductJson): string {
    return valueText(leadingTerm(a), this.variable());
  }
  protected grandTex(): string {
    const q = this.variable();
    return `\\Xi(\\kappa) = \\prod_{N\\ge 1} \\prod_{n} \\left(1 - \\kappa^{N} ${q}^{n}\\right)^{-a_{N,n}},\\quad c_N(${q}) = \\sum_n a_{N,n}\\, ${q}^{n}`;
  }
  protected factorTex(f: { N: number; value: Parameters<typeof valueTex>[0] }): string {
    return `c_{${f.N}}(${this.variable()}) = ${valueTex(f.value, this.variable(), FACTOR_TERMS)}`;
  }
}

/** c q^v as an exact value. */
function leadingTerm(a: SeriesProductJson): ValueJson {
  return { order: null, terms: [[a.leadingExponent, a.leadingCoefficient]] };
}

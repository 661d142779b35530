import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { LargeNClassJson, LargeNJson } from '@traceloom/shared/engine';
import { tableLatex, toCsv } from '@traceloom/shared/format';
import { ExportButtons } from '../exports/export-buttons';
import { Tex } from '../shared/tex';
import { valueTex } from '@traceloom/shared/format';
import { classRows, formulaTex, largeNExportTable, productTex } from './large-n-format';
import { LargeNPlots } from './large-n-plots';
import { ProductExponents } from './product-exponents';
import { ProductRequest } from './product-request';

/**
 * The "Large N" tab: per class of N the normalization found, Z(inf) with its product exponents,
 * the fitted walls with the rows that verify them, the table N x (agrees below, first correction),
 * the plots, and the exports of the block; below, any row, weight or the grand function written as
 * a product on request (series runs with a run id).
 */
@Component({
  selector: 'tl-large-n-panel',
  imports: [ExportButtons, LargeNPlots, ProductExponents, ProductRequest, Tex],
  templateUrl: './large-n-panel.html',
  styleUrl: './large-n-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LargeNPanel {
  /** The run's result; its `largeN` block is shown when it holds the series analysis. */
  readonly result = input.required<{
    largeN?: Partial<LargeNJson> | undefined;
    canonical?: readonly unknown[];
    weights?: readonly unknown[];
    numeric?: unknown;
  }>();
  readonly variable = input('q');
  readonly title = input('run');
  /** The run the result belongs to; product forms on request need it. */
  readonly runId = input<string | null>(null);

  protected readonly productRequest = computed(() => {
    const r = this.result();
    const runId = this.runId();
    if (!runId || r.numeric !== undefined || !r.canonical?.length) return null;
    return { runId, nMax: r.canonical.length - 1, weightCount: r.weights?.length ?? 0 };
  });

  protected readonly block = computed((): LargeNJson | null => {
    const b = this.result().largeN;
    if (!b?.classes) return null;
    return { variable: b.variable ?? this.variable(), classes: b.classes, notes: b.notes ?? [] };
  });
  protected readonly csvTable = computed(() => {
    const b = this.block();
    return b ? largeNExportTable(b) : { columns: [], rows: [] };
  });

  protected readonly latexTable = computed(() => {
    const b = this.block();
    return b ? largeNExportTable(b, true) : { columns: [], rows: [] };
  });
  protected readonly csvText = computed(() => {
    const table = this.csvTable();
    return () => toCsv(table);
  });
  protected readonly latexText = computed(() => {
    const table = this.latexTable();
    return () => tableLatex(table, [2, 3], `${this.title()} large N`);
  });

  protected readonly formulaTex = formulaTex;

  protected classLabel(c: LargeNClassJson): string {
    return c.parity === 'all' ? 'All N' : c.parity === 'even' ? 'Even N' : 'Odd N';
  }
  protected normalizationTex(c: LargeNClassJson): string {
    return `\\tilde Z(N) = ${formulaTex(c.normalization)}\\; Z(N)`;
  }
  protected limitTex(c: LargeNClassJson): string {
    return c.limit ? `Z(\\infty) = ${valueTex(c.limit, this.variable(), 16)}` : '';
  }
  protected productFormTex(c: LargeNClassJson): string {
    return c.product ? `Z(\\infty) = ${productTex(this.variable(), c.product.step)}` : '';
  }
  protected rows(c: LargeNClassJson) {
    return classRows(c, this.variable());
  }
  protected wallTex(k: LargeNClassJson['corrections'][number]): string {
    const power = `${this.variable()}^{${formulaTex(k.exponent ?? '')}}`;
    const c = k.coefficient ?? '';
    if (c === '1') return power;
    if (c === '-1') return `-${power}`;
    const coefficient = /^-?[\w/]+$/.test(c) ? formulaTex(c) : `\\left(${formulaTex(c)}\\right)`;
    return `${coefficient}\\, ${power}`;
  }
  protected list(ns: readonly number[]): string {
    return ns.length ? ns.join(', ') : 'none';
  }
}

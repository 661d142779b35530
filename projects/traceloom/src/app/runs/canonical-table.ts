import { ScrollingModule } from '@angular/cdk/scrolling';
import type { LargeNJson } from '@traceloom/shared/engine';
import { ClipboardModule } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { ExportButtons } from '../exports/export-buttons';
import { normalizedCanonicalRows } from '../largen/normalized-rows';
import {
  CanonicalLine,
  CanonicalRowView,
  agreementText,
  canonicalCsv,
  canonicalLines,
  canonicalMatrix,
  canonicalTex,
  hasSectorCounts,
  isNumericTable,
} from '../shared/canonical-rows';
import { NumericRowDetail } from './numeric-row-detail';
import { Tex } from '../shared/tex';
import { valueTex } from '@traceloom/shared/format';

/** Height of one collapsed row, the virtual scroll step. */
const ROW_PX = 52;
/** Rows visible before the table scrolls. */
const VISIBLE_ROWS = 12;

/**
 * The canonical table, one row per N, in a Material table inside a CDK virtual-scroll viewport
 * (the CDK table renders only the rows in view). A row expands to the full series, typeset and as
 * copyable plain text.
 */
/** Values up to this many characters (about 35 digits in groups of five) stay on one line. */
const ONE_LINE_DIGITS = 48;

@Component({
  selector: 'tl-canonical-table',
  imports: [
    ClipboardModule,
    MatButtonModule,
    MatIconModule,
    MatTableModule,
    ScrollingModule,
    ExportButtons,
    NumericRowDetail,
    Tex,
  ],
  templateUrl: './canonical-table.html',
  styleUrl: './canonical-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CanonicalTable {
  private readonly snackBar = inject(MatSnackBar);

  readonly rows = input.required<readonly CanonicalRowView[]>();
  readonly variable = input('q');
  readonly title = input('canonical table');
  /** The whole result, for the JSON export. */
  readonly result = input<unknown>(null);
  /** The rows as the large-N analysis normalized them (null: no fitted normalization). */
  protected readonly normalizedRows = computed(() =>
    normalizedCanonicalRows(
      this.rows(),
      (this.result() as { largeN?: Partial<LargeNJson> } | null)?.largeN,
    ),
  );
  /** Show (and export) the normalized rows instead of Z(N). */
  protected readonly normalized = signal(false);

  protected readonly lines = computed(() =>
    canonicalLines((this.normalized() && this.normalizedRows()) || this.rows(), this.variable()),
  );
  protected readonly expanded = signal<number | null>(null);
  protected readonly viewportHeight = computed(
    () => Math.min(this.lines().length, VISIBLE_ROWS) * ROW_PX + ROW_PX + 4,
  );
  protected readonly csvText = computed(() => () => canonicalCsv(this.lines(), this.variable()));
  protected readonly latexText = computed(
    () => () => canonicalTex(this.lines(), this.variable(), this.title()),
  );
  protected readonly matrixText = computed(() => {
    const lines = this.lines();
    if (this.numeric() || this.normalized()) return null;
    const step = (this.result() as { spec?: { step?: string } } | null)?.spec?.step ?? '1';
    return () => canonicalMatrix(lines, this.variable(), step) ?? '';
  });
  protected readonly numeric = computed(() => isNumericTable(this.rows()));
  /**
   * The digits column's width: the table lays out fixed (its header row sets the widths), so the
   * header asks for the longest one-line value in monospace ch plus the cell padding; without it
   * Material's cells cut the value with an ellipsis and determined digits would not be shown.
   */
  protected readonly digitsWidth = computed(() => {
    const longest = Math.max(
      0,
      ...this.lines()
        .map((line) => line.digits.length)
        .filter((n) => n <= ONE_LINE_DIGITS),
    );
    return longest > 0 ? `calc(${longest + 1}ch + 32px)` : null;
  });
  protected readonly oneLineDigits = ONE_LINE_DIGITS;
  protected readonly columns = computed(() => {
    const sectors = hasSectorCounts(this.lines()) ? ['sectors'] : [];
    return this.numeric()
      ? ['expand', 'N', 'digits', 'error', 'closed', ...sectors, 'agreement']
      : ['expand', 'N', 'lead', 'valuation', 'terms', 'known', ...sectors, 'agreement'];
  });
  protected readonly rowPx = ROW_PX;
  protected readonly agreementText = agreementText;
  protected readonly valueTex = valueTex;
  protected readonly trackN = (_: number, line: CanonicalLine) => line.N;

  protected toggle(line: CanonicalLine): void {
    this.expanded.set(this.expanded() === line.N ? null : line.N);
  }

  protected copied(ok: boolean): void {
    const what = this.numeric() ? 'value' : 'series';
    this.snackBar.open(ok ? `Copied the ${what} as plain text.` : 'Copying failed.', undefined, {
      duration: 2500,
    });
  }
}

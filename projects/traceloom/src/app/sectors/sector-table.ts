import { ScrollingModule } from '@angular/cdk/scrolling';
import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { SectorsJson } from '@traceloom/shared/engine';
import { tableLatex, toCsv } from '@traceloom/shared/format';
import { ExportButtons } from '../exports/export-buttons';
import {
  sectorExport,
  sectorLines,
  sortSectorLines,
  type SectorLine,
  type SectorSortKey,
} from './sector-rows';

/** Height of one row, the virtual scroll step. */
const ROW_PX = 40;
/** Rows visible before the table scrolls. */
const VISIBLE_ROWS = 14;

/**
 * The run page's Sectors tab: one row per sector of a sector sum, with its index, its weight, the
 * lowest exponent of Z_n(N) for each N and whether it entered the sum; sortable by any column,
 * in a CDK virtual-scroll viewport (only the rows in view are rendered, for thousands of sectors).
 */
@Component({
  selector: 'tl-sector-table',
  imports: [ExportButtons, MatIconModule, MatSortModule, MatTableModule, ScrollingModule],
  templateUrl: './sector-table.html',
  styleUrl: './sector-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SectorTable {
  readonly block = input.required<SectorsJson>();
  readonly variable = input('q');
  readonly title = input('run');

  protected readonly sort = signal<{ key: SectorSortKey; desc: boolean }>({
    key: 'order',
    desc: false,
  });
  private readonly lines = computed(() => sectorLines(this.block(), this.variable()));
  protected readonly sorted = computed(() =>
    sortSectorLines(this.lines(), this.sort().key, this.sort().desc),
  );
  protected readonly Ns = computed(() =>
    Array.from({ length: this.lines()[0]?.cells.length ?? 0 }, (_, i) => i + 1),
  );
  protected readonly numeric = computed(() => (this.block().rows[0]?.valuations.length ?? 1) === 0);
  protected readonly columns = computed(() => [
    'order',
    'index',
    'weight',
    ...this.Ns().map((N) => `v${N}`),
    'contributed',
  ]);
  protected readonly exportTable = computed(() => sectorExport(this.block(), this.lines()));
  protected readonly csvText = computed(() => {
    const table = this.exportTable();
    return () => toCsv(table);
  });
  protected readonly latexText = computed(() => {
    const table = this.exportTable();
    return () => tableLatex(table, [], `${this.title()} sectors`);
  });
  protected readonly viewportHeight = computed(
    () => Math.min(this.lines().length, VISIBLE_ROWS) * ROW_PX + ROW_PX + 4,
  );
  protected readonly rowPx = ROW_PX;
  protected readonly trackOrder = (_: number, l: SectorLine) => l.order;

  protected onSort(s: Sort): void {
    const key = (s.direction === '' ? 'order' : s.active) as SectorSortKey;
    this.sort.set({ key, desc: s.direction === 'desc' });
  }

  protected indexHeader(): string {
    const names = this.block().index;
    return names.length === 1 ? names[0]! : `(${names.join(', ')})`;
  }
}

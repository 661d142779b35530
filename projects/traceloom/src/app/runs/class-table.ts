import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  viewChild,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatSelectModule } from '@angular/material/select';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import type { ClassRowJson } from '@traceloom/shared/engine';
import { ExportButtons } from '../exports/export-buttons';
import { AsyncState } from '../shared/async-state';
import { RunsApi } from './runs-api';
import { Tex } from '../shared/tex';
import {
  LATEX_PACKAGES,
  classLatex,
  classTable,
  cycleTypeTex,
  cycleTypeText,
  isNumericValue,
  latexComment,
  numericNumber,
  rationalNumber,
  toCsv,
  valuation,
  valueTex,
  valueText,
} from '@traceloom/shared/format';

/** One class-table row as shown. */
export interface ClassLine {
  cycleType: string;
  cycleTex: string;
  cycles: number;
  size: string;
  sign: 1 | -1;
  contributionText: string;
  contributionTex: string;
  /** Sort key of the contribution: its valuation (numeric mode: its absolute value). */
  valuation: number;
}

/** Class-table rows for the screen and the exports. */
export function classLines(rows: readonly ClassRowJson[], variable: string): ClassLine[] {
  return rows.map((r) => ({
    cycleType: cycleTypeText(r.cycleType),
    cycleTex: cycleTypeTex(r.cycleType),
    cycles: r.cycleType.reduce((n, [, m]) => n + m, 0),
    size: r.size,
    sign: r.sign,
    contributionText: valueText(r.contribution, variable),
    contributionTex: valueTex(r.contribution, variable, 4),
    valuation: isNumericValue(r.contribution)
      ? Math.abs(numericNumber(r.contribution))
      : rationalNumber(valuation(r.contribution) ?? 'Infinity'),
  }));
}

/** The class table of one N: cycle type, class size N!/z, sign, contribution; sortable, paged. */
@Component({
  selector: 'tl-class-table',
  imports: [
    AsyncState,
    FormsModule,
    MatFormFieldModule,
    MatIconModule,
    MatPaginatorModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    ExportButtons,
    Tex,
  ],
  templateUrl: './class-table.html',
  styleUrl: './class-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ClassTable {
  private readonly api = inject(RunsApi);

  readonly runId = input.required<string>();
  /** Cycle-type counts per N (`{"4": 5}`), from the run. */
  readonly counts = input<Record<string, number>>({});
  readonly variable = input('q');
  readonly title = input('class table');

  protected readonly choices = computed(() =>
    Object.keys(this.counts())
      .map(Number)
      .filter((n) => n >= 1)
      .sort((a, b) => a - b),
  );
  /** The N shown: the largest at first, the user's choice while it stays among the choices. */
  protected readonly chosen = linkedSignal<number[], number | null>({
    source: this.choices,
    computation: (choices, previous) =>
      previous?.value != null && choices.includes(previous.value)
        ? previous.value
        : (choices[choices.length - 1] ?? null),
  });
  protected readonly classList = this.api.classesResource(
    () => this.runId(),
    () => this.chosen(),
  );
  protected readonly rows = computed<ClassRowJson[]>(() => {
    const n = this.chosen();
    return this.classList.hasValue()
      ? (this.classList.value().result?.classes ?? []).filter((r) => r.N === n)
      : [];
  });
  protected readonly lines = computed(() => classLines(this.rows(), this.variable()));
  protected readonly source = new MatTableDataSource<ClassLine>([]);
  protected readonly columns = ['cycleType', 'size', 'sign', 'contribution'];
  protected readonly csvText = computed(() => {
    const rows = this.rows();
    return () => toCsv(classTable(rows, this.variable()));
  });
  protected readonly latexText = computed(() => {
    const rows = this.rows();
    return () =>
      [
        latexComment(`${this.title()} N=${this.chosen()}`),
        latexComment(`needs ${LATEX_PACKAGES}`),
        ...classLatex(rows, this.variable()),
      ].join('\n') + '\n';
  });

  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.source.sortingDataAccessor = (line, column) => {
      if (column === 'size') return rationalNumber(line.size);
      if (column === 'sign') return line.sign;
      if (column === 'contribution') return line.valuation;
      return line.cycles;
    };
    effect(() => {
      this.source.data = this.lines();
      const sort = this.sort();
      const paginator = this.paginator();
      if (sort) this.source.sort = sort;
      if (paginator) this.source.paginator = paginator;
    });
  }
}

import type { RowVerdictDto, SeriesRowVerdictDto } from '@traceloom/shared/api';
import { RouterLink } from '@angular/router';
import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { messageOf } from '../core/api-error';
import { Session } from '../core/session';
import { ExportButtons } from '../exports/export-buttons';
import type { RunDto } from '@traceloom/shared/api';
import { plainPower } from '@traceloom/shared/format';
import { ChecksApi, ComparisonDto, ReferenceDto, ReferenceSummary } from './checks-api';
import { comparisonCsv, comparisonTex } from './comparison-export';
import { ReferenceUpload } from './reference-upload';
import { SeriesSideBySide } from './series-side-by-side';
import { ImpliedWeights } from './implied-weights';
import { NumericVerdictRow, NumericVerdicts } from './numeric-verdicts';
import { VerdictMatrix } from './verdict-matrix';
import { isNumericVerdict, verdictText } from '@traceloom/shared/format';
import type { VerdictLike } from './verdict-cells';

/**
 * Everything checked about a run: the grand check matrix with the implied weights, the spec's own
 * reference, and stored comparisons with uploaded reference tables, row by row.
 */
@Component({
  selector: 'tl-run-checks',
  imports: [
    DatePipe,
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    ExportButtons,
    ReferenceUpload,
    SeriesSideBySide,
    ImpliedWeights,
    NumericVerdicts,
    VerdictMatrix,
    RouterLink,
  ],
  templateUrl: './run-checks.html',
  styleUrl: './run-checks.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RunChecks {
  private readonly api = inject(ChecksApi);
  private readonly session = inject(Session);

  readonly run = input.required<RunDto>();

  protected readonly result = computed(() => this.run().result);
  protected readonly variable = computed(() => this.run().spec.variable ?? 'q');
  protected readonly step = computed(() => this.run().spec.step ?? '1');
  protected readonly order = computed(() => this.run().spec.order ?? null);
  protected readonly weightsByL = computed(
    () => new Map((this.result()?.weights ?? []).map((w) => [w.L, w.value])),
  );
  protected readonly references = signal<ReferenceSummary[]>([]);
  protected readonly comparisons = signal<ComparisonDto[]>([]);
  protected readonly loading = signal(true);
  protected readonly error = signal<string | null>(null);
  protected readonly chosenReference = signal<string | null>(null);
  protected readonly comparing = signal(false);
  protected readonly showUpload = signal(false);
  /** Roles that may upload references and compare (API contract: all four). */
  protected readonly canCheck = computed(() => this.session.role() !== null);
  protected readonly verdictText = verdictText;
  /** Numeric run: checks compare within a tolerance instead of coefficient by coefficient. */
  protected readonly numeric = computed(() => {
    const r = this.result();
    const rows: unknown[] = [...(r?.grandCheck ?? []), ...(r?.referenceCheck ?? [])];
    return this.run().spec.precision !== undefined || rows.some(isNumericVerdict);
  });
  protected readonly comparisonCsv = comparisonCsv;
  protected readonly comparisonTex = comparisonTex;

  constructor() {
    effect(() => this.load(this.run()));
  }

  protected asNumeric(rows: readonly unknown[]): NumericVerdictRow[] {
    return rows.filter(isNumericVerdict) as NumericVerdictRow[];
  }

  protected asSeries(rows: readonly unknown[]): VerdictLike[] {
    return rows.filter((row) => !isNumericVerdict(row)) as VerdictLike[];
  }

  /** The series verdicts of a comparison (a numeric comparison has none). */
  protected seriesRows(rows: readonly RowVerdictDto[]): SeriesRowVerdictDto[] {
    return rows.filter((row): row is SeriesRowVerdictDto => !isNumericVerdict(row));
  }

  protected power(exponent: string): string {
    return plainPower(this.variable(), exponent) || '1';
  }

  protected referenceTitle(id: string | null): string {
    if (!id) return 'the grand function';
    return this.references().find((r) => r.id === id)?.title ?? 'a reference table';
  }

  protected compare(body: { referenceId: string } | { grand: true }): void {
    this.comparing.set(true);
    this.error.set(null);
    this.api.compare(this.run().id, body).subscribe({
      next: (comparison) => {
        this.comparing.set(false);
        this.comparisons.set([comparison, ...this.comparisons()]);
      },
      error: (err: unknown) => {
        this.comparing.set(false);
        this.error.set(messageOf(err));
      },
    });
  }

  protected onUploaded(reference: ReferenceDto): void {
    this.references.set([{ ...reference, rowCount: reference.rows.length }, ...this.references()]);
    this.chosenReference.set(reference.id);
    this.showUpload.set(false);
    this.compare({ referenceId: reference.id });
  }

  private load(run: RunDto): void {
    this.loading.set(true);
    this.api.references(run.studyId).subscribe({
      next: (refs) => this.references.set(refs),
      error: (err: unknown) => this.error.set(messageOf(err)),
    });
    this.api.comparisons(run.id).subscribe({
      next: (list) => {
        this.loading.set(false);
        this.comparisons.set([...list].sort((a, b) => b.createdAt.localeCompare(a.createdAt)));
      },
      error: (err: unknown) => {
        this.loading.set(false);
        this.error.set(messageOf(err));
      },
    });
  }
}

import type { RowVerdictDto, SeriesRowVerdictDto } from '@traceloom/shared/api';
import { RouterLink } from '@angular/router';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { messageOf } from '../core/api-error';
import { Session } from '../core/session';
import { ExportButtons } from '../exports/export-buttons';
import { AsyncState } from '../shared/async-state';
import type { RunDto } from '@traceloom/shared/api';
import { plainPower } from '@traceloom/shared/format';
import { ChecksApi, ReferenceDto } from './checks-api';
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
    AsyncState,
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
  /**
   * Read by the run's study and id (computed strings: a new copy of the same run, as the run page
   * re-reads it, requests nothing again).
   */
  private readonly runId = computed(() => this.run().id);
  private readonly studyId = computed(() => this.run().studyId);
  private readonly referenceList = this.api.referencesResource(this.studyId);
  protected readonly comparisonList = this.api.comparisonsResource(this.runId);
  protected readonly references = computed(() =>
    this.referenceList.hasValue() ? this.referenceList.value() : [],
  );
  /** Newest first. */
  protected readonly comparisons = computed(() =>
    this.comparisonList.hasValue()
      ? [...this.comparisonList.value()].sort((a, b) => b.createdAt.localeCompare(a.createdAt))
      : [],
  );
  /** A refused comparison. */
  protected readonly compareError = signal<string | null>(null);
  /** The refused comparison, else why the study's reference tables could not be read. */
  protected readonly error = computed(() => {
    const refused = this.compareError();
    if (refused) return refused;
    const err = this.referenceList.error();
    return err ? messageOf(err) : null;
  });
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
    this.compareError.set(null);
    this.api.compare(this.run().id, body).subscribe({
      next: (comparison) => {
        this.comparing.set(false);
        this.comparisonList.set([comparison, ...this.comparisons()]);
      },
      error: (err: unknown) => {
        this.comparing.set(false);
        this.compareError.set(messageOf(err));
      },
    });
  }

  protected onUploaded(reference: ReferenceDto): void {
    this.referenceList.set([
      { ...reference, rowCount: reference.rows.length },
      ...this.references(),
    ]);
    this.chosenReference.set(reference.id);
    this.showUpload.set(false);
    this.compare({ referenceId: reference.id });
  }
}

import { ScrollingModule } from '@angular/cdk/scrolling';
import { SyntaxLink } from '../shared/syntax-link';
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
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { rxResource } from '@angular/core/rxjs-interop';
import { Router, RouterLink } from '@angular/router';
import { forkJoin, map, of, switchMap, filter } from 'rxjs';
import { messageOf } from '../core/api-error';
import { ConfirmData, ConfirmDialog } from '../core/confirm-dialog';
import { showOnField } from '../core/form-errors';
import { Session } from '../core/session';
import { GasesApi } from '../gases/gases-api';
import { canWriteGases } from '../core/gas-roles';
import { RunsApi } from '../runs/runs-api';
import { AsyncState } from '../shared/async-state';
import { StudyCrumb } from '../shared/study-crumb';
import { ChecksApi, ReferenceComparisonDto, ReferenceDto } from '../checks/checks-api';

/** A finished run of the study that the table may be compared with. */
interface RunChoice {
  id: string;
  label: string;
}

/** Rows shown as a plain table up to this many; longer tables scroll virtually. */
const PLAIN_ROWS = 40;

/**
 * One reference table: its rows, every comparison with a run (linked), "compare with a run" over
 * the study's finished runs, and edit / delete for the uploader or an editing role.
 */
@Component({
  selector: 'tl-reference-page',
  imports: [
    AsyncState,
    SyntaxLink,
    DatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ReactiveFormsModule,
    RouterLink,
    ScrollingModule,
    StudyCrumb,
  ],
  templateUrl: './reference-page.html',
  styleUrl: './reference-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReferencePage {
  private readonly api = inject(ChecksApi);
  private readonly gases = inject(GasesApi);
  private readonly runs = inject(RunsApi);
  private readonly session = inject(Session);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  readonly referenceId = input.required<string>();

  protected readonly reference = this.api.referenceResource(() => this.referenceId());
  protected readonly table = computed<ReferenceDto | null>(() =>
    this.reference.hasValue() ? this.reference.value() : null,
  );
  protected readonly comparisonList = this.api.referenceComparisonsResource(() =>
    this.referenceId(),
  );
  protected readonly comparisons = computed<ReferenceComparisonDto[] | null>(() =>
    this.comparisonList.hasValue() ? this.comparisonList.value() : null,
  );
  /** Every finished run of every gas of the study, newest first (re-read when the study changes). */
  protected readonly runList = rxResource({
    params: () => this.table()?.studyId,
    stream: ({ params: studyId }) => this.finishedRuns(studyId),
  });
  protected readonly runChoices = computed<RunChoice[] | null>(() =>
    this.runList.hasValue() ? this.runList.value() : null,
  );
  protected readonly chosenRun = signal<string | null>(null);
  protected readonly comparing = signal(false);
  private readonly actionError = signal<string | null>(null);
  /** A failed comparison, or a failed read of the comparisons or of the runs to choose from. */
  protected readonly compareError = computed(() => {
    const err = this.comparisonList.error() ?? this.runList.error();
    return this.actionError() ?? (err ? messageOf(err) : null);
  });
  protected readonly saving = signal(false);
  protected readonly saveError = signal<string | null>(null);
  protected readonly long = computed(() => (this.table()?.rows.length ?? 0) > PLAIN_ROWS);
  protected readonly rowPx = 40;
  protected readonly canChange = computed(() => {
    const t = this.table();
    const user = this.session.user();
    return !!t && !!user && (canWriteGases(user.role) || t.createdBy.id === user.id);
  });

  protected readonly form = new FormGroup({
    title: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    normalization: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    note: new FormControl('', { nonNullable: true }),
  });

  constructor() {
    effect(() => {
      const table = this.table();
      if (table)
        this.form.reset({
          title: table.title,
          normalization: table.normalization,
          note: table.note ?? '',
        });
    });
  }

  private finishedRuns(studyId: string) {
    return this.gases.list(studyId).pipe(
      switchMap((gases) =>
        gases.length === 0
          ? of([])
          : forkJoin(
              gases.map((g) =>
                this.runs.list(g.id).pipe(
                  map((runs) =>
                    runs
                      .filter((r) => r.status === 'done')
                      .map((r) => ({
                        id: r.id,
                        at: r.finishedAt ?? r.createdAt,
                        label: `${g.title}, version ${r.gasVersion}, finished ${new Date(
                          r.finishedAt ?? r.createdAt,
                        ).toLocaleString()}`,
                      })),
                  ),
                ),
              ),
            ),
      ),
      map((lists) =>
        lists
          .flat()
          .sort((a, b) => b.at.localeCompare(a.at))
          .map(({ id, label }) => ({ id, label })),
      ),
    );
  }

  protected compare(): void {
    const runId = this.chosenRun();
    const table = this.table();
    if (!runId || !table) return;
    this.comparing.set(true);
    this.actionError.set(null);
    this.api.compare(runId, { referenceId: table.id }).subscribe({
      next: (c) => {
        this.comparing.set(false);
        this.snackBar.open(
          `Compared: ${c.summary.agreeing} of ${c.summary.total} rows agree.`,
          undefined,
          { duration: 4000 },
        );
        this.comparisonList.reload();
      },
      error: (err: unknown) => {
        this.comparing.set(false);
        this.actionError.set(messageOf(err));
      },
    });
  }

  protected save(): void {
    const table = this.table();
    if (!table || this.form.invalid) return;
    const v = this.form.getRawValue();
    this.saving.set(true);
    this.saveError.set(null);
    this.api.update(table.id, v).subscribe({
      next: (updated) => {
        this.saving.set(false);
        this.reference.set(updated);
        this.form.markAsPristine();
        this.snackBar.open('Reference table saved.', undefined, { duration: 3000 });
      },
      error: (err: unknown) => {
        this.saving.set(false);
        if (!showOnField(this.form, err)) this.saveError.set(messageOf(err));
      },
    });
  }

  protected confirmDelete(): void {
    const table = this.table();
    if (!table) return;
    const n = this.comparisons()?.length ?? 0;
    const data: ConfirmData = {
      title: 'Delete this reference table?',
      message: `“${table.title}” and its ${n} comparison${n === 1 ? '' : 's'} will be removed. This cannot be undone.`,
      confirmLabel: 'Delete table',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, { data })
      .afterClosed()
      .pipe(
        filter((yes) => yes === true),
        switchMap(() => this.api.remove(table.id)),
      )
      .subscribe({
        next: () => {
          this.snackBar.open(`Reference table “${table.title}” deleted.`, undefined, {
            duration: 4000,
          });
          void this.router.navigate(['/studies', table.studyId]);
        },
        error: (err: unknown) => this.saveError.set(messageOf(err)),
      });
  }
}

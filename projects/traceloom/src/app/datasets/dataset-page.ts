import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { DatasetDto } from '@traceloom/shared/api';
import type { Observable } from 'rxjs';
import { messageOf } from '../core/api-error';
import { downloadText, fileStem } from '../exports/export-files';
import { rowValueText } from '@traceloom/shared/format';
import { AsyncState } from '../shared/async-state';
import { DatasetAuthors } from './dataset-authors';
import { DatasetChecks, WaiverRequest } from './dataset-checks';
import { DatasetReviewPanel } from './dataset-review-panel';
import { ConfirmData, ConfirmDialog } from '../core/confirm-dialog';
import { DatasetsApi, ExportFormat, stateIcon, stateLabel, VerifyAnswerDto } from './datasets-api';

const EXPORT_TYPES: Record<ExportFormat, [ext: string, type: string]> = {
  json: ['json', 'application/json'],
  csv: ['csv', 'text/csv'],
  latex: ['tex', 'application/x-latex'],
};

/**
 * One dataset: state and snapshot, checks with waivers, review requests, reviews and row
 * comments, and the steward's lock; once locked, the citation, exports and verify.
 */
@Component({
  selector: 'tl-dataset-page',
  imports: [
    DatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    RouterLink,
    DatasetReviewPanel,
    DatasetAuthors,
    AsyncState,
    DatasetChecks,
  ],
  templateUrl: './dataset-page.html',
  styleUrl: './dataset-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DatasetPage {
  private readonly api = inject(DatasetsApi);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);

  /** Route `datasets/:datasetId`. */
  readonly datasetId = input.required<string>();

  /** The dataset, read through the feature's api; a write's answer replaces it. */
  protected readonly datasetResource = this.api.datasetResource(() => this.datasetId());
  protected readonly dataset = computed(() =>
    this.datasetResource.hasValue() ? this.datasetResource.value()! : null,
  );
  /** Its study (for choosing authors and reviewers among the members). */
  // A string signal: a write's answer for the same study does not read the study again.
  private readonly studyId = computed(() => this.dataset()?.studyId);
  private readonly studyResource = this.api.studyResource(() => this.studyId());
  protected readonly study = computed(() =>
    this.studyResource.hasValue() ? this.studyResource.value()! : null,
  );
  protected readonly busy = signal(false);
  protected readonly verifyAnswer = signal<VerifyAnswerDto | null>(null);
  protected readonly stateLabel = stateLabel;
  protected readonly stateIcon = stateIcon;
  /** A row's value, or "not determined (O(q^k))" (honest rows). */
  protected readonly valueText = rowValueText;
  protected readonly failCount = computed(
    () => this.dataset()?.checks.filter((c) => c.status === 'fails').length ?? 0,
  );
  protected readonly publicPath = computed(() => {
    const hash = this.dataset()?.hash;
    return hash ? `/public/${hash}` : null;
  });

  /** Runs a write; on success shows the answer (or reloads), on failure a snackbar. */
  protected act(call: Observable<unknown>, done: string, after?: (value: unknown) => void): void {
    this.busy.set(true);
    call.subscribe({
      next: (value) => {
        this.busy.set(false);
        this.snack.open(done, 'Close', { duration: 4000 });
        if (value && typeof value === 'object' && 'checks' in value)
          this.datasetResource.set(value as DatasetDto);
        else this.datasetResource.reload();
        after?.(value);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.snack.open(messageOf(err), 'Close', { duration: 8000 });
      },
    });
  }

  protected updated(d: DatasetDto): void {
    this.datasetResource.set(d);
  }

  /** The citation file of a locked dataset (the public route; a locked dataset is public). */
  protected citationPath(hash: string, format: 'bibtex' | 'csl'): string {
    return `/api/public/datasets/${encodeURIComponent(hash)}/citation?format=${format}`;
  }

  /** Locking cannot be undone: first names the hash-to-be and what it freezes, then locks. */
  protected lock(d: DatasetDto): void {
    this.busy.set(true);
    this.api.lockPreview(d.id).subscribe({
      next: (preview) => {
        this.busy.set(false);
        const data: ConfirmData = {
          title: `Lock “${d.title}” v${d.version}?`,
          message:
            'Locking is final: the dataset can then be read, exported, cited and verified, never changed. It freezes:',
          items: preview.freezes,
          code: { label: 'It will carry the SHA-256 hash', value: preview.hash },
          confirmLabel: 'Lock for good',
        };
        this.dialog
          .open(ConfirmDialog, { data, width: '560px' })
          .afterClosed()
          .subscribe((yes) => {
            if (!yes) return;
            const confirmed = { lockedAt: preview.lockedAt, hash: preview.hash };
            this.act(this.api.lock(d.id, confirmed), 'Locked. The dataset can no longer change.');
          });
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.snack.open(messageOf(err), 'Close', { duration: 8000 });
      },
    });
  }

  protected withdraw(d: DatasetDto): void {
    this.act(this.api.withdraw(d.id), 'Withdrawn.');
  }

  protected remove(d: DatasetDto): void {
    this.act(
      this.api.remove(d.id),
      'Draft deleted.',
      () => void this.router.navigate(['/datasets']),
    );
  }

  protected verify(d: DatasetDto): void {
    this.busy.set(true);
    this.verifyAnswer.set(null);
    this.api.verify(d.id).subscribe({
      next: (answer) => {
        this.busy.set(false);
        this.verifyAnswer.set(answer);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.snack.open(messageOf(err), 'Close', { duration: 8000 });
      },
    });
  }

  protected download(d: DatasetDto, format: ExportFormat): void {
    const [ext, type] = EXPORT_TYPES[format];
    this.api.exportText(d.id, format).subscribe({
      next: (text) => downloadText(text, `${fileStem(d.title)}-v${d.version}.${ext}`, type),
      error: (err: unknown) => this.snack.open(messageOf(err), 'Close', { duration: 8000 }),
    });
  }

  protected copyCitation(text: string): void {
    void navigator.clipboard?.writeText(text).then(
      () => this.snack.open('Citation copied.', 'Close', { duration: 3000 }),
      () =>
        this.snack.open('Copy failed: select the text and copy it.', 'Close', { duration: 5000 }),
    );
  }

  protected waive(d: DatasetDto, w: WaiverRequest): void {
    const { check: c, reason } = w;
    this.act(this.api.waive(d.id, c.check, c.N, reason), 'Check waived with your reason.');
  }
}

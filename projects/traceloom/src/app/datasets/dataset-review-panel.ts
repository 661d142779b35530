import { may } from '@traceloom/shared/api';
import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { DatasetDto, StudyDto } from '@traceloom/shared/api';
import type { Observable } from 'rxjs';
import { messageOf } from '../core/api-error';
import { DatasetsApi } from './datasets-api';

/** Review requests, verdicts and (row) comments of one dataset, with the forms the caller may use. */
@Component({
  selector: 'tl-dataset-review-panel',
  imports: [
    DatePipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './dataset-review-panel.html',
  styleUrl: './dataset-review-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DatasetReviewPanel {
  private readonly api = inject(DatasetsApi);
  private readonly snack = inject(MatSnackBar);

  readonly dataset = input.required<DatasetDto>();
  /** The dataset's study, for choosing reviewers among its members. */
  readonly study = input<StudyDto | null>(null);
  /** The dataset as the server answered after a change. */
  readonly changed = output<DatasetDto>();

  protected readonly busy = signal(false);
  protected readonly chosen = signal<string[]>([]);
  protected readonly verdict = signal<'approve' | 'changes'>('approve');
  protected readonly verdictComment = signal('');
  protected readonly commentBody = signal('');
  /** Row N commented on; -1 for the whole dataset. */
  protected readonly commentRow = signal(-1);

  /** Study members who may review: reviewers and stewards, not the author, not yet asked. */
  protected readonly candidates = computed(() => {
    const d = this.dataset();
    const s = this.study();
    if (!s) return [];
    const asked = new Set(d.reviewRequests.map((r) => r.reviewer.id));
    const people = [...s.members, { ...s.owner, role: 'author' as const }];
    return people.filter(
      (p) => may(p.role, 'review') && p.id !== d.createdBy.id && !asked.has(p.id),
    );
  });
  protected readonly rows = computed(() => this.dataset().snapshot.canonical.map((r) => r.N));
  protected readonly open = computed(() => {
    const state = this.dataset().state;
    return state === 'draft' || state === 'in_review';
  });

  private send(call: Observable<DatasetDto>, done: string, reset: () => void): void {
    this.busy.set(true);
    call.subscribe({
      next: (d) => {
        this.busy.set(false);
        reset();
        this.snack.open(done, 'Close', { duration: 4000 });
        this.changed.emit(d);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.snack.open(messageOf(err), 'Close', { duration: 8000 });
      },
    });
  }

  protected requestReview(): void {
    const ids = this.chosen();
    if (ids.length === 0) return;
    this.send(
      this.api.requestReview(this.dataset().id, ids),
      'Review requested; the reviewers were mailed.',
      () => this.chosen.set([]),
    );
  }

  protected submitReview(): void {
    this.send(
      this.api.review(this.dataset().id, this.verdict(), this.verdictComment().trim()),
      'Verdict recorded; the author was mailed.',
      () => this.verdictComment.set(''),
    );
  }

  protected submitComment(): void {
    const body = this.commentBody().trim();
    if (!body) return;
    this.send(
      this.api.comment(
        this.dataset().id,
        body,
        this.commentRow() < 0 ? undefined : this.commentRow(),
      ),
      'Comment added.',
      () => {
        this.commentBody.set('');
        this.commentRow.set(-1);
      },
    );
  }
}

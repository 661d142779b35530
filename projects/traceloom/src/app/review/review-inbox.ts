import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { ReviewInboxEntryDto } from '@traceloom/shared/api';
import { messageOf } from '../core/api-error';
import { stateLabel } from '../datasets/datasets-api';

/** The reviewer's inbox: datasets they were asked to review, waiting ones first. */
@Component({
  selector: 'tl-review-inbox',
  imports: [DatePipe, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './review-inbox.html',
  styleUrl: './review-inbox.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReviewInbox {
  protected readonly inbox = httpResource<ReviewInboxEntryDto[]>(() => '/api/review-requests');
  protected readonly stateLabel = stateLabel;
  protected readonly entries = computed(() => {
    const all = this.inbox.value() ?? [];
    const waiting = (e: ReviewInboxEntryDto) =>
      e.dataset.state === 'in_review' && e.myVerdict === null;
    return [...all.filter(waiting), ...all.filter((e) => !waiting(e))];
  });
  protected readonly waitingCount = computed(
    () =>
      this.entries().filter((e) => e.dataset.state === 'in_review' && e.myVerdict === null).length,
  );
  protected readonly loadError = computed(() => {
    const e = this.inbox.error();
    return e ? messageOf(e) : null;
  });
}

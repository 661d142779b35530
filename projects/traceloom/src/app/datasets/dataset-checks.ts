import { ChangeDetectionStrategy, Component, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { DatasetCheckDto } from '@traceloom/shared/api';
import { checkStatusText } from '@traceloom/shared/format';

/** A steward's waiver of one failing check row, with the written reason. */
export interface WaiverRequest {
  check: DatasetCheckDto;
  reason: string;
}

/**
 * A dataset's checks, one row each: what was checked, N, passes / fails / waived (older words
 * read as these), the detail and any waiver with its reason. With `canWaive`, a failing row
 * offers the steward's waiver form (the dataset page); without, it only reads (the public page).
 */
@Component({
  selector: 'tl-dataset-checks',
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule],
  templateUrl: './dataset-checks.html',
  styleUrl: './dataset-checks.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DatasetChecks {
  readonly checks = input.required<readonly DatasetCheckDto[]>();
  readonly canWaive = input(false);
  readonly busy = input(false);
  /** A waiver with a reason that is not blank. */
  readonly waive = output<WaiverRequest>();

  protected readonly statusText = checkStatusText;
  protected readonly reasons = signal<Partial<Record<string, string>>>({});
  /** The row whose waiver was sent without a reason. */
  protected readonly missingReason = signal<string | null>(null);

  protected key(c: DatasetCheckDto): string {
    return `${c.check}|${c.N ?? ''}`;
  }

  protected setReason(c: DatasetCheckDto, reason: string): void {
    this.reasons.update((all) => ({ ...all, [this.key(c)]: reason }));
    if (reason.trim()) this.missingReason.set(null);
  }

  protected send(c: DatasetCheckDto): void {
    const reason = (this.reasons()[this.key(c)] ?? '').trim();
    if (!reason) {
      this.missingReason.set(this.key(c));
      return;
    }
    this.waive.emit({ check: c, reason });
  }
}

import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ApiError, messageOf } from '../core/api-error';
import type { MailboxMessageDto } from '../datasets/datasets-api';
import { mailParts } from './mail-links';

/** The local mail fake's messages (admin; demo and test mode), newest first. */
@Component({
  selector: 'tl-mailbox',
  imports: [DatePipe, MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './mailbox.html',
  styleUrl: './mailbox.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Mailbox {
  protected readonly messages = httpResource<MailboxMessageDto[]>(() => '/api/dev/mailbox');
  protected readonly openId = signal<number | null>(null);
  protected readonly loadError = computed(() => {
    const e = this.messages.error();
    if (!e) return null;
    return e instanceof ApiError && e.code === 'mailbox_off'
      ? 'Mail goes to a real relay here; the local mailbox is only on in demo and test mode.'
      : messageOf(e);
  });

  protected readonly parts = mailParts;

  protected toggle(id: number): void {
    this.openId.update((current) => (current === id ? null : id));
  }
}

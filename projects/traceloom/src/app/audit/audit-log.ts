import { DatePipe, JsonPipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, signal } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import type { AuditEventDto } from '@traceloom/shared/api';
import { messageOf } from '../core/api-error';

/** Kinds of things the audit log names. */
const TARGET_TYPES = [
  'dataset',
  'run',
  'gas',
  'reference',
  'comparison',
  'study',
  'user',
  'invitation',
];

/** The audit log (stewards and admins): every state change, review and lock, newest first. */
@Component({
  selector: 'tl-audit-log',
  imports: [
    DatePipe,
    JsonPipe,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
  ],
  templateUrl: './audit-log.html',
  styleUrl: './audit-log.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AuditLog {
  protected readonly targetType = signal('');
  protected readonly types = TARGET_TYPES;
  protected readonly events = httpResource<AuditEventDto[]>(() => ({
    url: '/api/audit',
    params: { limit: '200', ...(this.targetType() ? { targetType: this.targetType() } : {}) },
  }));
  protected readonly loadError = computed(() => {
    const e = this.events.error();
    return e ? messageOf(e) : null;
  });
}

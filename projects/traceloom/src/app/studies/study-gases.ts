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
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { ChecksApi, ReferenceSummary } from '../checks/checks-api';
import { messageOf } from '../core/api-error';
import { Session } from '../core/session';
import { canWriteGases } from '../core/gas-roles';
import { STATUS_ICONS, STATUS_LABELS } from '../shared/run-status';
import type { RunStatus } from '../runs/runs-api';
import { GasSummary, GasesApi } from '../gases/gases-api';

const KIND_LABELS: Record<GasSummary['weightsKind'], string> = {
  values: 'list of values',
  formula: 'formula in L',
  spectrum: 'spectrum',
  kernel: 'numeric kernel',
};

/** A study's gases (with their last run) and reference tables, on the study page. */
@Component({
  selector: 'tl-study-gases',
  imports: [DatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './study-gases.html',
  styleUrl: './study-gases.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyGases {
  private readonly gasesApi = inject(GasesApi);
  private readonly checksApi = inject(ChecksApi);
  private readonly session = inject(Session);

  readonly studyId = input.required<string>();

  protected readonly gases = signal<GasSummary[] | null>(null);
  protected readonly references = signal<ReferenceSummary[] | null>(null);
  protected readonly gasError = signal<string | null>(null);
  protected readonly referenceError = signal<string | null>(null);
  protected readonly canWrite = computed(() => canWriteGases(this.session.role()));
  protected readonly kindLabels = KIND_LABELS;

  constructor() {
    effect(() => this.load(this.studyId()));
  }

  protected statusLabel(status: string): string {
    return STATUS_LABELS[status as RunStatus] ?? status;
  }

  protected statusIcon(status: string): string {
    return STATUS_ICONS[status as RunStatus] ?? 'help';
  }

  protected load(studyId: string): void {
    this.gasError.set(null);
    this.referenceError.set(null);
    this.gasesApi.list(studyId).subscribe({
      next: (gases) => this.gases.set(gases),
      error: (err: unknown) => this.gasError.set(messageOf(err)),
    });
    this.checksApi.references(studyId).subscribe({
      next: (refs) => this.references.set(refs),
      error: (err: unknown) => this.referenceError.set(messageOf(err)),
    });
  }
}

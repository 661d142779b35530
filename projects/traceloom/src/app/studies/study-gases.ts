import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { ChecksApi } from '../checks/checks-api';
import { AsyncState } from '../shared/async-state';
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
  imports: [AsyncState, DatePipe, MatButtonModule, MatIconModule, RouterLink],
  templateUrl: './study-gases.html',
  styleUrl: './study-gases.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyGases {
  private readonly gasesApi = inject(GasesApi);
  private readonly checksApi = inject(ChecksApi);
  private readonly session = inject(Session);

  readonly studyId = input.required<string>();

  /** Both read the study `studyId()`: a new study cancels the previous requests. */
  protected readonly gasList = this.gasesApi.listResource(() => this.studyId());
  protected readonly referenceList = this.checksApi.referencesResource(() => this.studyId());
  protected readonly gases = computed<GasSummary[]>(() =>
    this.gasList.hasValue() ? this.gasList.value() : [],
  );
  protected readonly references = computed(() =>
    this.referenceList.hasValue() ? this.referenceList.value() : [],
  );
  protected readonly canWrite = computed(() => canWriteGases(this.session.role()));
  protected readonly kindLabels = KIND_LABELS;

  protected statusLabel(status: string): string {
    return STATUS_LABELS[status as RunStatus] ?? status;
  }

  protected statusIcon(status: string): string {
    return STATUS_ICONS[status as RunStatus] ?? 'help';
  }

  /** Reads both lists again. */
  protected reload(): void {
    this.gasList.reload();
    this.referenceList.reload();
  }
}

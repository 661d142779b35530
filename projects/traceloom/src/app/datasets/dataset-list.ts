import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { DatasetSummaryDto } from '@traceloom/shared/api';
import { messageOf } from '../core/api-error';
import { stateIcon, stateLabel } from './datasets-api';

/** Every dataset the caller may see, newest first, with state and version. */
@Component({
  selector: 'tl-dataset-list',
  imports: [DatePipe, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './dataset-list.html',
  styleUrl: './dataset-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DatasetList {
  protected readonly datasets = httpResource<DatasetSummaryDto[]>(() => '/api/datasets');
  protected readonly stateLabel = stateLabel;
  protected readonly stateIcon = stateIcon;
  protected readonly loadError = computed(() => {
    const e = this.datasets.error();
    return e ? messageOf(e) : null;
  });
}

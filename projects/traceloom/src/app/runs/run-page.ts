import { StudyCrumb } from '../shared/study-crumb';
import { AsyncState } from '../shared/async-state';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { Router, RouterLink } from '@angular/router';
import { RunChecks } from '../checks/run-checks';
import { Session } from '../core/session';
import { CreateDataset } from '../datasets/create-dataset';
import { canWriteGases } from '../core/gas-roles';
import { CanonicalTable } from './canonical-table';
import { ClassTable } from './class-table';
import { SectorTable } from '../sectors/sector-table';
import { RunPlots } from '../plots/run-plots';
import { LargeNPanel } from '../largen/large-n-panel';
import { NumericCaution } from './numeric-caution';
import { RunProgressPanel } from './run-progress';
import { RunEstimate } from './run-estimate';
import { routeName } from '@traceloom/shared/format';
import { STATUS_ICONS, STATUS_LABELS, durationText } from '../shared/run-status';
import { RunDto, RunStartState, RunsApi, isActive, runErrorText } from './runs-api';
import { groupTruncations, truncationText } from './truncations';

/** One run: status and timings, then its canonical table, class table, checks and plots. */
@Component({
  selector: 'tl-run-page',
  imports: [
    StudyCrumb,
    AsyncState,
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatTabsModule,
    RouterLink,
    CanonicalTable,
    ClassTable,
    SectorTable,
    RunChecks,
    RunPlots,
    LargeNPanel,
    RunProgressPanel,
    CreateDataset,
    NumericCaution,
    RunEstimate,
  ],
  templateUrl: './run-page.html',
  styleUrl: './run-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RunPage {
  private readonly api = inject(RunsApi);
  private readonly session = inject(Session);
  private readonly router = inject(Router);

  /** Route `runs/:runId`. */
  readonly runId = input.required<string>();

  /** The run, read through the feature's api; a finished run's results come by a reload. */
  protected readonly runResource = this.api.runResource(() => this.runId());
  protected readonly run = computed(() =>
    this.runResource.hasValue() ? this.runResource.value()! : null,
  );
  protected readonly tab = signal(0);
  /** Warnings answered when this run was started from the editor (kept across a reload). */
  protected readonly startWarnings = signal<string[]>(this.readStartWarnings());
  protected readonly truncations = groupTruncations;
  protected readonly truncationText = truncationText;
  protected readonly variable = computed(() => this.run()?.spec.variable ?? 'q');
  protected readonly title = computed(() => this.run()?.spec.title || 'run');
  protected readonly active = computed(() => {
    const run = this.run();
    return !!run && isActive(run.status);
  });
  protected readonly canCancel = computed(() => canWriteGases(this.session.role()));
  protected readonly labels = STATUS_LABELS;
  protected readonly icons = STATUS_ICONS;
  protected readonly durationText = durationText;
  protected readonly runErrorText = runErrorText;

  /** The routes a partial result's canonical table was computed by, in words. */
  protected keptRoutes(result: NonNullable<RunDto['result']>): string {
    const routes = result.canonical[0]?.routes ?? ['recursion'];
    return routes.map(routeName).join(' and ');
  }

  private readStartWarnings(): string[] {
    const state = (this.router.currentNavigation()?.extras.state ?? history.state) as
      Partial<RunStartState> | null | undefined;
    const warnings = state?.startWarnings;
    return Array.isArray(warnings) ? warnings.filter((w) => typeof w === 'string') : [];
  }

  /** Reads the run again (when the followed run finishes, its results arrive). */
  protected reload(): void {
    this.runResource.reload();
  }
}

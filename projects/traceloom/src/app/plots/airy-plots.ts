import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartConfiguration } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';
import { AiryFit, airyCurvePoints, logZPoints } from './airy-data';

const INK = '#1e3a5f';
const AMBER = '#c27c0e';

/**
 * The large-N Airy fit of a numeric table: ln Z(N) with the fitted curve
 * ln[C^(-1/3) e^A Ai(C^(-1/3)(N - B))] drawn in the client, the residual per N, and C, B, A with
 * their uncertainties. Charts come from the parent's `provideCharts`.
 */
@Component({
  selector: 'tl-airy-plots',
  imports: [BaseChartDirective],
  templateUrl: './airy-plots.html',
  styleUrl: './run-plots.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AiryPlots {
  readonly airy = input.required<AiryFit>();
  readonly rows = input.required<readonly { N: number; value: unknown }[]>();

  protected readonly parameters = computed(() => {
    const f = this.airy();
    return [
      { name: 'C', value: f.C.value, uncertainty: f.C.uncertainty },
      { name: 'B', value: f.B.value, uncertainty: f.B.uncertainty },
      { name: 'A', value: f.A.value, uncertainty: f.A.uncertainty },
    ];
  });

  protected readonly curveChart = computed<ChartConfiguration<'line'>>(() => {
    const points = logZPoints(this.rows());
    const xs = points.map((p) => p.x);
    const from = Math.min(...xs, ...this.airy().fittedOn);
    const to = Math.max(...xs, ...this.airy().fittedOn);
    return {
      type: 'line',
      data: {
        datasets: [
          {
            label: 'ln Z(N), computed',
            data: points,
            showLine: false,
            borderColor: INK,
            backgroundColor: INK,
            pointStyle: 'circle',
            pointRadius: 4,
          },
          {
            label: 'Airy fit',
            data: airyCurvePoints(this.airy(), from, to),
            borderColor: AMBER,
            backgroundColor: AMBER,
            pointRadius: 0,
            borderWidth: 2,
            borderDash: [6, 3],
          },
        ],
      },
      options: {
        animation: false,
        parsing: false,
        maintainAspectRatio: false,
        scales: {
          x: { type: 'linear', title: { display: true, text: 'N' } },
          y: { type: 'linear', title: { display: true, text: 'ln Z(N)' } },
        },
      },
    };
  });

  protected readonly residualChart = computed<ChartConfiguration<'line'>>(() => ({
    type: 'line',
    data: {
      datasets: [
        {
          label: 'residual ln Z(N) − fit',
          data: this.airy().residuals.map((r) => ({ x: r.N, y: r.residual })),
          borderColor: INK,
          backgroundColor: INK,
          pointStyle: 'rect',
          pointRadius: 4,
        },
      ],
    },
    options: {
      animation: false,
      parsing: false,
      maintainAspectRatio: false,
      scales: {
        x: { type: 'linear', title: { display: true, text: 'N' }, ticks: { stepSize: 1 } },
        y: { type: 'linear', title: { display: true, text: 'residual' } },
      },
    },
  }));

  protected num(x: number): string {
    return Number.isFinite(x) ? x.toPrecision(6) : '—';
  }
}

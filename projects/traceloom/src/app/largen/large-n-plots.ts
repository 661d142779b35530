import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { LargeNClassJson } from '@traceloom/shared/engine';
import type { ChartConfiguration } from 'chart.js';
import { BaseChartDirective, provideCharts, withDefaultRegisterables } from 'ng2-charts';
import { correctionPoints, linearAt, stabilizationPoints } from './large-n-format';

// Distinguishable by marker shape as well as colour (as in the run plots).
const STYLE = [
  { color: '#1e3a5f', point: 'circle' },
  { color: '#c27c0e', point: 'rect' },
  { color: '#2f6b4f', point: 'triangle' },
] as const;

/** Options of a linear-axes chart against N (no animation, points given as {x, y}). */
function againstN(yTitle: string): ChartConfiguration<'line'>['options'] {
  return {
    animation: false,
    parsing: false,
    maintainAspectRatio: false,
    scales: {
      x: { type: 'linear', title: { display: true, text: 'N' }, ticks: { stepSize: 1 } },
      y: { type: 'linear', title: { display: true, text: yTitle } },
    },
  };
}

/** Plots of one class: stabilization exponent against N with its fitted line; corrections. */
@Component({
  selector: 'tl-large-n-plots',
  imports: [BaseChartDirective],
  providers: [provideCharts(withDefaultRegisterables())],
  template: `
    <section class="plot" [attr.aria-labelledby]="id() + '-stab'">
      <h4 [id]="id() + '-stab'">Where Z(N) stops agreeing with Z(∞)</h4>
      <div class="canvas" [attr.data-testid]="'largen-plot-stab-' + cls().parity">
        <canvas
          baseChart
          [type]="'line'"
          [data]="stabChart().data"
          [options]="stabChart().options"
          role="img"
          [attr.aria-label]="
            'Stabilization exponent against N' +
            (cls().stabilizationFit ? ', fitted line ' + cls().stabilizationFit : '')
          "
        ></canvas>
      </div>
    </section>
    <section class="plot" [attr.aria-labelledby]="id() + '-corr'">
      <h4 [id]="id() + '-corr'">Correction coefficients against N</h4>
      <div class="canvas" [attr.data-testid]="'largen-plot-corr-' + cls().parity">
        <canvas
          baseChart
          [type]="'line'"
          [data]="corrChart().data"
          [options]="corrChart().options"
          role="img"
          aria-label="Coefficient of the first three correction terms against N"
        ></canvas>
      </div>
    </section>
  `,
  styles: `
    :host {
      display: grid;
      gap: 16px;
      grid-template-columns: repeat(auto-fit, minmax(320px, 1fr));
    }
    .canvas {
      position: relative;
      height: 260px;
    }
    h4 {
      margin: 0 0 8px;
      font: var(--mat-sys-title-small);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LargeNPlots {
  readonly cls = input.required<LargeNClassJson>();
  readonly variable = input('q');

  protected readonly id = computed(() => `largen-${this.cls().parity}`);

  protected readonly stabChart = computed<ChartConfiguration<'line'>>(() => {
    const c = this.cls();
    const pts = stabilizationPoints(c);
    const datasets: ChartConfiguration<'line'>['data']['datasets'] = [
      {
        label: 'agrees below (exponent)',
        data: pts,
        borderColor: STYLE[0].color,
        backgroundColor: STYLE[0].color,
        pointStyle: STYLE[0].point,
        pointRadius: 4,
        showLine: false,
      },
    ];
    const fit = c.stabilizationFit;
    if (fit && c.rows.length) {
      const line = c.rows
        .map((N) => ({ x: N, y: linearAt(fit, N) }))
        .filter((p): p is { x: number; y: number } => p.y !== null);
      datasets.push({
        label: `fit: ${fit}`,
        data: line,
        borderColor: STYLE[1].color,
        backgroundColor: STYLE[1].color,
        pointRadius: 0,
        borderDash: [6, 3],
        borderWidth: 1.5,
      });
    }
    return {
      type: 'line',
      data: { datasets },
      options: againstN(`exponent of ${this.variable()}`),
    };
  });

  protected readonly corrChart = computed<ChartConfiguration<'line'>>(() => ({
    type: 'line',
    data: {
      datasets: [1, 2, 3].map((m, i) => ({
        label: `term ${m}`,
        data: correctionPoints(this.cls(), m),
        borderColor: STYLE[i]!.color,
        backgroundColor: STYLE[i]!.color,
        pointStyle: STYLE[i]!.point,
        pointRadius: 3,
        borderWidth: 1.5,
        borderDash: i % 2 ? [6, 3] : [],
      })),
    },
    options: againstN('coefficient'),
  }));
}

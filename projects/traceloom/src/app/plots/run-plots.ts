import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type { CanonicalRowJson } from '@traceloom/shared/engine';
import type { ChartConfiguration } from 'chart.js';
import { BaseChartDirective, provideCharts, withDefaultRegisterables } from 'ng2-charts';
import { isNumericTable } from '../shared/canonical-rows';
import { airyFitOf } from './airy-data';
import { AiryPlots } from './airy-plots';
import { coefficientPoints, valuationPoints } from './plot-data';

// Distinguishable by marker shape as well as colour.
const SERIES_STYLE = [
  { color: '#1e3a5f', point: 'circle' },
  { color: '#c27c0e', point: 'rect' },
  { color: '#2f6b4f', point: 'triangle' },
  { color: '#7b3f86', point: 'crossRot' },
] as const;

/**
 * The plots of a run: coefficient growth for chosen N and valuation against N (series runs), or
 * the large-N Airy fit with its residuals (numeric runs).
 */
@Component({
  selector: 'tl-run-plots',
  imports: [FormsModule, MatFormFieldModule, MatSelectModule, BaseChartDirective, AiryPlots],
  providers: [provideCharts(withDefaultRegisterables())],
  templateUrl: './run-plots.html',
  styleUrl: './run-plots.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RunPlots {
  readonly rows = input.required<readonly CanonicalRowJson[]>();
  readonly variable = input('q');
  /** The whole result, for its large-N Airy fit (numeric runs). */
  readonly result = input<unknown>(null);

  protected readonly numeric = computed(() => isNumericTable(this.rows()));
  protected readonly airy = computed(() => airyFitOf(this.result()));

  protected readonly choices = computed(() =>
    this.rows()
      .filter((r) => r.N > 0)
      .map((r) => r.N),
  );
  private readonly picked = signal<number[] | null>(null);
  /** The N shown in the coefficient plot (default: the largest two). */
  protected readonly chosen = computed(() => this.picked() ?? this.choices().slice(-2));

  protected readonly coefficientChart = computed<ChartConfiguration<'line'>>(() => ({
    type: 'line',
    data: {
      datasets: this.chosen()
        .slice(0, SERIES_STYLE.length)
        .map((n, i) => {
          const row = this.rows().find((r) => r.N === n);
          const style = SERIES_STYLE[i]!;
          return {
            label: `Z(${n})`,
            data: row ? coefficientPoints(row) : [],
            borderColor: style.color,
            backgroundColor: style.color,
            pointStyle: style.point,
            pointRadius: 3,
            borderWidth: 1.5,
            borderDash: i % 2 ? [6, 3] : [],
          };
        }),
    },
    options: {
      animation: false,
      parsing: false,
      maintainAspectRatio: false,
      scales: {
        x: { type: 'linear', title: { display: true, text: `exponent of ${this.variable()}` } },
        y: { type: 'linear', title: { display: true, text: 'log10 |coefficient|' } },
      },
    },
  }));

  protected readonly valuationChart = computed<ChartConfiguration<'line'>>(() => ({
    type: 'line',
    data: {
      datasets: [
        {
          label: 'valuation of Z(N)',
          data: valuationPoints(this.rows()),
          borderColor: SERIES_STYLE[0].color,
          backgroundColor: SERIES_STYLE[0].color,
          pointStyle: 'circle',
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
        y: {
          type: 'linear',
          title: { display: true, text: `lowest exponent of ${this.variable()}` },
        },
      },
    },
  }));

  protected pick(values: number[]): void {
    this.picked.set(values.slice(0, SERIES_STYLE.length));
  }
}

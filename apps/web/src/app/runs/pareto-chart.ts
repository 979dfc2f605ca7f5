import { DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ParetoDto } from '@keelson/contracts';
import {
  BarController,
  BarElement,
  CategoryScale,
  type ChartConfiguration,
  Legend,
  LineController,
  LineElement,
  LinearScale,
  PointElement,
  Tooltip,
} from 'chart.js';
import { BaseChartDirective, provideCharts } from 'ng2-charts';

/** Suppliers the chart shows, largest revenue impact first. */
export const PARETO_TOP = 30;

// Chart.js needs concrete colours (the theme's light-dark() tokens do not parse); these two
// read on both the light and the dark surface.
const BAR_COLOUR = 'rgba(38, 110, 125, 0.8)';
const LINE_COLOUR = '#c0620a';

type ParetoConfig = ChartConfiguration<'bar' | 'line', number[], string>;

/**
 * Revenue impact by supplier (the top {@link PARETO_TOP}) as bars, with the cumulative share of
 * all revenue impact as a line on a 0-100 % axis: how few suppliers carry most of the exposure.
 * Only the chart parts used here are registered, to keep the lazy bundle small.
 */
@Component({
  selector: 'kl-pareto-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective, DecimalPipe, PercentPipe],
  providers: [
    provideCharts({
      registerables: [
        BarController, BarElement, CategoryScale, Legend, LineController, LineElement,
        LinearScale, PointElement, Tooltip,
      ],
    }),
  ],
  template: `
    @if (top().length === 0) {
      <p class="kl-muted">No supplier of this run has any revenue impact.</p>
    } @else {
      <p class="kl-muted">
        The {{ top().length }} suppliers with the largest revenue impact carry
        {{ topShare() | percent: '1.0-1' }} of the run's total of
        {{ pareto().totalRevenueImpact | number: '1.0-0' }}.
      </p>
      <div class="pareto-chart__canvas">
        <canvas
          baseChart
          [type]="'bar'"
          [data]="config().data"
          [options]="config().options"
          role="img"
          [attr.aria-label]="description()"
        ></canvas>
      </div>
    }
  `,
  styles: `
    .pareto-chart__canvas {
      position: relative;
      height: 420px;
    }
  `,
})
export class ParetoChart {
  /** The run's suppliers by revenue impact with the running share. */
  readonly pareto = input.required<ParetoDto>();

  protected readonly top = computed(() => this.pareto().items.slice(0, PARETO_TOP));
  protected readonly topShare = computed(() => this.top().at(-1)?.cumulativeShare ?? 0);
  protected readonly description = computed(
    () =>
      `Revenue impact of the top ${this.top().length} suppliers, with the cumulative share ` +
      `reaching ${Math.round(this.topShare() * 100)} %.`,
  );
  protected readonly config = computed((): ParetoConfig => {
    const items = this.top();
    return {
      type: 'bar',
      data: {
        labels: items.map((item) => item.code),
        datasets: [
          {
            type: 'bar',
            label: 'Revenue impact',
            data: items.map((item) => item.revenueImpact),
            yAxisID: 'impact',
            backgroundColor: BAR_COLOUR,
            order: 2,
          },
          {
            type: 'line',
            label: 'Cumulative share (%)',
            data: items.map((item) => Math.round(item.cumulativeShare * 1000) / 10),
            yAxisID: 'share',
            borderColor: LINE_COLOUR,
            backgroundColor: LINE_COLOUR,
            pointRadius: 2,
            order: 1,
          },
        ],
      },
      options: {
        responsive: true,
        maintainAspectRatio: false,
        scales: {
          impact: { type: 'linear', position: 'left', beginAtZero: true,
            title: { display: true, text: 'Revenue impact' } },
          share: { type: 'linear', position: 'right', min: 0, max: 100,
            grid: { drawOnChartArea: false },
            title: { display: true, text: 'Cumulative share of revenue impact (%)' } },
        },
      },
    };
  });
}

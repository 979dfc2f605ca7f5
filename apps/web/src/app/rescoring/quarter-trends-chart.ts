import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { QuarterTrendDto } from '@keelson/contracts';
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

// Chart.js needs concrete colours (the theme's light-dark() tokens do not parse); these read on
// both the light and the dark surface and follow the rating bands' hues.
const SPOF_COLOUR = 'rgba(38, 110, 125, 0.8)';
const HIGH_COLOUR = 'rgba(214, 137, 16, 0.8)';
const CRITICAL_COLOUR = 'rgba(186, 26, 26, 0.8)';
const IMPACT_COLOUR = '#5b4a8a';

type TrendsConfig = ChartConfiguration<'bar' | 'line', number[], string>;

/** The chart of the quarters: counts as bars on the left axis, revenue impact as a line. */
export function quarterTrendsConfig(items: readonly QuarterTrendDto[]): TrendsConfig {
  return {
    type: 'bar',
    data: {
      labels: items.map((item) => item.quarterLabel),
      datasets: [
        { type: 'bar', label: 'Single points of failure', yAxisID: 'count', order: 2,
          data: items.map((item) => item.singlePointsOfFailure), backgroundColor: SPOF_COLOUR },
        { type: 'bar', label: 'High entries', yAxisID: 'count', order: 2,
          data: items.map((item) => item.highEntries), backgroundColor: HIGH_COLOUR },
        { type: 'bar', label: 'Critical entries', yAxisID: 'count', order: 2,
          data: items.map((item) => item.criticalEntries), backgroundColor: CRITICAL_COLOUR },
        { type: 'line', label: 'Total revenue impact', yAxisID: 'impact', order: 1,
          data: items.map((item) => item.totalRevenueImpact), borderColor: IMPACT_COLOUR,
          backgroundColor: IMPACT_COLOUR, pointRadius: 4 },
      ],
    },
    options: {
      responsive: true,
      maintainAspectRatio: false,
      animation: false,
      scales: {
        count: { type: 'linear', position: 'left', beginAtZero: true, ticks: { precision: 0 },
          title: { display: true, text: 'Count' } },
        impact: { type: 'linear', position: 'right', beginAtZero: true,
          grid: { drawOnChartArea: false }, title: { display: true, text: 'Revenue impact' } },
      },
      plugins: { legend: { position: 'bottom' } },
    },
  };
}

/**
 * Per quarter: single points of failure, high and critical register entries and the total
 * revenue impact, with a text description for screen readers. Only the chart parts used are
 * registered, to keep the lazy bundle small.
 */
@Component({
  selector: 'kl-quarter-trends-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective],
  providers: [
    provideCharts({
      registerables: [
        BarController, BarElement, CategoryScale, Legend, LineController, LineElement,
        LinearScale, PointElement, Tooltip,
      ],
    }),
  ],
  template: `
    @if (items().length === 0) {
      <p class="kl-muted">
        No quarter has finished a re-scoring yet; the trends appear after the first one.
      </p>
    } @else {
      @if (items().length === 1) {
        <p class="kl-muted">One quarter so far; the lines fill in as later quarters finish.</p>
      }
      <div class="trends-chart__canvas">
        <canvas baseChart [type]="'bar'" [data]="config().data" [options]="config().options"
                role="img" [attr.aria-label]="description()"></canvas>
      </div>
    }
  `,
  styles: `
    .trends-chart__canvas {
      position: relative;
      height: 300px;
      max-width: 960px;
    }
  `,
})
export class QuarterTrendsChart {
  /** The quarters, oldest first. */
  readonly items = input.required<readonly QuarterTrendDto[]>();

  /** The chart's data and options (read by the spec). */
  readonly config = computed(() => quarterTrendsConfig(this.items()));
  protected readonly description = computed(() => {
    const items = this.items();
    const last = items[items.length - 1];
    if (!last) return 'No quarter yet.';
    return `Trends over ${items.length} quarter${items.length === 1 ? '' : 's'}; in ` +
      `${last.quarterLabel}: ${last.singlePointsOfFailure} single points of failure, ` +
      `${last.highEntries} high and ${last.criticalEntries} critical entries, total revenue ` +
      `impact ${Math.round(last.totalRevenueImpact)}.`;
  });
}

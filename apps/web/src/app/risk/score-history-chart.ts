import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { RunSupplierDetailDto } from '@keelson/contracts';
import {
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

/** The history of a supplier's scores, oldest run first. */
export type ScoreHistory = RunSupplierDetailDto['history'];

type HistoryConfig = ChartConfiguration<'line', number[], string>;

// One colour per line (Chart.js would draw them all grey), as in the Pareto and trend charts.
const RATING_COLOUR = '#ba1a1a';
const LIKELIHOOD_COLOUR = '#d68910';
const IMPACT_BAND_COLOUR = '#266e7d';
const REVENUE_COLOUR = '#5b4a8a';

const coloured = (colour: string) => ({ borderColor: colour, backgroundColor: colour });

/** The line chart of a score history: rating, likelihood and impact band left, impact right. */
export function scoreHistoryConfig(history: ScoreHistory): HistoryConfig {
  return {
    type: 'line',
    data: {
      labels: history.map((point) => point.label),
      datasets: [
        { label: 'Rating (1-25)', data: history.map((p) => p.rating), yAxisID: 'score',
          ...coloured(RATING_COLOUR) },
        { label: 'Likelihood (1-5)', data: history.map((p) => p.likelihood), yAxisID: 'score',
          ...coloured(LIKELIHOOD_COLOUR) },
        { label: 'Impact band (1-5)', data: history.map((p) => p.impactBand), yAxisID: 'score',
          ...coloured(IMPACT_BAND_COLOUR) },
        {
          label: 'Revenue impact',
          ...coloured(REVENUE_COLOUR),
          data: history.map((p) => p.revenueImpact),
          yAxisID: 'impact',
          borderDash: [6, 4],
        },
      ],
    },
    options: {
      responsive: true,
      maintainAspectRatio: false,
      animation: false,
      scales: {
        score: { type: 'linear', position: 'left', min: 0, max: 25,
          title: { display: true, text: 'Score' } },
        impact: { type: 'linear', position: 'right', min: 0, grid: { drawOnChartArea: false },
          title: { display: true, text: 'Revenue impact' } },
      },
      plugins: { legend: { position: 'bottom' } },
    },
  };
}

/**
 * A supplier's register score and revenue impact across every succeeded run, as a line chart
 * with a text description; only the chart parts used are registered, to keep the chunk small.
 */
@Component({
  selector: 'kl-score-history-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective],
  providers: [
    provideCharts({
      registerables: [
        CategoryScale, Legend, LineController, LineElement, LinearScale, PointElement, Tooltip,
      ],
    }),
  ],
  template: `
    @if (history().length < 2) {
      <p class="kl-muted">
        Only {{ history().length === 1 ? 'this run has' : 'no run has' }} scored this supplier
        so far; the history fills in as later runs finish.
      </p>
    }
    @if (history().length > 0) {
      <div class="history-chart__canvas">
        <canvas baseChart [type]="'line'" [data]="config().data" [options]="config().options"
                role="img" [attr.aria-label]="description()"></canvas>
      </div>
    }
  `,
  styles: `
    .history-chart__canvas {
      position: relative;
      height: 260px;
      max-width: 900px;
    }
  `,
})
export class ScoreHistoryChart {
  /** The supplier's scores per run, oldest first. */
  readonly history = input.required<ScoreHistory>();

  /** The chart's data and options (read by the spec). */
  readonly config = computed(() => scoreHistoryConfig(this.history()));
  protected readonly description = computed(() => {
    const history = this.history();
    const last = history[history.length - 1];
    if (!last) return 'No scores yet.';
    return `Scores in ${history.length} run${history.length === 1 ? '' : 's'}; in the latest, ` +
      `${last.label}, rating ${last.rating} (likelihood ${last.likelihood} x impact band ` +
      `${last.impactBand}) and revenue impact ${Math.round(last.revenueImpact)}.`;
  });
}

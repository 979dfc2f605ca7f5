import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { HeatMapDto, RatingBand } from '@keelson/contracts';
import { type ScoringSettings, ratingBandOf } from '@keelson/scoring';
import { ratingBandClass, ratingBandLabel } from './run-labels';

/** A cell of the heat map: likelihood (1-5) and impact band (1-5). */
export interface HeatMapCell {
  readonly likelihood: number;
  readonly impactBand: number;
}

interface CellView extends HeatMapCell {
  readonly count: number;
  readonly rating: number;
  readonly band: RatingBand;
  readonly isSelected: boolean;
  readonly description: string;
}

const SCALE = [1, 2, 3, 4, 5] as const;

/**
 * The 5 x 5 matrix of a run: likelihood rows (5 at the top) by impact band columns, the number
 * of suppliers in each cell, coloured by the rating band of likelihood x impact band with the
 * floors in force. Cells are buttons; choosing one emits it so the ranking can narrow to it.
 */
@Component({
  selector: 'kl-heat-map',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './heat-map.html',
  styleUrls: ['./run-chips.scss', './heat-map.scss'],
})
export class HeatMap {
  /** Counts per cell from the API. */
  readonly heatMap = input.required<HeatMapDto>();
  /** The settings whose band floors colour the cells. */
  readonly settings = input.required<ScoringSettings>();
  /** The cell the ranking is narrowed to, if any. */
  readonly selected = input<HeatMapCell | null>(null);
  /** Emits the cell a person chooses. */
  readonly cellChosen = output<HeatMapCell>();

  protected readonly columns = SCALE;
  protected readonly bandLabel = ratingBandLabel;
  protected readonly bandClass = ratingBandClass;
  protected readonly rows = computed(() => {
    const { cells } = this.heatMap();
    const settings = this.settings();
    const selected = this.selected();
    return [...SCALE].reverse().map((likelihood) => ({
      likelihood,
      cells: SCALE.map((impactBand): CellView => {
        const count = cells[likelihood - 1]?.[impactBand - 1] ?? 0;
        const rating = likelihood * impactBand;
        const band = ratingBandOf(rating, settings);
        return {
          likelihood,
          impactBand,
          count,
          rating,
          band,
          isSelected:
            selected?.likelihood === likelihood && selected.impactBand === impactBand,
          description:
            `Likelihood ${likelihood}, impact band ${impactBand}: ${count} ` +
            `${count === 1 ? 'supplier' : 'suppliers'}, rating ${rating} ` +
            `(${ratingBandLabel(band).toLowerCase()}). Show them in the ranking.`,
        };
      }),
    }));
  });
  protected readonly legend = computed(() => {
    const { medium, high, critical } = this.settings().ratingBandFloors;
    return [
      { band: 'low' as const, range: `1-${medium - 1}` },
      { band: 'medium' as const, range: `${medium}-${high - 1}` },
      { band: 'high' as const, range: `${high}-${critical - 1}` },
      { band: 'critical' as const, range: `${critical}-25` },
    ];
  });

  protected choose(cell: HeatMapCell): void {
    this.cellChosen.emit({ likelihood: cell.likelihood, impactBand: cell.impactBand });
  }
}

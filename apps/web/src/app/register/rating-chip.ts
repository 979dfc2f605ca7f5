import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { RatingBand } from '@keelson/contracts';
import { BAND_LABELS, BAND_MARKERS } from './register-labels';

/**
 * A rating with its band: the number, a shape and the band's name on the band's colour, so it
 * reads on screen, in a black-and-white print and without telling colours apart.
 */
@Component({
  selector: 'kl-rating-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    class: 'kl-rating-chip',
    '[attr.data-band]': 'band()',
    '[attr.aria-label]': 'label()',
    role: 'img',
  },
  // &ngsp; keeps a real space between the parts, so copied or printed text reads "▲ 20 Critical".
  template: `<span aria-hidden="true">{{ marker() }}</span>&ngsp;@if (rating() !== null) {
      <span aria-hidden="true" class="kl-rating-chip__value">{{ rating() }}</span>&ngsp;
    }<span aria-hidden="true">{{ bandLabel() }}</span>`,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      padding: 1px 10px;
      border: 1px solid currentColor;
      border-radius: var(--mat-sys-corner-full);
      font: var(--mat-sys-label-medium);
      white-space: nowrap;
      print-color-adjust: exact;
      -webkit-print-color-adjust: exact;
    }
    .kl-rating-chip__value {
      font-weight: 700;
      font-variant-numeric: tabular-nums;
    }
    :host([data-band='low']) {
      background: var(--kl-rating-low-container);
      color: var(--kl-rating-on-low-container);
    }
    :host([data-band='medium']) {
      background: var(--kl-rating-medium-container);
      color: var(--kl-rating-on-medium-container);
    }
    :host([data-band='high']) {
      background: var(--kl-rating-high-container);
      color: var(--kl-rating-on-high-container);
    }
    :host([data-band='critical']) {
      background: var(--kl-rating-critical-container);
      color: var(--kl-rating-on-critical-container);
      border-width: 2px;
    }
  `,
})
export class RatingChip {
  /** The rating band. */
  readonly band = input.required<RatingBand>();
  /** The rating 1-25; null shows the band alone. */
  readonly rating = input<number | null>(null);

  protected readonly marker = computed(() => BAND_MARKERS[this.band()]);
  protected readonly bandLabel = computed(() => BAND_LABELS[this.band()]);
  protected readonly label = computed(() => {
    const rating = this.rating();
    const band = `${this.bandLabel()} band`;
    return rating === null ? band : `Rating ${rating}, ${band.toLowerCase()}`;
  });
}

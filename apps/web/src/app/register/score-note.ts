import { ChangeDetectionStrategy, Component } from '@angular/core';

/**
 * What a register score means, what it assumes and who decides, in plain words. Shown wherever
 * a rating is (the register, an entry, its print layout, the scoring settings).
 */
@Component({
  selector: 'kl-score-note',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'kl-score-note' },
  template: `
    <p>
      <strong>What the rating means.</strong> Rating = impact band (1-5, the revenue a
      supplier's failure would cost, as a share of a year's revenue of all products) x likelihood
      (1-5, from financial health, delivery score, continuity plan, qualified alternatives and
      the country's hazard; a risk manager may override it with a reason). The 1-25 result is
      grouped into low, medium, high and critical.
    </p>
    <p>
      The impact assumes no re-allocation of volume between sources, and takes stock cover and
      recovery weeks as they were imported. The 5 x 5 bands are common practice in risk
      registers, not a standard, and an administrator can change them.
    </p>
    <p>The score supports a decision; your company's own procedures make it.</p>
  `,
  styles: `
    :host {
      display: block;
      max-width: 90ch;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    p {
      margin: 0 0 4px;
    }
  `,
})
export class ScoreNote {}

import { ChangeDetectionStrategy, Component } from '@angular/core';

/**
 * What every score on the runs screens means and assumes, in plain words. Shown beside the
 * ranking, the heat map and scenario results so nobody reads a number as a verdict.
 */
@Component({
  selector: 'kl-score-assumptions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p>
      These figures support a decision; they do not make it. They assume that when a source
      fails, no other source takes over its share, that stock lasts as long as the cover in the
      workbook, and that a supplier needs the recovery weeks given there to deliver again.
    </p>
    <p>
      The 5 x 5 matrix of likelihood and impact band is common practice, not a standard: an
      administrator can change its limits under Scoring. Your company's own procedures decide
      what is done about a supplier.
    </p>
  `,
  styles: `
    :host {
      display: block;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-medium);
    }
    p {
      margin: 0 0 8px;
      max-width: 90ch;
    }
  `,
})
export class ScoreAssumptions {}

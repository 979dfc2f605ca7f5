import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { WhatIfResultDto } from '@keelson/contracts';
import { RatingChip } from '../register/rating-chip';

/**
 * A what-if's numbers side by side: the plan's supplier failing alone on the network version
 * as it is, and on a copy with the plan's proposed changes. Says which version and when, since
 * these are the numbers the plan is approved on, and that the scores are decision support.
 */
@Component({
  selector: 'kl-what-if-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, DecimalPipe, RatingChip],
  template: `
    @let result = whatIf();
    <table class="what-if__table" [attr.aria-label]="label()">
      <thead>
        <tr>
          <th scope="col">
            <span class="kl-muted">If {{ result.supplierCode }} fails alone</span>
          </th>
          <th scope="col">Before</th>
          <th scope="col">After the plan</th>
        </tr>
      </thead>
      <tbody>
        <tr>
          <th scope="row">Products lost</th>
          <td>
            {{ result.before.productsLost.length }}
            <span class="kl-muted what-if__list">
              @for (code of result.before.productsLost; track code; let last = $last) {
                <span class="what-if__code">{{ code }}</span>@if (!last) {, }
              }
            </span>
          </td>
          <td>
            {{ result.after.productsLost.length }}
            <span class="kl-muted what-if__list">
              @for (code of result.after.productsLost; track code; let last = $last) {
                <span class="what-if__code">{{ code }}</span>@if (!last) {, }
              }
            </span>
          </td>
        </tr>
        <tr>
          <th scope="row">Revenue impact</th>
          <td>{{ result.before.revenueImpact | number: '1.0-0' }}</td>
          <td>{{ result.after.revenueImpact | number: '1.0-0' }}</td>
        </tr>
        <tr>
          <th
            scope="row"
            title="How long the supplier takes to come back; lost weeks are this minus cover"
          >
            Supplier's time to recover
          </th>
          <td>{{ result.before.timeToRecover | number: '1.0-1' }} weeks</td>
          <td>{{ result.after.timeToRecover | number: '1.0-1' }} weeks</td>
        </tr>
        <tr>
          <th scope="row">Rating</th>
          <td>
            {{ result.before.impactBand }} x {{ result.before.likelihood }} =
            <kl-rating-chip [band]="result.before.ratingBand" [rating]="result.before.rating" />
          </td>
          <td>
            {{ result.after.impactBand }} x {{ result.after.likelihood }} =
            <kl-rating-chip [band]="result.after.ratingBand" [rating]="result.after.rating" />
          </td>
        </tr>
        <tr>
          <th scope="row">Single point of failure</th>
          <td>{{ result.before.singlePointOfFailure ? 'Yes' : 'No' }}</td>
          <td [class.what-if__spof--gone]="!result.after.singlePointOfFailure">
            {{ result.after.singlePointOfFailure ? 'Yes, still' : 'No longer' }}
          </td>
        </tr>
      </tbody>
    </table>
    <p class="what-if__note">
      These are the numbers the plan is approved on: computed on network version
      {{ result.networkVersionId }} on {{ result.evaluatedAt | date: 'medium' }}@if (
        result.evaluatedBy) { by {{ result.evaluatedBy.name }}}, through the same analysis as a
      run, with the plan's changes applied to a copy of that version. The scores support a
      decision; your company's own procedures make it.
    </p>
  `,
  styles: `
    :host {
      display: block;
    }
    .what-if__table {
      border-collapse: collapse;
      min-width: min(640px, 100%);
    }
    th,
    td {
      padding: 6px 12px;
      text-align: left;
      vertical-align: top;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
      font: var(--mat-sys-body-medium);
    }
    thead th {
      font: var(--mat-sys-label-large);
    }
    tbody th {
      font: var(--mat-sys-label-large);
      white-space: nowrap;
    }
    td {
      font-variant-numeric: tabular-nums;
    }
    .what-if__list {
      display: block;
      max-width: 36ch;
      font: var(--mat-sys-body-small);
    }
    .what-if__code {
      white-space: nowrap;
    }
    .what-if__spof--gone {
      font-weight: 700;
      color: var(--mat-sys-tertiary);
    }
    .what-if__note {
      max-width: 90ch;
      margin: 8px 0 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class WhatIfTable {
  /** The stored what-if of a plan. */
  readonly whatIf = input.required<WhatIfResultDto>();
  /** The table's accessible name. */
  readonly label = input('What-if: before and after the plan');
}

import { DecimalPipe } from '@angular/common';
import {
  type AfterViewInit, ChangeDetectionStrategy, Component, effect, input, viewChild,
} from '@angular/core';
import { MatSort, MatSortHeader } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { ComparisonRowDto } from '@keelson/contracts';
import { RatingChip } from '../register/rating-chip';

/** The value a column sorts by (absent values last when ascending). */
export function comparisonSortValue(row: ComparisonRowDto, column: string): string | number {
  switch (column) {
    case 'supplier': return row.name.toLowerCase();
    case 'tier': return row.tier ?? Number.MAX_SAFE_INTEGER;
    case 'before': return row.before?.rating ?? -1;
    case 'after': return row.after?.rating ?? -1;
    case 'ratingChange': return row.ratingChange;
    case 'impactBefore': return row.before?.revenueImpact ?? -1;
    case 'impactAfter': return row.after?.revenueImpact ?? -1;
    case 'impactChange': return row.revenueImpactChange;
    default: return '';
  }
}

/** "+3", "−2", "0": a change with its sign. */
export function signed(value: number, digits = 0): string {
  const rounded = Number(value.toFixed(digits));
  const text = Math.abs(rounded).toLocaleString('en-GB', { maximumFractionDigits: digits });
  return rounded > 0 ? `+${text}` : rounded < 0 ? `−${text}` : '0';
}

/**
 * One section of a comparison (new single points, risers, removed suppliers ...) as a sortable
 * table: the supplier linking to its risk page in the run that has it, rating before and after
 * as chips, revenue impact before and after and both changes; an empty state of its own.
 */
@Component({
  selector: 'kl-comparison-section',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, MatSort, MatSortHeader, MatTableModule, RatingChip, RouterLink],
  template: `
    <h2 class="section__title" [id]="sectionId()">
      {{ title() }} <span class="section__count">{{ rows().length }}</span>
    </h2>
    <p class="kl-muted section__note">{{ description() }}</p>
    <div class="section__wrapper">
      <table mat-table [dataSource]="data" matSort class="section__table"
             [attr.aria-labelledby]="sectionId()">
        <ng-container matColumnDef="supplier">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Supplier</th>
          <td mat-cell *matCellDef="let row">
            <a [routerLink]="['/risk', runOf(row), 'suppliers', row.code]">{{ row.name }}</a>&ngsp;
            <span class="kl-muted section__code">{{ row.code }}</span>
          </td>
        </ng-container>
        <ng-container matColumnDef="tier">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Tier</th>
          <td mat-cell *matCellDef="let row">{{ row.tier ?? '—' }}</td>
        </ng-container>
        <ng-container matColumnDef="before">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Rating before</th>
          <td mat-cell *matCellDef="let row">
            @if (row.before; as b) {
              <kl-rating-chip [band]="b.ratingBand" [rating]="b.rating" />
            } @else {
              <span class="kl-muted">not in the run</span>
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="after">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Rating after</th>
          <td mat-cell *matCellDef="let row">
            @if (row.after; as a) {
              <kl-rating-chip [band]="a.ratingBand" [rating]="a.rating" />
            } @else {
              <span class="kl-muted">not in the run</span>
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="ratingChange">
          <th mat-header-cell *matHeaderCellDef mat-sort-header arrowPosition="before">
            Rating change</th>
          <td mat-cell *matCellDef="let row" class="section__number">
            {{ signedText(row.ratingChange) }}</td>
        </ng-container>
        <ng-container matColumnDef="impactBefore">
          <th mat-header-cell *matHeaderCellDef mat-sort-header arrowPosition="before">
            Revenue impact before</th>
          <td mat-cell *matCellDef="let row" class="section__number">
            {{ row.before ? (row.before.revenueImpact | number: '1.0-0') : '—' }}</td>
        </ng-container>
        <ng-container matColumnDef="impactAfter">
          <th mat-header-cell *matHeaderCellDef mat-sort-header arrowPosition="before">
            Revenue impact after</th>
          <td mat-cell *matCellDef="let row" class="section__number">
            {{ row.after ? (row.after.revenueImpact | number: '1.0-0') : '—' }}</td>
        </ng-container>
        <ng-container matColumnDef="impactChange">
          <th mat-header-cell *matHeaderCellDef mat-sort-header arrowPosition="before">
            Revenue impact change</th>
          <td mat-cell *matCellDef="let row" class="section__number">
            {{ signedText(row.revenueImpactChange) }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
        <tr class="mat-mdc-row" *matNoDataRow>
          <td class="mat-mdc-cell section__empty" [attr.colspan]="columns.length">
            {{ emptyText() }}</td>
        </tr>
      </table>
    </div>
  `,
  styles: `
    :host {
      display: block;
      margin-top: 24px;
    }
    .section__title {
      font: var(--mat-sys-title-large);
      margin: 0 0 4px;
    }
    .section__count {
      display: inline-block;
      min-width: 1.5em;
      padding: 0 8px;
      border-radius: var(--mat-sys-corner-full);
      background: var(--mat-sys-surface-container-highest);
      font: var(--mat-sys-label-large);
      text-align: center;
    }
    .section__note {
      margin: 0 0 8px;
      max-width: 80ch;
    }
    .section__wrapper {
      overflow-x: auto;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-medium);
    }
    /* The same column widths in every section, so the tables line up down the page. */
    .section__table {
      width: 100%;
      min-width: 1000px;
      table-layout: fixed;
    }
    .mat-column-supplier {
      width: 26%;
    }
    .mat-column-tier {
      width: 6%;
    }
    .mat-column-before,
    .mat-column-after {
      width: 12%;
    }
    .section__code {
      margin-left: 6px;
      font: var(--mat-sys-body-small);
      white-space: nowrap;
    }
    .section__number {
      text-align: right;
      font-variant-numeric: tabular-nums;
    }
    .section__empty {
      padding: 16px;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class ComparisonSection implements AfterViewInit {
  private readonly sort = viewChild.required(MatSort);

  /** The section's heading. */
  readonly title = input.required<string>();
  /** What the rows are, in a sentence. */
  readonly description = input.required<string>();
  /** What the empty section says. */
  readonly emptyText = input.required<string>();
  /** The id of the heading (the table is labelled by it). */
  readonly sectionId = input.required<string>();
  /** The rows, in the server's order. */
  readonly rows = input.required<readonly ComparisonRowDto[]>();
  /** The earlier run (its risk pages have the suppliers that are gone since). */
  readonly fromRunId = input.required<number>();
  /** The later run. */
  readonly toRunId = input.required<number>();

  protected readonly columns = ['supplier', 'tier', 'before', 'after', 'ratingChange',
    'impactBefore', 'impactAfter', 'impactChange'] as const;
  protected readonly data = new MatTableDataSource<ComparisonRowDto>([]);
  protected readonly signedText = (value: number): string => signed(value);

  constructor() {
    this.data.sortingDataAccessor = comparisonSortValue;
    effect(() => {
      this.data.data = [...this.rows()];
    });
  }

  ngAfterViewInit(): void {
    this.data.sort = this.sort();
  }

  /** The run whose risk page has the supplier: the later one unless it is gone there. */
  protected runOf(row: ComparisonRowDto): number {
    return row.after ? this.toRunId() : this.fromRunId();
  }
}

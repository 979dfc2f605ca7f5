import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatTableModule } from '@angular/material/table';
import type { ScenarioResultDto } from '@keelson/contracts';
import { ScoreAssumptions } from './score-assumptions';

/**
 * What a failure set would cost on a network version: products lost, revenue exposed per week,
 * revenue impact and time to recover, a table of the lost products, and one failure path per
 * product from a failed supplier down to the product.
 */
@Component({
  selector: 'kl-scenario-result',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, MatTableModule, ScoreAssumptions],
  template: `
    @let current = result();
    <dl class="scenario-result__figures" aria-label="Scenario result">
      <div><dt>Products lost</dt><dd>{{ current.productsLost.length | number }}</dd></div>
      <div>
        <dt>Revenue exposed per week</dt>
        <dd>{{ current.revenueExposedPerWeek | number: '1.0-0' }}</dd>
      </div>
      <div><dt>Revenue impact</dt><dd>{{ current.revenueImpact | number: '1.0-0' }}</dd></div>
      <div>
        <dt>Time to recover</dt>
        <dd>{{ current.timeToRecover | number: '1.0-1' }} weeks</dd>
      </div>
    </dl>
    @if (current.products.length === 0) {
      <p>No product is lost: every part still has a source that keeps working.</p>
    } @else {
      <table mat-table [dataSource]="current.products" aria-label="Lost products">
        <ng-container matColumnDef="code">
          <th mat-header-cell *matHeaderCellDef>Product</th>
          <td mat-cell *matCellDef="let product">{{ product.code }}</td>
        </ng-container>
        <ng-container matColumnDef="plantCode">
          <th mat-header-cell *matHeaderCellDef>Plant</th>
          <td mat-cell *matCellDef="let product">{{ product.plantCode }}</td>
        </ng-container>
        <ng-container matColumnDef="weeklyRevenue">
          <th mat-header-cell *matHeaderCellDef>Revenue / week</th>
          <td mat-cell *matCellDef="let product">{{ product.weeklyRevenue | number: '1.0-0' }}</td>
        </ng-container>
        <ng-container matColumnDef="timeToSurvive">
          <th mat-header-cell *matHeaderCellDef>Time to survive (weeks)</th>
          <td mat-cell *matCellDef="let product">{{ product.timeToSurvive | number: '1.0-1' }}</td>
        </ng-container>
        <ng-container matColumnDef="lostWeeks">
          <th mat-header-cell *matHeaderCellDef>Lost weeks</th>
          <td mat-cell *matCellDef="let product">{{ product.lostWeeks | number: '1.0-1' }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let product; columns: columns"></tr>
      </table>
      <h3>How each product is reached</h3>
      <ul class="scenario-result__paths" aria-label="Failure paths">
        @for (path of paths(); track $index) {
          <li>{{ path.text }}</li>
        }
      </ul>
    }
    <p class="kl-muted">
      Time to survive is the shortest stock cover among the parts the product loses; lost weeks
      are the weeks between that cover running out and the failed suppliers recovering.
    </p>
    <kl-score-assumptions />
  `,
  styles: `
    .scenario-result__figures {
      display: flex;
      flex-wrap: wrap;
      gap: 24px;
      margin: 0 0 16px;
      dt { font: var(--mat-sys-label-large); color: var(--mat-sys-on-surface-variant); }
      dd { margin: 0; font: var(--mat-sys-headline-small); font-variant-numeric: tabular-nums; }
    }
    table { width: 100%; margin-bottom: 16px; }
    .scenario-result__paths { padding-left: 20px; font: var(--mat-sys-body-medium); }
  `,
})
export class ScenarioResult {
  /** The evaluated scenario. */
  readonly result = input.required<ScenarioResultDto>();

  protected readonly columns = [
    'code', 'plantCode', 'weeklyRevenue', 'timeToSurvive', 'lostWeeks',
  ] as const;
  /** Each failure path as "S-1 → I-7 → P-100", supplier first. */
  protected readonly paths = computed(() =>
    this.result().failurePaths.map((path) => ({
      product: path.product,
      text: path.nodes.map((node) => node.code).join(' → '),
    })),
  );
}

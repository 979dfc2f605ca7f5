import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatAnchor } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { SourcingLinkDto, SupplierDetailDto } from '@keelson/contracts';
import { combineLatest, catchError, map, of, startWith, switchMap } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { plantOptions } from './filter-options';
import { NetworkBrowseApi } from './network-browse-api';
import { TIER_MEANING, sourcesFlag, tierExplanation } from './sourcing-labels';

type Loaded = { supplier: SupplierDetailDto } | { error: string } | { isLoading: true };

/**
 * One supplier of a network version: who it is, its tier (explained), time to recover and
 * the other figures the workbook gave, the plants it serves, what it sells to whom and what it
 * buys from whom (each end linking on), its extra attributes, and the import it came from.
 */
@Component({
  selector: 'kl-supplier-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, DecimalPipe, MatAnchor, MatIcon, MatProgressBar, MatTableModule, RouterLink],
  templateUrl: './supplier-page.html',
  styleUrls: ['./supplier-page.scss', './network-table.scss'],
})
export class SupplierPage {
  private readonly browseApi = inject(NetworkBrowseApi);

  /** The `:versionId` route parameter. */
  readonly versionId = input.required<string>();
  /** The `:code` route parameter: the supplier's code. */
  readonly code = input.required<string>();

  protected readonly tierMeaning = TIER_MEANING;
  protected readonly sellsColumns = [
    'item',
    'buyer',
    'buyerKind',
    'share',
    'qualified',
    'sources',
  ] as const;
  protected readonly buysColumns = ['item', 'supplier', 'share', 'qualified', 'sources'] as const;
  protected readonly id = computed(() => Number(this.versionId()));
  private readonly plants = plantOptions();
  private readonly loaded = toSignal(
    combineLatest([toObservable(this.id), toObservable(this.code)]).pipe(
      switchMap(([id, code]) =>
        this.browseApi.supplier(id, code).pipe(
          map((supplier): Loaded => ({ supplier })),
          catchError((error: unknown) => of<Loaded>({ error: apiErrorMessage(error) })),
          startWith<Loaded>({ isLoading: true }),
        ),
      ),
    ),
    { initialValue: { isLoading: true } as Loaded },
  );
  protected readonly supplier = computed(() => {
    const loaded = this.loaded();
    return 'supplier' in loaded ? loaded.supplier : null;
  });
  protected readonly error = computed(() => {
    const loaded = this.loaded();
    return 'error' in loaded ? loaded.error : null;
  });
  protected readonly isLoading = computed(() => 'isLoading' in this.loaded());
  protected readonly tierText = computed(() => tierExplanation(this.supplier()?.tier ?? null));
  protected readonly plantsServed = computed(() => {
    const names = new Map(this.plants().map((plant) => [plant.code, plant.name]));
    return (this.supplier()?.plants ?? []).map((code) => ({ code, name: names.get(code) }));
  });
  protected readonly attributes = computed(() =>
    Object.entries(this.supplier()?.attributes ?? {}).map(([name, value]) => ({ name, value })),
  );

  protected flag(link: SourcingLinkDto): string | null {
    return sourcesFlag(link.qualifiedSources);
  }

  protected supplierLink(code: string): unknown[] {
    return ['/network', this.id(), 'suppliers', code];
  }
}

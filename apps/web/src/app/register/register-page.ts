import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toObservable } from '@angular/core/rxjs-interop';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSort, MatSortHeader } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltip } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import type { RegisterEntryDto, RegisterFlag } from '@keelson/contracts';
import { Session } from '../auth/session';
import { plantOptions } from '../network/filter-options';
import { pagedRows } from '../network/paged-rows';
import { TableSearch } from '../network/table-search';
import { FilterSelect, codeNameOptions, valueOptions } from '../shared/filter-select';
import { NewEntryDialog } from './new-entry-dialog';
import { RatingChip } from './rating-chip';
import { RegisterApi } from './register-api';
import { ScoreNote } from './score-note';
import { StatusChip } from './status-chip';
import {
  BANDS,
  BAND_LABELS,
  FLAG_EXPLANATIONS,
  FLAG_FILTER_LABELS,
  FLAG_LABELS,
  REGISTER_WRITERS,
  STATUSES,
  STATUS_LABELS,
} from './register-labels';
import {
  REGISTER_PAGE_SIZES,
  registerFilterQuery,
  registerStateParams,
  registerTableState,
} from './register-table-state';

/**
 * The risk register: every entry with its owner, status and score, sorted, filtered and paged
 * on the server with the state in the URL; export to a workbook, a print layout for a review
 * meeting, and "New entry" for risk managers and admins.
 */
@Component({
  selector: 'kl-register-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FilterSelect,
    DatePipe,
    MatAnchor,
    MatButton,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatPaginator,
    MatPrefix,
    MatProgressBar,
    MatSort,
    MatSortHeader,
    MatTableModule,
    MatTooltip,
    RatingChip,
    RouterLink,
    ScoreNote,
    StatusChip,
    TableSearch,
  ],
  templateUrl: './register-page.html',
  styleUrl: './register-page.scss',
})
export class RegisterPage {
  private readonly registerApi = inject(RegisterApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  protected readonly table = registerTableState();
  protected readonly columns = [
    'id',
    'title',
    'supplierCode',
    'plants',
    'owner',
    'status',
    'likelihood',
    'impactBand',
    'rating',
    'updatedAt',
  ] as const;
  protected readonly pageSizes = REGISTER_PAGE_SIZES;
  protected readonly statusChoices = valueOptions(STATUSES, (status) => STATUS_LABELS[status]);
  protected readonly bandChoices = valueOptions(BANDS, (band) => BAND_LABELS[band]);
  protected readonly flagOptions = Object.entries(FLAG_FILTER_LABELS)
    .map(([value, label]) => ({ value, label }));
  protected readonly plants = plantOptions();
  protected readonly plantChoices = computed(() => codeNameOptions(this.plants()));
  protected readonly canWrite = computed(() => this.session.hasRole(...REGISTER_WRITERS));
  protected readonly hasFilter = computed(
    () => Object.keys(this.table.state().filters).length > 0,
  );
  protected readonly exportUrl = computed(() =>
    this.registerApi.exportUrl(registerFilterQuery(this.table.state())),
  );
  /** The print layout gets the same filters and sort, but shows every row. */
  protected readonly printParams = computed(() => {
    const { limit: _limit, offset: _offset, ...params } = registerStateParams(
      this.table.state(),
    );
    return params;
  });

  private readonly query = computed(() => {
    const state = this.table.state();
    return { ...registerFilterQuery(state), limit: state.limit, offset: state.offset };
  });
  protected readonly page = pagedRows(toObservable(this.query), (query) =>
    this.registerApi.list(query),
  );

  // Table cells are untyped in templates; these keep the flag's lookups checked.
  protected flagLabel(flag: RegisterFlag): string {
    return FLAG_LABELS[flag];
  }

  protected flagExplanation(flag: RegisterFlag): string {
    return FLAG_EXPLANATIONS[flag];
  }

  protected clearFilters(): void {
    this.table.setFilters({ q: undefined, status: undefined, ratingBand: undefined,
      plant: undefined });
  }

  protected newEntry(): void {
    this.dialog
      .open<NewEntryDialog, undefined, RegisterEntryDto>(NewEntryDialog, {
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((entry) => {
        if (entry) {
          void this.router.navigate(['/register', entry.id]);
        }
      });
  }
}

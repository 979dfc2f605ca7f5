import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatAnchor } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import type { AnalysisRunDto, RunComparisonDto } from '@keelson/contracts';
import { catchError, map, of, startWith, switchMap } from 'rxjs';
import { RunsApi } from '../runs/runs-api';
import { apiErrorMessage } from '../shared/api-error-message';
import { ComparisonApi } from './comparison-api';
import { ComparisonSection } from './comparison-section';

/** Runs the pickers offer, newest first. */
export const COMPARE_RUN_LIMIT = 100;

type Loaded = { comparison: RunComparisonDto } | { error: string } | { isLoading: true };

/** One section of the page: which rows of the comparison, and what they mean. */
interface SectionSpec {
  key: keyof Pick<RunComparisonDto, 'newSinglePoints' | 'goneSinglePoints' | 'risers' |
    'fallers' | 'suppliersAdded' | 'suppliersRemoved'>;
  title: string;
  description: string;
  emptyText: string;
}

/** The sections in reading order. */
export const COMPARISON_SECTIONS: readonly SectionSpec[] = [
  { key: 'newSinglePoints', title: 'New single points of failure',
    description: 'Suppliers that alone can now stop a product, and could not before.',
    emptyText: 'No new single point of failure.' },
  { key: 'goneSinglePoints', title: 'Single points of failure that went away',
    description: 'Suppliers that alone could stop a product before and no longer can ' +
      '(a second source, or the supplier is gone).',
    emptyText: 'None went away.' },
  { key: 'risers', title: 'Biggest risers',
    description: 'The largest rises in rating, then in revenue impact.',
    emptyText: 'No supplier rose in rating or revenue impact.' },
  { key: 'fallers', title: 'Biggest fallers',
    description: 'The largest falls in rating, then in revenue impact.',
    emptyText: 'No supplier fell in rating or revenue impact.' },
  { key: 'suppliersAdded', title: 'Suppliers added',
    description: 'In the later run only: new in the network version it analysed.',
    emptyText: 'No supplier was added.' },
  { key: 'suppliersRemoved', title: 'Suppliers removed',
    description: 'In the earlier run only; a register entry of theirs is flagged: supplier no ' +
      'longer in the network.',
    emptyText: 'No supplier was removed.' },
];

/**
 * What changed between two analysis runs (by default this quarter's re-scoring against the
 * last): two run pickers kept in the URL, a sortable table per kind of change with its count,
 * each supplier linking to its risk page, and the comparison as a workbook.
 */
@Component({
  selector: 'kl-compare-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ComparisonSection, DatePipe, MatAnchor, MatFormField, MatIcon, MatLabel, MatOption,
    MatProgressBar, MatSelect, RouterLink,
  ],
  host: { class: 'kl-page' },
  templateUrl: './compare-page.html',
  styleUrl: './compare-page.scss',
})
export class ComparePage {
  private readonly api = inject(ComparisonApi);
  private readonly router = inject(Router);

  /** The `from` query parameter: the earlier run's id. */
  readonly from = input<string | undefined>(undefined);
  /** The `to` query parameter: the later run's id. */
  readonly to = input<string | undefined>(undefined);

  protected readonly sections = COMPARISON_SECTIONS;
  protected readonly runs = signal<AnalysisRunDto[]>([]);
  private readonly loaded = toSignal(
    // One signal for both, so a URL that changes both asks once.
    toObservable(computed(() => ({ from: idOf(this.from()), to: idOf(this.to()) }),
      { equal: (a, b) => a.from === b.from && a.to === b.to })).pipe(
      switchMap((runs) =>
        this.api.compare(runs).pipe(
          map((comparison): Loaded => ({ comparison })),
          catchError((error: unknown) => of<Loaded>({ error: apiErrorMessage(error) })),
          startWith<Loaded>({ isLoading: true }),
        ),
      ),
    ),
    { initialValue: { isLoading: true } as Loaded },
  );
  protected readonly comparison = computed(() => {
    const loaded = this.loaded();
    return 'comparison' in loaded ? loaded.comparison : null;
  });
  protected readonly error = computed(() => {
    const loaded = this.loaded();
    return 'error' in loaded ? loaded.error : null;
  });
  protected readonly isLoading = computed(() => 'isLoading' in this.loaded());
  /** The pickers' values: the URL's, else the runs the server chose. */
  protected readonly fromId = computed(() => idOf(this.from()) ?? this.comparison()?.fromRun.id
    ?? null);
  protected readonly toId = computed(() => idOf(this.to()) ?? this.comparison()?.toRun.id ?? null);
  protected readonly exportUrl = computed(() => {
    const comparison = this.comparison();
    return comparison
      ? this.api.exportUrl({ from: comparison.fromRun.id, to: comparison.toRun.id }) : null;
  });

  constructor() {
    inject(RunsApi).list(COMPARE_RUN_LIMIT).subscribe({
      next: (page) => this.runs.set(page.items.filter((run) => run.status === 'succeeded')),
      // The comparison still shows; the pickers then offer only the runs compared.
      error: () => this.runs.set([]),
    });
  }

  /** The pickers' options: the succeeded runs, plus the compared ones if not among them. */
  protected readonly options = computed(() => {
    const runs = this.runs();
    const comparison = this.comparison();
    const extra = comparison ? [comparison.toRun, comparison.fromRun] : [];
    const listed = new Set(runs.map((run) => run.id));
    return [
      ...runs.map((run) => ({ id: run.id, text: runText(run) })),
      ...extra.filter((run) => !listed.has(run.id)).map((run) => ({
        id: run.id,
        text: `${run.quarterLabel ? `${run.quarterLabel} · ` : ''}${run.label} (run ${run.id})`,
      })),
    ];
  });

  protected pick(which: 'from' | 'to', id: number): void {
    const from = which === 'from' ? id : this.fromId();
    const to = which === 'to' ? id : this.toId();
    void this.router.navigate([], { queryParams: { from, to }, replaceUrl: true });
  }

  protected rowsOf(comparison: RunComparisonDto, spec: SectionSpec): RunComparisonDto[
    SectionSpec['key']] {
    return comparison[spec.key];
  }
}

function idOf(value: string | undefined): number | null {
  const id = Number(value);
  return Number.isInteger(id) && id > 0 ? id : null;
}

function runText(run: AnalysisRunDto): string {
  const date = run.finishedAt ? new Date(run.finishedAt).toLocaleDateString('en-GB',
    { day: 'numeric', month: 'short', year: 'numeric' }) : '';
  const kind = run.kind === 'quarterly' && !/quarter/i.test(run.label) ? ' · quarterly' : '';
  return `${run.label}${kind} (run ${run.id}${date ? `, ${date}` : ''})`;
}

import { DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed, toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatAnchor, MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { BomNodeDto } from '@keelson/contracts';
import { combineLatest, catchError, map, of, startWith, switchMap } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { type BomChild, type BomNodeState, type BomRow, bomRows } from './bom-tree';
import { NetworkBrowseApi } from './network-browse-api';
import { routeVersionId } from './route-version-id';
import { sourcesFlag } from './sourcing-labels';

type Loaded = { node: BomNodeDto } | { error: string } | { isLoading: true };

/**
 * The bill of materials of a product (or made item) at a plant, opened level by level: each
 * level is fetched when it is first expanded. Lines show quantity per parent, made or bought,
 * qualified sources (a single source flagged) and weeks of cover; a bought line opens onto its
 * suppliers, each linking to the supplier's page.
 */
@Component({
  selector: 'kl-bom-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, MatAnchor, MatIcon, MatIconButton, MatProgressBar, RouterLink],
  templateUrl: './bom-page.html',
  styleUrls: ['./bom-page.scss', './network-table.scss'],
})
export class BomPage {
  private readonly browseApi = inject(NetworkBrowseApi);
  private readonly destroyRef = inject(DestroyRef);
  // Answers for a tree that has since been replaced (another product or version) are dropped.
  private generation = 0;

  /** The `:code` route parameter: the product or made item. */
  readonly code = input.required<string>();
  /** The `plant` query parameter; the API takes a product's own plant when it is left out. */
  readonly plant = input<string | undefined>(undefined);

  protected readonly versionId = routeVersionId();
  private readonly expanded = signal<ReadonlySet<string>>(new Set());
  private readonly nodes = signal<ReadonlyMap<string, BomNodeState>>(new Map());
  private readonly loaded = toSignal(
    combineLatest([
      toObservable(this.versionId),
      toObservable(this.code),
      toObservable(this.plant),
    ]).pipe(
      switchMap(([versionId, code, plant]) => {
        this.generation += 1;
        this.expanded.set(new Set());
        this.nodes.set(new Map());
        return this.browseApi.bom(versionId, code, plant ?? '').pipe(
          map((node): Loaded => ({ node })),
          catchError((error: unknown) => of<Loaded>({ error: apiErrorMessage(error) })),
          startWith<Loaded>({ isLoading: true }),
        );
      }),
    ),
    { initialValue: { isLoading: true } as Loaded },
  );
  protected readonly root = computed(() => {
    const loaded = this.loaded();
    return 'node' in loaded ? loaded.node : null;
  });
  protected readonly error = computed(() => {
    const loaded = this.loaded();
    return 'error' in loaded ? loaded.error : null;
  });
  protected readonly isLoading = computed(() => 'isLoading' in this.loaded());
  protected readonly rows = computed(() => {
    const root = this.root();
    return root ? bomRows(root, this.expanded(), this.nodes()) : [];
  });

  /** Opens or closes a line; the first opening fetches the level below it. */
  protected toggle(row: Extract<BomRow, { type: 'child' }>): void {
    const next = new Set(this.expanded());
    if (row.isExpanded) {
      next.delete(row.key);
      this.expanded.set(next);
      return;
    }
    next.add(row.key);
    this.expanded.set(next);
    const known = this.nodes().get(row.key);
    if (!known || known.status === 'error') {
      this.fetch(row.key, row.child);
    }
  }

  protected toggleIcon(row: Extract<BomRow, { type: 'child' }>): string {
    return row.isExpanded ? 'expand_more' : 'chevron_right';
  }

  protected flag(child: BomChild): string | null {
    return child.kind === 'bought' ? sourcesFlag(child.qualifiedSources) : null;
  }

  protected supplierLink(code: string): unknown[] {
    return ['/network', this.versionId(), 'suppliers', code];
  }

  protected indent(depth: number): string {
    return `${(depth - 1) * 24}px`;
  }

  private fetch(key: string, child: BomChild): void {
    const plant = this.root()?.plantCode ?? this.plant() ?? '';
    const generation = this.generation;
    const settle = (state: BomNodeState): void => {
      if (generation === this.generation) {
        this.nodes.update((nodes) => new Map(nodes).set(key, state));
      }
    };
    settle({ status: 'loading' });
    this.browseApi
      .bom(this.versionId(), child.code, plant)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (node) => settle({ status: 'loaded', node }),
        error: (error: unknown) => settle({ status: 'error', message: apiErrorMessage(error) }),
      });
  }
}

import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatAnchor } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import { MatTabLink, MatTabNav, MatTabNavPanel } from '@angular/material/tabs';
import {
  ActivatedRoute,
  Router,
  RouterLink,
  RouterLinkActive,
  RouterOutlet,
} from '@angular/router';
import type { NetworkVersionDto } from '@keelson/contracts';
import { catchError, map, of, startWith, switchMap } from 'rxjs';
import { Session } from '../auth/session';
import { apiErrorMessage } from '../shared/api-error-message';
import { NetworkVersionsApi } from './network-versions-api';
import { changeLines, versionLabel } from './version-label';

/** Versions the picker offers (newest first); an older one opened by link is added to them. */
export const PICKER_VERSIONS = 100;

/** The tabs of a version, as child route paths. */
export const VERSION_TABS = [
  { path: 'suppliers', label: 'Suppliers' },
  { path: 'products', label: 'Products' },
  { path: 'items', label: 'Items' },
] as const;

type Loaded = { version: NetworkVersionDto } | { error: string } | { isLoading: true };

/**
 * One network version: a picker to switch versions, its row counts, what changed against the
 * previous version, the export link, and the Suppliers / Products / Items tabs (child routes).
 */
@Component({
  selector: 'kl-network-version-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    DecimalPipe,
    MatAnchor,
    MatFormField,
    MatIcon,
    MatLabel,
    MatOption,
    MatProgressBar,
    MatSelect,
    MatTabLink,
    MatTabNav,
    MatTabNavPanel,
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
  ],
  templateUrl: './network-version-page.html',
  styleUrl: './network-version-page.scss',
})
export class NetworkVersionPage {
  private readonly versionsApi = inject(NetworkVersionsApi);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly session = inject(Session);

  /** The `:versionId` route parameter. */
  readonly versionId = input.required<string>();

  protected readonly tabs = VERSION_TABS;
  protected readonly id = computed(() => Number(this.versionId()));
  private readonly loaded = toSignal(
    toObservable(this.id).pipe(
      switchMap((id) =>
        this.versionsApi.get(id).pipe(
          map((version): Loaded => ({ version })),
          catchError((error: unknown) => of<Loaded>({ error: apiErrorMessage(error) })),
          startWith<Loaded>({ isLoading: true }),
        ),
      ),
    ),
    { initialValue: { isLoading: true } as Loaded },
  );
  protected readonly version = computed(() => {
    const loaded = this.loaded();
    return 'version' in loaded ? loaded.version : null;
  });
  protected readonly error = computed(() => {
    const loaded = this.loaded();
    return 'error' in loaded ? loaded.error : null;
  });
  protected readonly isLoading = computed(() => 'isLoading' in this.loaded());
  private readonly recent = toSignal(
    this.versionsApi.list(PICKER_VERSIONS).pipe(
      map((page) => page.items),
      catchError(() => of([] as NetworkVersionDto[])),
    ),
    { initialValue: [] as NetworkVersionDto[] },
  );
  protected readonly choices = computed(() => {
    const current = this.version();
    const recent = this.recent();
    const choices = current && !recent.some((version) => version.id === current.id)
      ? [...recent, current]
      : recent;
    return choices.map((version) => ({ id: version.id, label: versionLabel(version) }));
  });
  protected readonly changes = computed(() => {
    const version = this.version();
    return version ? changeLines(version.changes) : [];
  });
  protected readonly counts = computed(() => {
    const counts = this.version()?.counts;
    if (!counts) {
      return [];
    }
    return [
      { label: 'Plants', value: counts.plants },
      { label: 'Products', value: counts.products },
      { label: 'Items', value: counts.items },
      { label: 'BOM lines', value: counts.bomLines },
      { label: 'Suppliers', value: counts.suppliers },
      { label: 'Sourcing rows', value: counts.sourcing },
      { label: 'Stock rows', value: counts.stock },
    ];
  });
  protected readonly exportUrl = computed(() => this.versionsApi.exportUrl(this.id()));
  // The export holds every plant's rows, so the API refuses it to plant managers.
  protected readonly canExport = computed(
    () => this.session.role() !== null && this.session.role() !== 'plant_manager',
  );

  /** Opens another version on the same tab (a product's BOM falls back to the products tab). */
  protected pick(id: number): void {
    const tab = this.route.firstChild?.snapshot.url[0]?.path ?? VERSION_TABS[0].path;
    void this.router.navigate(['/network', id, tab]);
  }
}

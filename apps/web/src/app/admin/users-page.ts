import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortHeader, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import {
  type PlantDto,
  ROLES,
  ROLE_LABELS,
  type Role,
  USER_SORT_FIELDS,
  type UserDto,
} from '@keelson/contracts';
import {
  Subject,
  catchError,
  debounceTime,
  distinctUntilChanged,
  map,
  merge,
  of,
  switchMap,
} from 'rxjs';
import { Session } from '../auth/session';
import { apiErrorMessage } from '../shared/api-error-message';
import { ConfirmDialog, type ConfirmDialogData } from '../shared/confirm-dialog';
import { PlantsApi } from './plants-api';
import { UserDialog, type UserDialogData } from './user-dialog';
import { USER_STATUS_LABELS, type UserStatus, userStatus } from './user-status';
import { type UserQuery, UsersApi } from './users-api';

/** Rows per page offered by the paginator; the first is the default. */
export const USER_PAGE_SIZES = [25, 50, 100] as const;
/** How long typing pauses before the filter asks the server. */
export const FILTER_DEBOUNCE_MS = 250;

type ListResult = { page: { items: UserDto[]; total: number } } | { error: string };

/**
 * User administration: a sortable, filterable, paged table of accounts with invite, edit,
 * deactivate / reactivate and re-send invitation. Sorting, filtering and paging run on the
 * server, so the page stays fast with many accounts.
 */
@Component({
  selector: 'kl-users-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatButton,
    MatFormField,
    MatIcon,
    MatIconButton,
    MatInput,
    MatLabel,
    MatMenu,
    MatMenuItem,
    MatMenuTrigger,
    MatOption,
    MatPaginator,
    MatPrefix,
    MatProgressBar,
    MatSelect,
    MatSort,
    MatSortHeader,
    MatTableModule,
  ],
  templateUrl: './users-page.html',
  styleUrl: './users-page.scss',
})
export class UsersPage {
  private readonly usersApi = inject(UsersApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(Session);
  private readonly filterInput = new Subject<string>();
  private readonly reloads = new Subject<void>();

  protected readonly columns = [
    'name',
    'email',
    'role',
    'plants',
    'status',
    'lastLoginAt',
    'actions',
  ] as const;
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly statusLabels = USER_STATUS_LABELS;
  protected readonly pageSizes = USER_PAGE_SIZES;
  protected readonly query = signal<UserQuery>({ limit: USER_PAGE_SIZES[0], offset: 0 });
  protected readonly users = signal<UserDto[]>([]);
  protected readonly total = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly pageIndex = computed(() => {
    const { limit = USER_PAGE_SIZES[0], offset = 0 } = this.query();
    return Math.floor(offset / limit);
  });
  protected readonly hasFilter = computed(() => Boolean(this.query().q || this.query().role));
  protected readonly plants = toSignal(
    inject(PlantsApi)
      .list()
      .pipe(catchError(() => of([] as PlantDto[]))),
    { initialValue: [] as PlantDto[] },
  );
  private readonly plantNames = computed(
    () => new Map(this.plants().map((plant) => [plant.code, plant.name])),
  );

  constructor() {
    this.filterInput
      .pipe(
        map((text) => text.trim()),
        debounceTime(FILTER_DEBOUNCE_MS),
        distinctUntilChanged(),
        takeUntilDestroyed(),
      )
      .subscribe((q) => this.query.update((query) => ({ ...query, q, offset: 0 })));

    merge(toObservable(this.query), this.reloads.pipe(map(() => this.query())))
      .pipe(
        switchMap((query) => {
          this.isLoading.set(true);
          return this.usersApi.list(query).pipe(
            map((page): ListResult => ({ page })),
            catchError((error: unknown) => of<ListResult>({ error: apiErrorMessage(error) })),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((result) => {
        this.isLoading.set(false);
        if ('error' in result) {
          this.errorMessage.set(result.error);
          return;
        }
        this.errorMessage.set(null);
        this.users.set(result.page.items);
        this.total.set(result.page.total);
      });
  }

  protected roleLabel(user: UserDto): string {
    return ROLE_LABELS[user.role];
  }

  protected status(user: UserDto): UserStatus {
    return userStatus(user);
  }

  protected plantLabel(user: UserDto): string {
    if (user.plantCodes.length === 0) {
      return '—';
    }
    const names = this.plantNames();
    return user.plantCodes.map((code) => names.get(code) ?? code).join(', ');
  }

  protected isSelf(user: UserDto): boolean {
    return this.session.user()?.id === user.id;
  }

  protected onFilterInput(event: Event): void {
    this.filterInput.next((event.target as HTMLInputElement).value);
  }

  protected onRoleFilter(role: Role | ''): void {
    this.query.update((query) => ({ ...query, role: role || undefined, offset: 0 }));
  }

  protected onSort(sort: Sort): void {
    const key = USER_SORT_FIELDS.find((candidate) => candidate === sort.active);
    this.query.update((query) => ({
      ...query,
      sort: sort.direction && key ? key : undefined,
      order: sort.direction || undefined,
      offset: 0,
    }));
  }

  protected onPage(event: PageEvent): void {
    this.query.update((query) => ({
      ...query,
      limit: event.pageSize,
      offset: event.pageIndex * event.pageSize,
    }));
  }

  protected invite(): void {
    const data: UserDialogData = { mode: 'invite', plants: this.plants() };
    this.dialog
      .open<UserDialog, UserDialogData, UserDto>(UserDialog, { data, autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((user) => {
        if (user) {
          this.notify(`Invitation sent to ${user.email}.`);
          this.reloads.next();
        }
      });
  }

  protected edit(user: UserDto): void {
    const data: UserDialogData = { mode: 'edit', user, plants: this.plants() };
    this.dialog
      .open<UserDialog, UserDialogData, UserDto>(UserDialog, { data })
      .afterClosed()
      .subscribe((saved) => {
        if (saved) {
          this.notify(`Saved ${saved.name}: ${ROLE_LABELS[saved.role]}.`);
          this.reloads.next();
        }
      });
  }

  protected setActive(user: UserDto, isActive: boolean): void {
    const data: ConfirmDialogData = isActive
      ? {
          title: `Reactivate ${user.name}?`,
          message: `${user.name} can sign in again with their role and plants as before.`,
          confirmLabel: 'Reactivate',
        }
      : {
          title: `Deactivate ${user.name}?`,
          message:
            `${user.name} is signed out at their next request and cannot sign in until ` +
            'reactivated. Their past work stays in Keelson.',
          confirmLabel: 'Deactivate',
        };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data })
      .afterClosed()
      .pipe(
        switchMap((isConfirmed) =>
          isConfirmed ? this.usersApi.update(user.id, { isActive }) : of(null),
        ),
      )
      .subscribe({
        next: (saved) => {
          if (saved) {
            const outcome = isActive ? 'is active again' : 'is deactivated';
            this.notify(`${saved.name} ${outcome}.`);
            this.reloads.next();
          }
        },
        error: (error: unknown) => this.notify(apiErrorMessage(error)),
      });
  }

  protected resendInvitation(user: UserDto): void {
    this.usersApi.resendInvitation(user.id).subscribe({
      next: () => this.notify(`A new invitation is on its way to ${user.email}.`),
      error: (error: unknown) => this.notify(apiErrorMessage(error)),
    });
  }

  private notify(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 6000 });
  }
}

import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatAutocomplete, MatAutocompleteTrigger } from '@angular/material/autocomplete';
import { MatOption, provideNativeDateAdapter } from '@angular/material/core';
import {
  MatDatepicker,
  MatDatepickerInput,
  MatDatepickerToggle,
} from '@angular/material/datepicker';
import {
  MatFormField,
  MatHint,
  MatLabel,
  MatPrefix,
  MatSuffix,
} from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { AuditEventDto, AuditListDto } from '@keelson/contracts';
import { catchError, map, of, switchMap } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { describeAuditEvent, formatValue } from '../shared/history-panel/audit-sentence';
import { type AuditQuery, AuditApi } from './audit-api';
import { UsersApi } from './users-api';

/** Events per page unless the administrator picks another size. */
export const AUDIT_PAGE_SIZE = 50;

/** The subject types the trail records, for the filter. */
export const AUDIT_SUBJECT_TYPES = [
  { value: 'network_version', label: 'Network version (import)' },
  { value: 'analysis_run', label: 'Analysis run' },
  { value: 'register_entry', label: 'Register entry' },
  { value: 'plan', label: 'Mitigation plan' },
  { value: 'plan_task', label: 'Plan task' },
  { value: 'user', label: 'User' },
] as const;

/** Actions to suggest in the filter: the prefixes first, then every action recorded. */
export const AUDIT_ACTION_SUGGESTIONS = [
  'import.', 'run.', 'register.', 'plan.', 'task.', 'user.',
  'import.committed', 'run.succeeded', 'register.updated', 'register.likelihood_overridden',
  'register.mitigating', 'plan.created', 'plan.updated', 'plan.what_if_evaluated',
  'plan.submitted', 'plan.approved', 'plan.rejected', 'plan.withdrawn', 'plan.in_progress',
  'plan.done', 'task.created', 'task.updated', 'task.deleted', 'task.commented',
  'user.invited', 'user.updated', 'user.role_changed', 'user.deactivated', 'user.reactivated',
  'user.mail_preferences_changed',
] as const;

/** The app's page of a subject, as router link commands; null when it has none. */
export function subjectLink(event: AuditEventDto): string[] | null {
  switch (event.subjectType) {
    case 'register_entry':
      return ['/register', event.subjectId];
    case 'plan':
      return ['/plans', event.subjectId];
    case 'analysis_run':
      return ['/runs', event.subjectId];
    case 'network_version':
      return ['/network', event.subjectId];
    default:
      return null;
  }
}

/** One line of the before/after comparison. */
export interface AuditDiffLine {
  key: string;
  before: string;
  after: string;
  isChanged: boolean;
}

/** Every key of before and after, side by side; a key whose value differs is marked changed. */
export function auditDiff(event: AuditEventDto): AuditDiffLine[] {
  const before = event.before ?? {};
  const after = event.after ?? {};
  const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])];
  return keys.map((key) => ({
    key,
    before: key in before ? formatValue(before[key]) : '—',
    after: key in after ? formatValue(after[key]) : '—',
    isChanged: JSON.stringify(before[key]) !== JSON.stringify(after[key]),
  }));
}

/** A picked calendar day as the API's YYYY-MM-DD (the day as shown, not shifted to UTC). */
function isoDay(date: Date | null): string | undefined {
  if (!date) return undefined;
  const pad = (value: number) => String(value).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}

type Loaded = { value: AuditListDto } | { error: string };

/**
 * "Audit trail": every change that matters (imports, runs, overrides, register edits, plans,
 * decisions, tasks, user and role changes), newest first, filtered on the server and paged. A
 * row opens to show its before and after side by side with the changed fields marked; the
 * export downloads every event that matches the filters as a workbook.
 */
@Component({
  selector: 'kl-audit-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe, ReactiveFormsModule, RouterLink, MatAutocomplete, MatAutocompleteTrigger,
    MatButton, MatIconButton, MatOption, MatDatepicker, MatDatepickerInput, MatDatepickerToggle,
    MatFormField, MatHint, MatLabel, MatPrefix, MatSuffix, MatIcon, MatInput, MatPaginator,
    MatProgressBar, MatSelect, MatTableModule,
  ],
  providers: [provideNativeDateAdapter()],
  templateUrl: './audit-page.html',
  styleUrl: './audit-page.scss',
})
export class AuditPage {
  private readonly auditApi = inject(AuditApi);
  private readonly usersApi = inject(UsersApi);

  protected readonly columns = ['createdAt', 'user', 'action', 'subject', 'summary'] as const;
  protected readonly subjectTypes = AUDIT_SUBJECT_TYPES;
  protected readonly form = new FormGroup({
    action: new FormControl('', { nonNullable: true }),
    subjectType: new FormControl('', { nonNullable: true }),
    subjectId: new FormControl('', { nonNullable: true }),
    userId: new FormControl<number | null>(null),
    from: new FormControl<Date | null>(null),
    to: new FormControl<Date | null>(null),
    q: new FormControl('', { nonNullable: true }),
  });
  private readonly typedAction = toSignal(this.form.controls.action.valueChanges,
    { initialValue: '' });
  protected readonly actionSuggestions = computed(() => {
    const typed = this.typedAction().trim().toLowerCase();
    return AUDIT_ACTION_SUGGESTIONS.filter((action) => action.startsWith(typed));
  });
  protected readonly users = toSignal(
    this.usersApi.list({ sort: 'name', order: 'asc', limit: 200 }).pipe(
      map((page) => page.items),
      catchError(() => of([])),
    ),
    { initialValue: [] },
  );
  /** The filters last applied (the form may hold edits not applied yet). */
  protected readonly filters = signal<AuditQuery>({});
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(AUDIT_PAGE_SIZE);
  protected readonly events = signal<AuditEventDto[]>([]);
  protected readonly total = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly rangeError = signal<string | null>(null);
  protected readonly expandedId = signal<number | null>(null);
  protected readonly exportUrl = computed(() => this.auditApi.exportUrl(this.filters()));
  protected readonly hasFilters = computed(() => Object.keys(this.filters()).length > 0);

  constructor() {
    const query = computed<AuditQuery>(() => ({
      ...this.filters(),
      limit: this.pageSize(),
      offset: this.pageIndex() * this.pageSize(),
    }));
    toObservable(query)
      .pipe(
        switchMap((current) => {
          this.isLoading.set(true);
          return this.auditApi.list(current).pipe(
            map((value): Loaded => ({ value })),
            catchError((error: unknown) => of<Loaded>({ error: apiErrorMessage(error) })),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((result) => {
        this.isLoading.set(false);
        if ('error' in result) {
          this.errorMessage.set(result.error);
          this.events.set([]);
          this.total.set(0);
          return;
        }
        this.errorMessage.set(null);
        this.events.set(result.value.items);
        this.total.set(result.value.total);
      });
  }

  protected apply(): void {
    const value = this.form.getRawValue();
    const from = isoDay(value.from);
    const to = isoDay(value.to);
    if (from && to && from > to) {
      this.rangeError.set('The "from" date is after the "to" date.');
      return;
    }
    this.rangeError.set(null);
    const filters: AuditQuery = {};
    const text = (input: string) => input.trim() || undefined;
    const entries: [keyof AuditQuery, string | number | undefined][] = [
      ['action', text(value.action)], ['subjectType', text(value.subjectType)],
      ['subjectId', text(value.subjectId)], ['userId', value.userId ?? undefined],
      ['from', from], ['to', to], ['q', text(value.q)],
    ];
    for (const [key, entry] of entries) {
      if (entry !== undefined) Object.assign(filters, { [key]: entry });
    }
    this.filters.set(filters);
    this.pageIndex.set(0);
    this.expandedId.set(null);
  }

  protected clear(): void {
    this.form.reset({ action: '', subjectType: '', subjectId: '', userId: null, from: null,
      to: null, q: '' });
    this.apply();
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
    this.expandedId.set(null);
  }

  protected toggle(event: AuditEventDto): void {
    this.expandedId.update((id) => (id === event.id ? null : event.id));
  }

  protected sentence(event: AuditEventDto): string {
    return describeAuditEvent(event);
  }

  protected link(event: AuditEventDto): string[] | null {
    return subjectLink(event);
  }

  protected diff(event: AuditEventDto): AuditDiffLine[] {
    return auditDiff(event);
  }

  protected readonly isDetailRow = (_index: number, event: AuditEventDto) =>
    event.id === this.expandedId();
}

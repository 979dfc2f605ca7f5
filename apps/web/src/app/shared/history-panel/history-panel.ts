import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import type { AuditEventDto } from '@keelson/contracts';
import { Subject, catchError, map, merge, of, switchMap } from 'rxjs';
import { apiErrorMessage } from '../api-error-message';
import {
  actorName,
  changedFields,
  describeAuditEvent,
  relativeTime,
  type ChangedField,
} from './audit-sentence';
import { HistoryApi } from './history-api';

/** One timeline line as the template shows it. */
interface HistoryLine {
  event: AuditEventDto;
  who: string;
  sentence: string;
  changes: ChangedField[];
}

type Loaded = { items: AuditEventDto[] } | { error: string };

/**
 * The history of one subject from the audit trail, as a compact timeline, newest first: when
 * (relative, the exact time in the `title`), who, a sentence per action and the changed fields
 * as before -> after. Empty state: "No changes recorded yet".
 *
 * API (standalone, OnPush):
 * - selector `kl-history-panel`
 * - `subjectType` (required input, string): `register_entry`, `plan`, `plan_task`, `user` ...
 * - `subjectId` (required input, string | number)
 * - `reloadKey` (optional input, any value): changing it re-fetches; a parent can bind its own
 *   "last saved" stamp or a counter here.
 * - `refresh()` (public method): re-fetches now, e.g. from a `viewChild(HistoryPanel)` after a
 *   save.
 *
 * It reads `GET /api/audit/history/:subjectType/:subjectId`: a register entry's history holds
 * the events of its plans and their tasks, a plan's those of its tasks. Errors (403 for a
 * subject type that is for administrators only, 404) are shown as the API's message.
 *
 * @example
 * <kl-history-panel subjectType="register_entry" [subjectId]="entry.id" [reloadKey]="saved()" />
 */
@Component({
  selector: 'kl-history-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButton, MatIcon, MatProgressBar],
  templateUrl: './history-panel.html',
  styleUrl: './history-panel.scss',
})
export class HistoryPanel {
  private readonly historyApi = inject(HistoryApi);
  private readonly reloads = new Subject<void>();

  /** The kind of subject: `register_entry`, `plan` ... */
  readonly subjectType = input.required<string>();
  /** The subject's id. */
  readonly subjectId = input.required<string | number>();
  /** Any value; when it changes the history is fetched again. */
  readonly reloadKey = input<unknown>(undefined);

  protected readonly isLoading = signal(true);
  protected readonly error = signal<string | null>(null);
  protected readonly events = signal<AuditEventDto[]>([]);
  // The moment the list was fetched: "3 hours ago" is relative to it.
  protected readonly fetchedAt = signal(new Date());
  protected readonly lines = computed<HistoryLine[]>(() =>
    this.events().map((event) => ({
      event,
      who: actorName(event),
      sentence: describeAuditEvent(event),
      changes: changedFields(event.before, event.after),
    })),
  );

  constructor() {
    const subject = computed(() => ({
      type: this.subjectType(),
      id: this.subjectId(),
      key: this.reloadKey(),
    }));
    merge(toObservable(subject), this.reloads.pipe(map(() => subject())))
      .pipe(
        switchMap(({ type, id }) => {
          this.isLoading.set(true);
          return this.historyApi.history(type, id).pipe(
            map((history): Loaded => ({ items: history.items })),
            catchError((error: unknown) => of<Loaded>({ error: apiErrorMessage(error) })),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((result) => {
        this.isLoading.set(false);
        this.fetchedAt.set(new Date());
        if ('error' in result) {
          this.error.set(result.error);
          this.events.set([]);
          return;
        }
        this.error.set(null);
        this.events.set(result.items);
      });
  }

  /** Fetches the history again (call it after the parent saved a change). */
  refresh(): void {
    this.reloads.next();
  }

  protected relative(iso: string): string {
    return relativeTime(iso, this.fetchedAt());
  }
}

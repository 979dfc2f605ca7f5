import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { DomSanitizer, type SafeHtml } from '@angular/platform-browser';
import type { DigestSentDto, MailMessageDto, MailSummaryDto, Page } from '@keelson/contracts';
import { EMPTY, Subject, catchError, map, merge, of, switchMap } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { ConfirmDialog, type ConfirmDialogData } from '../shared/confirm-dialog';
import { MailApi } from './mail-api';
import { MailOutboxPanel } from './mail-outbox-panel';

/** Messages per page of the list. */
export const MAIL_PAGE_SIZE = 25;

type Loaded<T> = { value: T } | { error: string };

/** What the page says after sending the digest now. */
export function digestOutcome(sent: DigestSentDto): string {
  if (sent.overdueTasks === 0) {
    return 'No task is overdue, so no digest was sent.';
  }
  const tasks = `${sent.overdueTasks} overdue task${sent.overdueTasks === 1 ? '' : 's'}`;
  const people = `${sent.recipients} ${sent.recipients === 1 ? 'person' : 'people'}`;
  return `Digest sent to ${people}, covering ${tasks}.`;
}

/**
 * "Sent mail": the messages the server's local mail sink caught (invitations and notices), newest
 * first. Choosing one shows its text part and its HTML part, the latter in a fully sandboxed
 * frame. Above the list, the outbox: e-mails the mail server has not taken yet, with "Send them
 * now". "Send the digest now" sends the weekly digest of overdue tasks without waiting for its
 * schedule, after a confirmation.
 */
@Component({
  selector: 'kl-mail-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MailOutboxPanel, MatButton, MatIcon, MatPaginator, MatProgressBar,
    MatTableModule],
  templateUrl: './mail-page.html',
  styleUrl: './mail-page.scss',
})
export class MailPage {
  private readonly mailApi = inject(MailApi);
  private readonly sanitizer = inject(DomSanitizer);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly reloads = new Subject<void>();
  private readonly outboxPanel = viewChild.required(MailOutboxPanel);

  protected readonly columns = ['receivedAt', 'to', 'subject'] as const;
  protected readonly pageSize = MAIL_PAGE_SIZE;
  protected readonly pageIndex = signal(0);
  protected readonly messages = signal<MailSummaryDto[]>([]);
  protected readonly total = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly listError = signal<string | null>(null);
  protected readonly selectedId = signal<number | null>(null);
  protected readonly selected = signal<MailMessageDto | null>(null);
  protected readonly detailError = signal<string | null>(null);
  protected readonly isDetailLoading = signal(false);
  protected readonly isSendingDigest = signal(false);
  /** The outcome of the last "Send the digest now", shown above the list. */
  protected readonly digestMessage = signal<string | null>(null);
  /**
   * The HTML part for the frame's srcdoc. Angular's sanitizer would strip the message's own
   * styling, which is what an administrator checks here; the frame's empty `sandbox` attribute
   * is what keeps the content inert: no scripts, no forms, no plugins, a unique origin with no
   * access to Keelson's cookies or DOM, and no navigation of this page.
   */
  protected readonly selectedHtml = computed<SafeHtml | null>(() => {
    const html = this.selected()?.html;
    return html ? this.sanitizer.bypassSecurityTrustHtml(html) : null;
  });

  constructor() {
    merge(toObservable(this.pageIndex), this.reloads.pipe(map(() => this.pageIndex())))
      .pipe(
        switchMap((pageIndex) => {
          this.isLoading.set(true);
          return this.mailApi.list(MAIL_PAGE_SIZE, pageIndex * MAIL_PAGE_SIZE).pipe(
            map((page): Loaded<Page<MailSummaryDto>> => ({ value: page })),
            catchError((error: unknown) => of({ error: apiErrorMessage(error) })),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((result) => {
        this.isLoading.set(false);
        if ('error' in result) {
          this.listError.set(result.error);
          return;
        }
        this.listError.set(null);
        this.messages.set(result.value.items);
        this.total.set(result.value.total);
      });

    toObservable(this.selectedId)
      .pipe(
        switchMap((id) => {
          this.detailError.set(null);
          if (id === null) {
            return of<Loaded<MailMessageDto | null>>({ value: null });
          }
          this.isDetailLoading.set(true);
          return this.mailApi.get(id).pipe(
            map((message): Loaded<MailMessageDto | null> => ({ value: message })),
            catchError((error: unknown) => of({ error: apiErrorMessage(error) })),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((result) => {
        this.isDetailLoading.set(false);
        if ('error' in result) {
          this.selected.set(null);
          this.detailError.set(result.error);
          return;
        }
        this.selected.set(result.value);
      });
  }

  protected open(message: MailSummaryDto): void {
    this.selectedId.set(message.id);
  }

  protected close(): void {
    this.selectedId.set(null);
  }

  protected refresh(): void {
    this.reloads.next();
    this.outboxPanel().reload();
  }

  /** Messages left the outbox: the list of sent mail has them now. */
  protected onOutboxSent(): void {
    this.reloads.next();
  }

  protected sendDigest(): void {
    const data: ConfirmDialogData = {
      title: 'Send the digest now?',
      message:
        'Everyone with overdue tasks gets their list by e-mail now, and every risk manager ' +
        'gets the list of all overdue tasks, as on the weekly schedule. People who switched ' +
        'the digest off get nothing.',
      confirmLabel: 'Send the digest',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data })
      .afterClosed()
      .pipe(
        switchMap((isConfirmed) => {
          if (!isConfirmed) return EMPTY;
          this.isSendingDigest.set(true);
          return this.mailApi.sendDigest();
        }),
      )
      .subscribe({
        next: (sent) => {
          this.isSendingDigest.set(false);
          const message = digestOutcome(sent);
          this.digestMessage.set(message);
          this.snackBar.open(message, 'Close', { duration: 6000 });
          this.reloads.next();
        },
        error: (error: unknown) => {
          this.isSendingDigest.set(false);
          const message = `The digest was not sent: ${apiErrorMessage(error)}`;
          this.digestMessage.set(message);
          this.snackBar.open(message, 'Close', { duration: 8000 });
        },
      });
  }

  protected onPage(event: PageEvent): void {
    this.pageIndex.set(event.pageIndex);
  }
}

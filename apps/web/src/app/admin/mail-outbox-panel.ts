import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, output, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import type { MailOutboxDto, MailOutboxSentDto } from '@keelson/contracts';
import type { Subscription } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { MailApi } from './mail-api';

/** What the panel says about the unsent messages, in a sentence. */
export function outboxSummary(outbox: Pick<MailOutboxDto, 'pending' | 'failed'>): string {
  const count = (n: number) => `${n} e-mail${n === 1 ? '' : 's'}`;
  const parts: string[] = [];
  if (outbox.pending > 0) {
    parts.push(`${count(outbox.pending)} the mail server did not take ${outbox.pending === 1
      ? 'waits' : 'wait'} to be tried again`);
  }
  if (outbox.failed > 0) {
    parts.push(`${count(outbox.failed)} ${outbox.failed === 1 ? 'was' : 'were'} given up after ` +
      'the last try');
  }
  return parts.length === 0
    ? 'Every notification e-mail has been taken by the mail server.'
    : `${parts.join('; ')}.`;
}

/** What the page says after "Send them now". */
export function outboxSendOutcome(sent: MailOutboxSentDto): string {
  const went = `${sent.sent} e-mail${sent.sent === 1 ? '' : 's'} sent`;
  return sent.unsent === 0 ? `${went}; none is waiting.`
    : `${went}; ${sent.unsent} still not taken by the mail server, tried again later.`;
}

/**
 * The outbox on the "Sent mail" page: notification e-mails the mail server has not taken yet,
 * waiting for their next try or given up, with the last error and "Send them now".
 */
@Component({
  selector: 'kl-mail-outbox-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButton, MatIcon, MatTableModule],
  template: `
    @if (error(); as message) {
      <div class="kl-error-banner" role="alert">
        <mat-icon aria-hidden="true">error</mat-icon>
        <span>The outbox could not be read: {{ message }}</span>
      </div>
    } @else if (outbox(); as box) {
      @if (box.pending + box.failed === 0) {
        <p class="kl-muted outbox__clear" role="status">
          <mat-icon aria-hidden="true">done_all</mat-icon>
          {{ summary(box) }}
        </p>
      } @else {
        <section class="outbox" aria-labelledby="outbox-title">
          <div class="outbox__header">
            <h2 id="outbox-title" class="outbox__title">
              <mat-icon aria-hidden="true">schedule_send</mat-icon>
              Not sent yet
            </h2>
            <button matButton="tonal" type="button" [disabled]="isSending()" (click)="sendNow()">
              <mat-icon>send</mat-icon>
              {{ isSending() ? 'Sending…' : 'Send them now' }}
            </button>
          </div>
          <p class="outbox__summary">
            {{ summary(box) }} Keelson tries a refused e-mail again after 1 minute, 5 minutes,
            30 minutes, 2 hours and 12 hours, then gives up; nothing is lost when the server
            restarts.
          </p>
          <table mat-table [dataSource]="box.items" aria-label="E-mails not sent yet">
            <ng-container matColumnDef="subject">
              <th mat-header-cell *matHeaderCellDef>Subject</th>
              <td mat-cell *matCellDef="let item">{{ item.subject }}</td>
            </ng-container>
            <ng-container matColumnDef="to">
              <th mat-header-cell *matHeaderCellDef>To</th>
              <td mat-cell *matCellDef="let item">{{ item.to.join(', ') }}</td>
            </ng-container>
            <ng-container matColumnDef="state">
              <th mat-header-cell *matHeaderCellDef>State</th>
              <td mat-cell *matCellDef="let item">
                @if (item.status === 'failed') {
                  Given up after {{ item.attempts }} tries
                } @else {
                  Next try {{ item.nextAttemptAt | date: 'short' }}
                  ({{ item.attempts }} so far)
                }
              </td>
            </ng-container>
            <ng-container matColumnDef="error">
              <th mat-header-cell *matHeaderCellDef>Last error</th>
              <td mat-cell *matCellDef="let item" class="outbox__error">
                {{ item.lastError ?? '—' }}
              </td>
            </ng-container>
            <tr mat-header-row *matHeaderRowDef="columns"></tr>
            <tr mat-row *matRowDef="let item; columns: columns"></tr>
          </table>
          @if (box.items.length < box.pending + box.failed) {
            <p class="kl-muted">The oldest {{ box.items.length }} are listed.</p>
          }
        </section>
      }
    }
  `,
  styles: `
    .outbox {
      margin: 0 0 16px;
      padding: 12px 16px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 8px;
      background: var(--mat-sys-surface-container-low);
    }
    .outbox__header {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      justify-content: space-between;
      gap: 8px;
    }
    .outbox__title {
      display: flex;
      align-items: center;
      gap: 8px;
      margin: 0;
      font: var(--mat-sys-title-medium);
    }
    .outbox__summary {
      max-width: 90ch;
    }
    .outbox__error {
      max-width: 40ch;
      overflow-wrap: anywhere;
      font: var(--mat-sys-body-small);
    }
    .outbox__clear {
      display: flex;
      align-items: center;
      gap: 8px;
    }
    table {
      width: 100%;
    }
  `,
})
export class MailOutboxPanel {
  private readonly mailApi = inject(MailApi);
  private readonly snackBar = inject(MatSnackBar);
  private loading: Subscription | null = null;

  /** Messages went out: the page reads its list of sent mail again. */
  readonly sent = output<void>();

  protected readonly columns = ['subject', 'to', 'state', 'error'];
  protected readonly outbox = signal<MailOutboxDto | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly isSending = signal(false);
  protected readonly summary = outboxSummary;

  constructor() {
    this.reload();
  }

  /** Reads the outbox again (the page's Refresh). */
  reload(): void {
    this.loading?.unsubscribe();
    this.loading = this.mailApi.outbox().subscribe({
      next: (outbox) => {
        this.error.set(null);
        this.outbox.set(outbox);
      },
      error: (error: unknown) => this.error.set(apiErrorMessage(error)),
    });
  }

  protected sendNow(): void {
    this.isSending.set(true);
    this.mailApi.sendOutbox().subscribe({
      next: (sent) => {
        this.isSending.set(false);
        this.snackBar.open(outboxSendOutcome(sent), 'Close', { duration: 6000 });
        this.reload();
        if (sent.sent > 0) this.sent.emit();
      },
      error: (error: unknown) => {
        this.isSending.set(false);
        this.snackBar.open(`Not sent: ${apiErrorMessage(error)}`, 'Close', { duration: 8000 });
      },
    });
  }
}

import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSlideToggle } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MAIL_KINDS, MAIL_KIND_LABELS, type MailKind } from '@keelson/contracts';
import { Session } from '../auth/session';
import { apiErrorMessage } from '../shared/api-error-message';
import { MailPreferencesApi } from './mail-preferences-api';

/** When each kind of e-mail goes out, shown under its switch. */
export const MAIL_KIND_HINTS: Record<MailKind, string> = {
  plan_submitted: 'When a risk manager submits a plan touching a plant you manage.',
  plan_decided: 'When a plant manager approves or rejects it, with their comment.',
  task_assigned: 'When a task of an approved plan is given to you by someone else.',
  digest: 'Once a week, when tasks you own are overdue (risk managers: every overdue task).',
  rescoring: 'When a quarterly re-scoring ends: risk managers get what changed, owners their '
    + 'entries whose rating changed.',
};

/**
 * "E-mail settings": one switch per kind of notification e-mail. Every kind is on until the
 * person switches it off; saving stores the kinds that are off. Sign-in and invitation e-mails
 * are not optional and are not listed.
 */
@Component({
  selector: 'kl-mail-settings-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButton, MatIcon, MatProgressBar, MatSlideToggle],
  templateUrl: './mail-settings-page.html',
  styleUrl: './mail-settings-page.scss',
})
export class MailSettingsPage {
  private readonly preferencesApi = inject(MailPreferencesApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(Session);

  protected readonly kinds = MAIL_KINDS;
  protected readonly labels = MAIL_KIND_LABELS;
  protected readonly hints = MAIL_KIND_HINTS;
  protected readonly email = computed(() => this.session.user()?.email ?? null);
  protected readonly isLoading = signal(true);
  protected readonly isSaving = signal(false);
  protected readonly loadError = signal<string | null>(null);
  protected readonly saveError = signal<string | null>(null);
  /** The kinds switched off as the server last stored them; null until loaded. */
  private readonly stored = signal<readonly MailKind[] | null>(null);
  /** The kinds switched off on screen. */
  protected readonly unsubscribed = signal<ReadonlySet<MailKind>>(new Set());
  protected readonly hasChanges = computed(() => {
    const stored = this.stored();
    const shown = this.unsubscribed();
    return stored !== null &&
      (stored.length !== shown.size || stored.some((kind) => !shown.has(kind)));
  });

  constructor() {
    this.load();
  }

  protected isOn(kind: MailKind): boolean {
    return !this.unsubscribed().has(kind);
  }

  protected toggle(kind: MailKind, isOn: boolean): void {
    const next = new Set(this.unsubscribed());
    if (isOn) {
      next.delete(kind);
    } else {
      next.add(kind);
    }
    this.unsubscribed.set(next);
  }

  protected load(): void {
    this.isLoading.set(true);
    this.loadError.set(null);
    this.preferencesApi.get().subscribe({
      next: (preferences) => {
        this.isLoading.set(false);
        this.stored.set(preferences.unsubscribed);
        this.unsubscribed.set(new Set(preferences.unsubscribed));
      },
      error: (error: unknown) => {
        this.isLoading.set(false);
        this.loadError.set(apiErrorMessage(error));
      },
    });
  }

  protected save(): void {
    if (this.isSaving()) return;
    this.isSaving.set(true);
    this.saveError.set(null);
    const unsubscribed = MAIL_KINDS.filter((kind) => this.unsubscribed().has(kind));
    this.preferencesApi.save({ unsubscribed }).subscribe({
      next: (saved) => {
        this.isSaving.set(false);
        this.stored.set(saved.unsubscribed);
        this.unsubscribed.set(new Set(saved.unsubscribed));
        this.snackBar.open('E-mail settings saved.', 'Close', { duration: 5000 });
      },
      error: (error: unknown) => {
        this.isSaving.set(false);
        const message = apiErrorMessage(error);
        this.saveError.set(message);
        this.snackBar.open(`Not saved: ${message}`, 'Close', { duration: 8000 });
      },
    });
  }

  protected undo(): void {
    this.unsubscribed.set(new Set(this.stored() ?? []));
  }
}

import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { ROLE_LABELS } from '@keelson/contracts';
import { Session } from '../auth/session';

/** Shown when a role guard refuses a page to the signed-in person's role. */
@Component({
  selector: 'kl-forbidden-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatButton, MatIcon],
  template: `
    <section class="kl-page errors" aria-labelledby="forbidden-title">
      <mat-icon class="errors__icon" aria-hidden="true">lock</mat-icon>
      <h1 id="forbidden-title" class="kl-page-title">This page is not open to your role</h1>
      <p>{{ explanation() }}</p>
      <p class="kl-muted">If your work needs it, ask an administrator to change your role.</p>
      <a matButton="filled" routerLink="/home">Go to the home page</a>
    </section>
  `,
  styleUrl: './errors.scss',
})
export class ForbiddenPage {
  private readonly session = inject(Session);

  /** The address that was refused (query parameter `page`). */
  readonly page = input<string>();

  protected readonly explanation = computed(() => {
    const role = this.session.role();
    const who = role ? `As ${ROLE_LABELS[role].toLowerCase()} you` : 'You';
    const page = this.page();
    return page ? `${who} cannot open ${page}.` : `${who} cannot open that page.`;
  });
}

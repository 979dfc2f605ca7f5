import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatCard, MatCardActions, MatCardContent } from '@angular/material/card';
import { MatIcon } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { ROLE_LABELS } from '@keelson/contracts';
import { Session } from '../auth/session';
import { ROLE_GUIDES, greetingFor } from './role-guide';

/** The signed-in home page: a greeting, the person's role explained, and what it does here. */
@Component({
  selector: 'kl-home-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatButton, MatCard, MatCardActions, MatCardContent, MatIcon],
  templateUrl: './home-page.html',
  styleUrl: './home-page.scss',
})
export class HomePage {
  private readonly session = inject(Session);

  protected readonly greeting = computed(() => {
    const firstName = this.session.user()?.name.split(/\s+/)[0] ?? '';
    const opening = greetingFor(new Date().getHours());
    return firstName ? `${opening}, ${firstName}` : opening;
  });
  protected readonly roleLabel = computed(() => {
    const role = this.session.role();
    return role ? ROLE_LABELS[role] : '';
  });
  protected readonly guide = computed(() => {
    const role = this.session.role();
    return role ? ROLE_GUIDES[role] : null;
  });
  protected readonly plants = computed(() => this.session.user()?.plantCodes ?? []);
}

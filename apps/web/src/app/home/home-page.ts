import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatAnchor } from '@angular/material/button';
import { MatCard, MatCardActions, MatCardContent } from '@angular/material/card';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { ROLE_LABELS, type DashboardDto } from '@keelson/contracts';
import { Session } from '../auth/session';
import { RatingChip } from '../register/rating-chip';
import { apiErrorMessage } from '../shared/api-error-message';
import { DashboardApi } from './dashboard-api';
import { dashboardCards } from './dashboard-view';
import { ROLE_GUIDES, greetingFor } from './role-guide';

/**
 * The signed-in home page: a greeting, the person's role, and the dashboard of their role:
 * cards of figures, each a link to the list behind it, and what to do first while there is
 * nothing to count.
 */
@Component({
  selector: 'kl-home-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, RouterLink, MatAnchor, MatCard, MatCardActions, MatCardContent, MatIcon,
    MatProgressBar, RatingChip],
  templateUrl: './home-page.html',
  styleUrl: './home-page.scss',
})
export class HomePage {
  private readonly session = inject(Session);
  private readonly dashboardApi = inject(DashboardApi);

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

  private readonly dashboard = signal<DashboardDto | null>(null);
  protected readonly isLoading = signal(true);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly cards = computed(() => {
    const dto = this.dashboard();
    const role = this.session.role();
    return dto && role ? dashboardCards(dto, role) : [];
  });

  constructor() {
    this.dashboardApi.get().subscribe({
      next: (dto) => {
        this.dashboard.set(dto);
        this.isLoading.set(false);
      },
      error: (error: unknown) => {
        this.errorMessage.set(apiErrorMessage(error));
        this.isLoading.set(false);
      },
    });
  }
}

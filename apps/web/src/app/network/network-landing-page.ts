import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatAnchor } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { Session } from '../auth/session';
import { apiErrorMessage } from '../shared/api-error-message';
import { rolesFor } from '../shell/navigation';
import { NetworkVersionsApi } from './network-versions-api';

type LandingState = 'loading' | 'empty' | 'error';

/**
 * `/network`: opens the latest version's suppliers, or says that nothing has been imported
 * yet (with the way to the import for those who may import).
 */
@Component({
  selector: 'kl-network-landing-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatAnchor, MatIcon, MatProgressBar, RouterLink],
  template: `
    <section class="kl-page" aria-labelledby="network-title">
      <h1 id="network-title" class="kl-page-title">Network</h1>
      @switch (state()) {
        @case ('loading') {
          <mat-progress-bar mode="indeterminate" aria-label="Looking for the latest version" />
        }
        @case ('error') {
          <div class="kl-error-banner" role="alert">
            <mat-icon aria-hidden="true">error</mat-icon>
            <span>{{ errorMessage() }}</span>
          </div>
        }
        @case ('empty') {
          <div class="landing__empty">
            <mat-icon aria-hidden="true" class="landing__icon">account_tree</mat-icon>
            <h2 class="landing__title">No network yet</h2>
            <p>
              The network appears here once a buyer has imported the supply workbook: plants,
              products, their bills of materials, suppliers and who sources what from whom.
              Every import becomes a version you can browse and compare.
            </p>
            @if (canImport()) {
              <a matButton="filled" routerLink="/imports">
                <mat-icon>upload_file</mat-icon>
                Import a workbook
              </a>
            } @else {
              <p class="kl-muted">Ask a buyer in your team to import the workbook.</p>
            }
          </div>
        }
      }
    </section>
  `,
  styles: `
    .landing__empty {
      max-width: 60ch;
      padding: 32px 24px;
      border: 1px dashed var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-large);
    }
    .landing__icon {
      font-size: 40px;
      width: 40px;
      height: 40px;
      color: var(--mat-sys-primary);
    }
    .landing__title {
      margin: 8px 0;
      font: var(--mat-sys-title-large);
    }
  `,
})
export class NetworkLandingPage {
  private readonly session = inject(Session);

  protected readonly state = signal<LandingState>('loading');
  protected readonly errorMessage = signal('');
  protected readonly canImport = computed(() => this.session.hasRole(...rolesFor('imports')));

  constructor() {
    const router = inject(Router);
    inject(NetworkVersionsApi)
      .latest()
      .pipe(takeUntilDestroyed())
      .subscribe({
        next: (version) => {
          if (version === null) {
            this.state.set('empty');
            return;
          }
          void router.navigate(['/network', version.id, 'suppliers'], { replaceUrl: true });
        },
        error: (error: unknown) => {
          this.errorMessage.set(apiErrorMessage(error));
          this.state.set('error');
        },
      });
  }
}

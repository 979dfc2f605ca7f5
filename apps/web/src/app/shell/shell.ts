import { BreakpointObserver } from '@angular/cdk/layout';
import { DOCUMENT } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatIconButton } from '@angular/material/button';
import { MatDivider } from '@angular/material/divider';
import { MatIcon } from '@angular/material/icon';
import { MatListItem, MatListItemIcon, MatListItemTitle, MatNavList } from '@angular/material/list';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatSidenav, MatSidenavContainer, MatSidenavContent } from '@angular/material/sidenav';
import { MatToolbar } from '@angular/material/toolbar';
import { MatTooltip } from '@angular/material/tooltip';
import { NavigationEnd, Router, RouterLink, RouterOutlet } from '@angular/router';
import { ROLE_LABELS } from '@keelson/contracts';
import { filter, map } from 'rxjs';
import { AuthApi } from '../auth/auth-api';
import { SIGN_IN_PATH } from '../auth/auth-guard';
import { Session } from '../auth/session';
import { activeNavigationPath, navigationFor } from './navigation';
import { ThemeToggle } from './theme-toggle';

/** Below this width the sidenav floats over the content and closes after each choice. */
export const NARROW_LAYOUT_QUERY = '(max-width: 959.98px)';

/**
 * The signed-in layout: toolbar (product name, theme toggle, user menu), a sidenav with the
 * entries the person's role may use, and the page in the content area.
 */
@Component({
  selector: 'kl-shell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    RouterLink,
    RouterOutlet,
    MatDivider,
    MatIcon,
    MatIconButton,
    MatListItem,
    MatListItemIcon,
    MatListItemTitle,
    MatMenu,
    MatMenuItem,
    MatMenuTrigger,
    MatNavList,
    MatSidenav,
    MatSidenavContainer,
    MatSidenavContent,
    MatToolbar,
    MatTooltip,
    ThemeToggle,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
})
export class Shell {
  private readonly session = inject(Session);
  private readonly authApi = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly document = inject(DOCUMENT);
  private readonly sidenav = viewChild.required(MatSidenav);

  protected readonly user = this.session.user;
  protected readonly entries = computed(() => navigationFor(this.session.role()));
  private readonly url = toSignal(
    this.router.events.pipe(
      filter((event) => event instanceof NavigationEnd),
      map((event) => event.urlAfterRedirects),
    ),
    { initialValue: this.router.url },
  );
  /** The entry of the current page: the longest entry path the URL lies under. */
  protected readonly activePath = computed(() => activeNavigationPath(this.entries(), this.url()));
  protected readonly roleLabel = computed(() => {
    const role = this.session.role();
    return role ? ROLE_LABELS[role] : '';
  });
  protected readonly isNarrow = toSignal(
    inject(BreakpointObserver)
      .observe(NARROW_LAYOUT_QUERY)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );

  /** Moves keyboard focus past the toolbar and navigation to the page itself. */
  protected skipToContent(event: Event): void {
    event.preventDefault();
    this.document.getElementById('main-content')?.focus();
  }

  /** Closes the floating sidenav after a choice on narrow screens. */
  protected afterNavigate(): void {
    if (this.isNarrow()) {
      void this.sidenav().close();
    }
  }

  protected toggleSidenav(): void {
    void this.sidenav().toggle();
  }

  protected signOut(): void {
    const leave = (): void => {
      this.session.clear();
      void this.router.navigateByUrl(SIGN_IN_PATH);
    };
    // Leave even when the server cannot be reached: the person asked to go.
    this.authApi.logout().subscribe({ next: leave, error: leave });
  }
}

import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

/** Shown for addresses that match no page. */
@Component({
  selector: 'kl-not-found-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatButton, MatIcon],
  template: `
    <main id="main" class="kl-page errors" tabindex="-1">
      <mat-icon class="errors__icon" aria-hidden="true">explore_off</mat-icon>
      <h1 class="kl-page-title">This page does not exist</h1>
      <p class="kl-muted">The address may be mistyped, or the page has moved.</p>
      <a matButton="filled" routerLink="/home">Go to the home page</a>
    </main>
  `,
  styleUrl: './errors.scss',
})
export class NotFoundPage {}

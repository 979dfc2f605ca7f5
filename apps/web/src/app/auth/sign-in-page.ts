import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatCard, MatCardContent } from '@angular/material/card';
import { MatError, MatFormField, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router } from '@angular/router';
import { ROLE_LABELS } from '@keelson/contracts';
import { catchError, map, of } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { HealthApi } from '../shared/health-api';
import { AuthApi } from './auth-api';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, type DemoAccount } from './demo-accounts';
import { safeReturnUrl } from './return-url';
import { Session } from './session';

/**
 * The sign-in page: e-mail and password, the API's refusal shown as an alert, and in demo mode a
 * card of demo accounts that fills the form in one click.
 */
@Component({
  selector: 'kl-sign-in-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButton,
    MatIconButton,
    MatCard,
    MatCardContent,
    MatError,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
    MatSuffix,
  ],
  templateUrl: './sign-in-page.html',
  styleUrl: './sign-in-page.scss',
})
export class SignInPage {
  private readonly authApi = inject(AuthApi);
  private readonly session = inject(Session);
  private readonly router = inject(Router);

  /** Where to go after signing in (query parameter `returnUrl`). */
  readonly returnUrl = input<string>();

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
    password: ['', [Validators.required, Validators.maxLength(200)]],
  });
  protected readonly isBusy = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly isPasswordShown = signal(false);
  protected readonly demoAccounts = DEMO_ACCOUNTS;
  protected readonly demoPassword = DEMO_PASSWORD;
  protected readonly roleLabels = ROLE_LABELS;
  /** True when the server says it runs in demo mode; false when it does not or cannot say. */
  protected readonly isDemo = toSignal(
    inject(HealthApi)
      .get()
      .pipe(
        map((health) => health.mode === 'demo'),
        catchError(() => of(false)),
      ),
    { initialValue: false },
  );

  /** Fills the form with a demo account and its password. */
  protected fill(account: DemoAccount): void {
    this.form.setValue({ email: account.email, password: DEMO_PASSWORD });
    this.errorMessage.set(null);
  }

  protected togglePassword(): void {
    this.isPasswordShown.update((shown) => !shown);
  }

  protected submit(): void {
    if (this.isBusy()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isBusy.set(true);
    this.errorMessage.set(null);
    const { email, password } = this.form.getRawValue();
    this.authApi.login({ email: email.trim().toLowerCase(), password }).subscribe({
      next: (response) => {
        this.session.signIn(response.user);
        void this.router.navigateByUrl(safeReturnUrl(this.returnUrl()));
      },
      error: (error: unknown) => {
        this.isBusy.set(false);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }
}

import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  type OnInit,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  type ValidationErrors,
  Validators,
} from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCard, MatCardContent } from '@angular/material/card';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { InvitationDto } from '@keelson/contracts';
import { switchMap } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { AuthApi } from './auth-api';
import { DEFAULT_AFTER_SIGN_IN } from './return-url';
import { Session } from './session';

/** The shortest password the server accepts (setPasswordRequestSchema). */
export const MIN_PASSWORD_LENGTH = 10;
/** The longest password the server accepts (setPasswordRequestSchema). */
export const MAX_PASSWORD_LENGTH = 200;

/** Form-level validator: `confirmation` must equal `password`. */
export function passwordsMatch(group: AbstractControl): ValidationErrors | null {
  const password = group.get('password')?.value as string | undefined;
  const confirmation = group.get('confirmation')?.value as string | undefined;
  return confirmation && password !== confirmation ? { mismatch: true } : null;
}

type InvitationState =
  | { kind: 'loading' }
  | { kind: 'ready'; invitation: InvitationDto }
  | { kind: 'unusable'; message: string };

/**
 * Accepting an invitation: reads the token from the link's query string, shows whom the
 * invitation is for, lets the person choose a password (typed twice), then signs them in.
 */
@Component({
  selector: 'kl-set-password-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButton,
    MatCard,
    MatCardContent,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
  ],
  templateUrl: './set-password-page.html',
  styleUrl: './sign-in-page.scss',
})
export class SetPasswordPage implements OnInit {
  private readonly authApi = inject(AuthApi);
  private readonly session = inject(Session);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  /** The invitation token (query parameter `token`). */
  readonly token = input<string>();

  protected readonly state = signal<InvitationState>({ kind: 'loading' });
  protected readonly isBusy = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly minLength = MIN_PASSWORD_LENGTH;
  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      password: [
        '',
        [
          Validators.required,
          Validators.minLength(MIN_PASSWORD_LENGTH),
          Validators.maxLength(MAX_PASSWORD_LENGTH),
        ],
      ],
      confirmation: ['', [Validators.required]],
    },
    { validators: passwordsMatch },
  );

  ngOnInit(): void {
    const token = this.token()?.trim();
    if (!token) {
      this.state.set({
        kind: 'unusable',
        message: 'This link has no invitation token. Open the link from your invitation e-mail.',
      });
      return;
    }
    this.authApi
      .invitation(token)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (invitation) => this.state.set({ kind: 'ready', invitation }),
        error: (error: unknown) =>
          this.state.set({ kind: 'unusable', message: apiErrorMessage(error) }),
      });
  }

  protected submit(): void {
    const state = this.state();
    const token = this.token()?.trim();
    if (state.kind !== 'ready' || !token || this.isBusy()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { password } = this.form.getRawValue();
    this.isBusy.set(true);
    this.errorMessage.set(null);
    this.authApi
      .setPassword({ token, password })
      .pipe(
        // Sign in with the new password so the session cookie is set whatever set-password does.
        switchMap(() => this.authApi.login({ email: state.invitation.email, password })),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (response) => {
          this.session.signIn(response.user);
          void this.router.navigateByUrl(DEFAULT_AFTER_SIGN_IN);
        },
        error: (error: unknown) => {
          this.isBusy.set(false);
          this.errorMessage.set(apiErrorMessage(error));
        },
      });
  }
}

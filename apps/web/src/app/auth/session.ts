import { HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import type { Role, UserDto } from '@keelson/contracts';
import { firstValueFrom } from 'rxjs';
import { AuthApi } from './auth-api';

/**
 * The signed-in user of this browser tab, as signals. The server's cookie is the truth; this
 * holds what `GET /api/auth/me` or the login answer last said, and is cleared on sign-out or
 * when the API answers 401.
 */
@Injectable({ providedIn: 'root' })
export class Session {
  private readonly authApi = inject(AuthApi);
  private readonly currentUser = signal<UserDto | null>(null);
  private pendingRestore: Promise<UserDto | null> | null = null;
  private hasAsked = false;

  /** The signed-in user, or null. */
  readonly user = this.currentUser.asReadonly();
  /** True while someone is signed in. */
  readonly isSignedIn = computed(() => this.currentUser() !== null);
  /** The signed-in user's role, or null. */
  readonly role = computed<Role | null>(() => this.currentUser()?.role ?? null);

  /** True when someone is signed in and their role is one of `roles`. */
  hasRole(...roles: readonly Role[]): boolean {
    const role = this.role();
    return role !== null && roles.includes(role);
  }

  /**
   * Asks the server once who is signed in (later calls reuse the answer). A 401 means "nobody";
   * other failures (server down) also leave the session empty, so guards send people to sign-in,
   * where the error becomes visible.
   */
  restore(): Promise<UserDto | null> {
    if (this.hasAsked) {
      return Promise.resolve(this.currentUser());
    }
    this.pendingRestore ??= firstValueFrom(this.authApi.me()).then(
      (user) => this.settle(user),
      (error: unknown) => {
        if (!(error instanceof HttpErrorResponse)) {
          this.pendingRestore = null;
          throw error;
        }
        return this.settle(null);
      },
    );
    return this.pendingRestore;
  }

  /** Records the user the server just signed in (login or accepted invitation). */
  signIn(user: UserDto): void {
    this.settle(user);
  }

  /** Forgets the signed-in user (after sign-out or a 401). */
  clear(): void {
    this.settle(null);
  }

  private settle(user: UserDto | null): UserDto | null {
    this.hasAsked = true;
    this.pendingRestore = null;
    this.currentUser.set(user);
    return user;
  }
}

import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  InvitationDto,
  LoginRequest,
  LoginResponse,
  SetPasswordRequest,
  UserDto,
} from '@keelson/contracts';
import { type Observable, map } from 'rxjs';

/** URL of the current-user endpoint (the interceptor treats its 401 as "not signed in"). */
export const ME_URL = '/api/auth/me';
/** URL of the login endpoint (its 401 means "wrong credentials", not "session expired"). */
export const LOGIN_URL = '/api/auth/login';

/** Data access for signing in and out, the current user and invitations. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  /** POST /api/auth/login: signs in; the server sets the session cookie. */
  login(request: LoginRequest): Observable<LoginResponse> {
    return this.http.post<LoginResponse>(LOGIN_URL, request);
  }

  /** POST /api/auth/logout: clears the session cookie. */
  logout(): Observable<void> {
    return this.http.post<void>('/api/auth/logout', {});
  }

  /** GET /api/auth/me: the signed-in user; fails with 401 when there is no session. */
  me(): Observable<UserDto> {
    return this.http.get<{ user: UserDto }>(ME_URL).pipe(map((body) => body.user));
  }

  /** GET /api/auth/invitations/:token: who an invitation is for (404/410 when not usable). */
  invitation(token: string): Observable<InvitationDto> {
    return this.http.get<InvitationDto>(`/api/auth/invitations/${encodeURIComponent(token)}`);
  }

  /** POST /api/auth/set-password: accepts an invitation by choosing a password. */
  setPassword(request: SetPasswordRequest): Observable<UserDto> {
    return this.http
      .post<{ user: UserDto }>('/api/auth/set-password', request)
      .pipe(map((body) => body.user));
  }
}

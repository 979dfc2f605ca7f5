import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  InviteUserRequest,
  Page,
  Role,
  UpdateUserRequest,
  UserDto,
  UserSortField,
} from '@keelson/contracts';
import { type Observable, map } from 'rxjs';

/** A query for GET /api/users; every field is optional. */
export interface UserQuery {
  /** Free text matched against name and e-mail. */
  q?: string;
  role?: Role;
  sort?: UserSortField;
  order?: 'asc' | 'desc';
  limit?: number;
  offset?: number;
}

/** Turns a query into URL parameters, leaving out empty values. */
export function userQueryParams(query: UserQuery): HttpParams {
  let params = new HttpParams();
  const q = query.q?.trim();
  if (q) {
    params = params.set('q', q);
  }
  if (query.role) {
    params = params.set('role', query.role);
  }
  if (query.sort) {
    params = params.set('sort', query.sort).set('order', query.order ?? 'asc');
  }
  if (query.limit !== undefined) {
    params = params.set('limit', String(query.limit));
  }
  if (query.offset !== undefined) {
    params = params.set('offset', String(query.offset));
  }
  return params;
}

/** Data access for user administration (admin only). */
@Injectable({ providedIn: 'root' })
export class UsersApi {
  private readonly http = inject(HttpClient);

  /** GET /api/users: one page of users matching the query. */
  list(query: UserQuery = {}): Observable<Page<UserDto>> {
    return this.http.get<Page<UserDto>>('/api/users', { params: userQueryParams(query) });
  }

  /** POST /api/users/invitations: creates the user and e-mails a set-password link. */
  invite(request: InviteUserRequest): Observable<UserDto> {
    return this.http
      .post<{ user: UserDto }>('/api/users/invitations', request)
      .pipe(map((body) => body.user));
  }

  /** PATCH /api/users/:id: changes name, role, plants or whether the account is active. */
  update(id: number, request: UpdateUserRequest): Observable<UserDto> {
    return this.http
      .patch<{ user: UserDto }>(`/api/users/${id}`, request)
      .pipe(map((body) => body.user));
  }

  /** POST /api/users/:id/invitations: sends a fresh invitation link. */
  resendInvitation(id: number): Observable<void> {
    return this.http.post<void>(`/api/users/${id}/invitations`, {});
  }
}

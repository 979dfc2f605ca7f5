import { type Signal, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import type { UserDto } from '@keelson/contracts';
import { catchError, map, of } from 'rxjs';
import { UsersApi } from '../admin/users-api';
import { Session } from '../auth/session';

/** Someone who can own a register entry. */
export interface OwnerOption {
  readonly id: number;
  readonly name: string;
}

/**
 * The people an owner can be chosen from. Only admins may list users (GET /api/users), so for
 * everyone else this is null and the owner field shows read-only. Call it in an injection context.
 */
export function ownerOptions(): Signal<readonly OwnerOption[] | null> {
  const session = inject(Session);
  if (!session.hasRole('admin')) {
    return computed(() => null);
  }
  const users = toSignal(
    inject(UsersApi)
      .list({ limit: 200 })
      .pipe(
        map((page) => page.items.filter((user: UserDto) => user.isActive)),
        catchError(() => of([] as UserDto[])),
      ),
    { initialValue: [] as UserDto[] },
  );
  return computed(() => users().map((user) => ({ id: user.id, name: user.name })));
}

import type { KeelsonDatabase } from '@keelson/db';
import type { SessionUser } from '../http/auth-context';
import { UsersRepository } from '../users/users.repository';
import type { UsersService } from '../users/users.service';

/** The sender named in the first administrator's invitation. */
export const SYSTEM_ACTOR: SessionUser = {
  id: 0,
  email: 'keelson@localhost',
  name: 'Keelson set-up',
  role: 'admin',
  plantCodes: [],
};

/**
 * Outside demo mode there is no default account: when the workspace has no user at all, invite
 * `email` as administrator (the set-password link is e-mailed). Returns false when users exist.
 */
export async function inviteFirstAdmin(
  users: UsersService,
  db: KeelsonDatabase,
  email: string,
): Promise<boolean> {
  if (new UsersRepository(db).countAll() > 0) {
    return false;
  }
  const name = email.split('@')[0] || email;
  await users.invite(SYSTEM_ACTOR, { email, name, role: 'admin', plantCodes: [] });
  return true;
}

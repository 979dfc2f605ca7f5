import type { UserDto } from '@keelson/contracts';

/** Where an account stands: signed in before, waiting for its invitation, or switched off. */
export type UserStatus = 'active' | 'invited' | 'deactivated';

/** Labels for {@link UserStatus}. */
export const USER_STATUS_LABELS: Readonly<Record<UserStatus, string>> = {
  active: 'Active',
  invited: 'Invited',
  deactivated: 'Deactivated',
};

/** The status of an account; a deactivated account counts as deactivated even if invited. */
export function userStatus(user: Pick<UserDto, 'isActive' | 'isInvitePending'>): UserStatus {
  if (!user.isActive) {
    return 'deactivated';
  }
  return user.isInvitePending ? 'invited' : 'active';
}

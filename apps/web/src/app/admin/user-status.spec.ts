import { describe, expect, it } from 'vitest';
import { userStatus } from './user-status';

describe('userStatus', () => {
  it('is active for an active account that has set its password', () => {
    expect(userStatus({ isActive: true, isInvitePending: false })).toBe('active');
  });

  it('is invited while the invitation is open', () => {
    expect(userStatus({ isActive: true, isInvitePending: true })).toBe('invited');
  });

  it('is deactivated whenever the account is off, invitation or not', () => {
    expect(userStatus({ isActive: false, isInvitePending: false })).toBe('deactivated');
    expect(userStatus({ isActive: false, isInvitePending: true })).toBe('deactivated');
  });
});

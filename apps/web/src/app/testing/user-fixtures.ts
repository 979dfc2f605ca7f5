import type { Role, UserDto } from '@keelson/contracts';

/**
 * Users for the client's tests, shaped like `UserDto` answers of the API. Invented people; the
 * e-mail addresses follow the demo accounts' pattern.
 */
const BY_ROLE: Record<Role, Pick<UserDto, 'id' | 'email' | 'name' | 'plantCodes'>> = {
  admin: { id: 1, email: 'admin@demo.test', name: 'Alma Reyes', plantCodes: [] },
  buyer: { id: 2, email: 'buyer@demo.test', name: 'Bruno Keller', plantCodes: [] },
  risk_manager: { id: 3, email: 'risk@demo.test', name: 'Rania Okafor', plantCodes: [] },
  plant_manager: {
    id: 4,
    email: 'plant.north@demo.test',
    name: 'Pia Lindqvist',
    plantCodes: ['P-NORTH'],
  },
  viewer: { id: 6, email: 'viewer@demo.test', name: 'Vera Novak', plantCodes: [] },
};

/** An active user of the given role, with any field overridden. */
export function userWithRole(role: Role, overrides: Partial<UserDto> = {}): UserDto {
  return {
    ...BY_ROLE[role],
    role,
    isActive: true,
    isInvitePending: false,
    lastLoginAt: '2026-11-30T08:15:00.000Z',
    createdAt: '2026-11-01T09:00:00.000Z',
    ...overrides,
  };
}

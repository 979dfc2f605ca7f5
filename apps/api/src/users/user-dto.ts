import type { UserRow } from '@keelson/db';
import type { UserDto } from '@keelson/contracts';

/** The API view of a user row (never the password hash). */
export function toUserDto(row: UserRow, plantCodes: readonly string[]): UserDto {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    plantCodes: row.role === 'plant_manager' ? [...plantCodes] : [],
    isActive: row.isActive,
    isInvitePending: row.passwordHash === null,
    lastLoginAt: row.lastLoginAt,
    createdAt: row.createdAt,
  };
}

import type {
  InviteUserRequest,
  ListUsersQuery,
  Page,
  Role,
  UpdateUserRequest,
  UserDto,
} from '@keelson/contracts';
import type { UserRow } from '@keelson/db';
import type { AuditEvent } from '../audit/audit-trail';
import { AppError, conflict, invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { Mailer } from '../mail/mailer';
import type { PlantsRepository } from '../plants/plants.repository';
import { invitationEmail } from './invitation-email';
import type { InvitationRepository } from './invitation.repository';
import { createInvitationToken, INVITATION_TTL_MS } from './invitation-token';
import { toUserDto } from './user-dto';
import type { UsersRepository } from './users.repository';

/** What the users service needs. */
export interface UsersServiceDeps {
  users: UsersRepository;
  invitations: InvitationRepository;
  plants: PlantsRepository;
  mailer: Mailer;
  /** The app's public address, read when a link is made (it may follow the real port). */
  publicUrl: () => string;
  now: () => Date;
}

/** User administration: listing, inviting, changing role, plants and status, re-sending. */
export class UsersService {
  constructor(private readonly deps: UsersServiceDeps) {}

  /** A page of users matching the query. */
  list(query: ListUsersQuery): Page<UserDto> {
    const { rows, total } = this.deps.users.list(query);
    const plants = this.deps.users.plantCodesOf(rows.map((row) => row.id));
    return { items: rows.map((row) => toUserDto(row, plants.get(row.id) ?? [])), total };
  }

  /** One user; 404 when unknown. */
  get(id: number): UserDto {
    return this.dto(this.require(id));
  }

  /**
   * Creates the user without a password and e-mails a set-password link valid for 72 hours.
   * 409 `email_taken` when the address is in use; 400 when the plants do not fit the role.
   * Records `user.invited` (never the token) in the same transaction as the new user.
   */
  async invite(actor: SessionUser, request: InviteUserRequest): Promise<UserDto> {
    const plantCodes = this.checkPlants(request.role, unique(request.plantCodes));
    const now = this.deps.now();
    const stamp = now.toISOString();
    const user = this.deps.users.transaction(() => {
      if (this.deps.users.findByEmail(request.email)) {
        throw conflict('email_taken', `There is already a user with e-mail ${request.email}.`);
      }
      const row = this.deps.users.insert({
        email: request.email,
        name: request.name,
        role: request.role,
        passwordHash: null,
        isActive: true,
        createdAt: stamp,
        updatedAt: stamp,
      });
      this.deps.users.replacePlants(row.id, plantCodes);
      // Never the invitation token or a password hash: who was invited, as what.
      this.deps.users.audit({ action: 'user.invited', subjectType: 'user', subjectId: row.id,
        userId: actorId(actor), before: null,
        after: { email: row.email, name: row.name, role: row.role, plantCodes } }, now);
      return row;
    });
    await this.sendInvitation(actor, user, false);
    return this.dto(user);
  }

  /**
   * Changes name, role, plants or status. An administrator cannot demote or deactivate
   * themself (409 `self_change_refused`); plants must exist and belong to a plant manager.
   * What really changed is recorded in the audit trail in the same transaction.
   */
  update(actor: SessionUser, id: number, changes: UpdateUserRequest): UserDto {
    const current = this.require(id);
    const role = changes.role ?? current.role;
    if (actor.id === id && (role !== 'admin' || changes.isActive === false)) {
      throw conflict(
        'self_change_refused',
        'You cannot remove your own administrator role or deactivate yourself; ask another ' +
          'administrator.',
      );
    }
    const currentPlants = this.deps.users.plantCodesOf([id]).get(id) ?? [];
    let plantCodes: string[] | undefined;
    if (changes.plantCodes !== undefined) {
      plantCodes = this.checkPlants(role, unique(changes.plantCodes));
    } else if (role !== current.role) {
      // A new role keeps the plants only when it is still plant manager.
      plantCodes = this.checkPlants(role, role === 'plant_manager' ? currentPlants : []);
    }
    const now = this.deps.now();
    const updated = this.deps.users.transaction(() => {
      const row = this.deps.users.update(id, {
        ...(changes.name !== undefined ? { name: changes.name } : {}),
        ...(changes.role !== undefined ? { role: changes.role } : {}),
        ...(changes.isActive !== undefined ? { isActive: changes.isActive } : {}),
        updatedAt: now.toISOString(),
      });
      if (plantCodes !== undefined) {
        this.deps.users.replacePlants(id, plantCodes);
      }
      const plantsAfter = plantCodes ?? currentPlants;
      for (const event of userChangeEvents(current, currentPlants, row!, plantsAfter)) {
        this.deps.users.audit({ ...event, subjectType: 'user', subjectId: id,
          userId: actorId(actor) }, now);
      }
      return row!;
    });
    return this.dto(updated);
  }

  /** Sends a fresh invitation (closing older ones); 409 when the user already set a password. */
  async resendInvitation(actor: SessionUser, id: number): Promise<void> {
    const user = this.require(id);
    if (user.passwordHash !== null) {
      throw conflict('already_active', `${user.email} has already set a password.`);
    }
    if (!user.isActive) {
      throw conflict('user_inactive', `${user.email} is deactivated; reactivate them first.`);
    }
    await this.sendInvitation(actor, user, true);
  }

  private async sendInvitation(actor: SessionUser, user: UserRow, isReminder: boolean) {
    const now = this.deps.now();
    const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
    const { token, tokenHash } = createInvitationToken();
    this.deps.users.transaction(() => {
      this.deps.invitations.closeOpenFor(user.id, now.toISOString());
      this.deps.invitations.create({
        userId: user.id,
        tokenHash,
        createdAt: now.toISOString(),
        expiresAt: expiresAt.toISOString(),
      });
    });
    const link = `${this.deps.publicUrl()}/set-password?token=${encodeURIComponent(token)}`;
    const mail = invitationEmail({
      to: user.email,
      name: user.name,
      role: user.role,
      link,
      expiresAt,
      invitedBy: actor.name,
      isReminder,
    });
    try {
      await this.deps.mailer.send(mail);
    } catch (error) {
      throw new AppError(
        'mail_not_sent',
        502,
        `The invitation for ${user.email} is saved, but the e-mail could not be sent ` +
          `(${(error as Error).message}). Re-send it once mail works.`,
      );
    }
  }

  /** Plants fit the role: at least one (existing) for a plant manager, none for others. */
  private checkPlants(role: Role, plantCodes: string[]): string[] {
    if (role !== 'plant_manager') {
      if (plantCodes.length > 0) {
        throw invalidRequest('Only plant managers have plants; leave plantCodes empty.', {
          issues: [{ path: 'body.plantCodes', message: 'Only plant managers have plants.' }],
        });
      }
      return [];
    }
    if (plantCodes.length === 0) {
      throw invalidRequest('A plant manager needs at least one plant.', {
        issues: [{ path: 'body.plantCodes', message: 'Give at least one plant.' }],
      });
    }
    const existing = this.deps.plants.existingCodes(plantCodes);
    const unknown = plantCodes.filter((code) => !existing.has(code));
    if (unknown.length > 0) {
      throw invalidRequest(`Unknown plant ${unknown.join(', ')}.`, {
        issues: unknown.map((code) => ({
          path: `body.plantCodes.${plantCodes.indexOf(code)}`,
          message: `There is no plant with code ${code}.`,
        })),
      });
    }
    return plantCodes;
  }

  private require(id: number): UserRow {
    const row = this.deps.users.findById(id);
    if (!row) {
      throw notFound(`There is no user with id ${id}.`);
    }
    return row;
  }

  private dto(row: UserRow): UserDto {
    return toUserDto(row, this.deps.users.plantCodesOf([row.id]).get(row.id) ?? []);
  }
}

/** The audit's user id of an actor; the set-up actor (id 0) is the system. */
function actorId(actor: SessionUser): number | null {
  return actor.id > 0 ? actor.id : null;
}

type UserChangeEvent = Pick<AuditEvent, 'action' | 'before' | 'after'>;

/**
 * The audit events of one update, only for what really changed: `user.updated` (name),
 * `user.role_changed` (role or plants, both before and after), `user.deactivated` or
 * `user.reactivated`.
 */
function userChangeEvents(
  before: UserRow,
  plantsBefore: readonly string[],
  after: UserRow,
  plantsAfter: readonly string[],
): UserChangeEvent[] {
  const events: UserChangeEvent[] = [];
  if (after.name !== before.name || after.email !== before.email) {
    const keys = (['name', 'email'] as const).filter((key) => after[key] !== before[key]);
    events.push({ action: 'user.updated',
      before: Object.fromEntries(keys.map((key) => [key, before[key]])),
      after: Object.fromEntries(keys.map((key) => [key, after[key]])) });
  }
  const samePlants = [...plantsBefore].sort().join() === [...plantsAfter].sort().join();
  if (after.role !== before.role || !samePlants) {
    events.push({ action: 'user.role_changed',
      before: { role: before.role, plantCodes: [...plantsBefore] },
      after: { role: after.role, plantCodes: [...plantsAfter] } });
  }
  if (after.isActive !== before.isActive) {
    events.push({ action: after.isActive ? 'user.reactivated' : 'user.deactivated',
      before: { isActive: before.isActive }, after: { isActive: after.isActive } });
  }
  return events;
}

function unique(values: readonly string[]): string[] {
  return [...new Set(values)];
}

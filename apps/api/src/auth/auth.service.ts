import type { InvitationDto, LoginResponse, UserDto } from '@keelson/contracts';
import type { InvitationRow, UserRow } from '@keelson/db';
import { AppError, invalidRequest, notFound } from '../http/app-error';
import type { SessionResolution } from '../http/authenticate';
import type { InvitationRepository } from '../users/invitation.repository';
import { hashInvitationToken } from '../users/invitation-token';
import { toUserDto } from '../users/user-dto';
import type { UsersRepository } from '../users/users.repository';
import { isTooLongForBcrypt, type PasswordHasher } from './password-hasher';
import { SessionTokenError, type SessionTokens } from './session-token';

/** The one answer to every refused sign-in, whatever the reason. */
export const LOGIN_REFUSED_MESSAGE = 'E-mail or password is not right.';

/** What the auth service needs. */
export interface AuthServiceDeps {
  users: UsersRepository;
  invitations: InvitationRepository;
  hasher: PasswordHasher;
  tokens: SessionTokens;
  now: () => Date;
}

/** Sign-in, sessions and accepting invitations. */
export class AuthService {
  constructor(private readonly deps: AuthServiceDeps) {}

  /**
   * Checks the e-mail and password and starts a session. Unknown e-mail, wrong password,
   * deactivated and not-yet-activated accounts all answer the same 401 after a bcrypt
   * comparison of the same cost, so neither message nor timing tells them apart.
   */
  async login(email: string, password: string): Promise<LoginResponse> {
    const user = this.deps.users.findByEmail(email);
    const matches = user?.passwordHash
      ? await this.deps.hasher.verify(password, user.passwordHash)
      : await this.deps.hasher.verifyAgainstDummy(password);
    if (!user || !matches || !user.isActive) {
      throw new AppError('login_refused', 401, LOGIN_REFUSED_MESSAGE);
    }
    const stamp = this.deps.now().toISOString();
    const updated = this.deps.users.update(user.id, { lastLoginAt: stamp, updatedAt: stamp })!;
    return { user: this.dto(updated), token: this.deps.tokens.sign(user.id, user.role) };
  }

  /**
   * Verifies a token and re-reads its user, so a deactivated user or a changed role takes effect
   * on the next request, whatever the token says.
   */
  resolveSession(token: string): SessionResolution {
    let userId: number;
    try {
      userId = this.deps.tokens.verify(token).userId;
    } catch (error) {
      if (error instanceof SessionTokenError) return { failure: error.message };
      throw error;
    }
    const user = this.deps.users.findById(userId);
    if (!user || !user.isActive || user.passwordHash === null) {
      return { failure: 'The account of this session is not active.' };
    }
    const plantCodes = this.deps.users.plantCodesOf([user.id]).get(user.id) ?? [];
    return {
      user: {
        id: user.id,
        email: user.email,
        name: user.name,
        role: user.role,
        plantCodes: user.role === 'plant_manager' ? plantCodes : [],
      },
    };
  }

  /** The current user as the API shows it. */
  me(userId: number): UserDto {
    const user = this.deps.users.findById(userId);
    if (!user) throw notFound(`There is no user with id ${userId}.`);
    return this.dto(user);
  }

  /** The invitation behind a token: 404 when unknown, 410 when used or expired. */
  invitation(token: string): InvitationDto {
    const { invitation, user } = this.openInvitation(token);
    return { email: user.email, name: user.name, expiresAt: invitation.expiresAt };
  }

  /** Accepts an invitation: sets the password and closes the invitation (the token works once). */
  async setPassword(token: string, password: string): Promise<UserDto> {
    if (isTooLongForBcrypt(password)) {
      throw invalidRequest('Use a password of at most 72 bytes.', {
        issues: [{ path: 'body.password', message: 'At most 72 bytes (UTF-8).' }],
      });
    }
    const { invitation, user } = this.openInvitation(token);
    const hash = await this.deps.hasher.hash(password);
    const stamp = this.deps.now().toISOString();
    const updated = this.deps.users.transaction(() => {
      if (!this.deps.invitations.markUsed(invitation.id, stamp)) {
        throw gone('This invitation link has already been used.');
      }
      return this.deps.users.update(user.id, { passwordHash: hash, updatedAt: stamp })!;
    });
    return this.dto(updated);
  }

  private openInvitation(token: string): { invitation: InvitationRow; user: UserRow } {
    const invitation = this.deps.invitations.findByTokenHash(hashInvitationToken(token));
    const user = invitation && this.deps.users.findById(invitation.userId);
    if (!invitation || !user) {
      throw notFound('This invitation link is not known. Ask an administrator for a new one.');
    }
    if (invitation.usedAt !== null) {
      throw gone('This invitation link has already been used or replaced by a newer one.');
    }
    if (Date.parse(invitation.expiresAt) <= this.deps.now().getTime()) {
      throw gone('This invitation link has expired. Ask an administrator to send a new one.');
    }
    if (!user.isActive) {
      throw gone('This account has been deactivated. Ask an administrator.');
    }
    return { invitation, user };
  }

  private dto(row: UserRow): UserDto {
    return toUserDto(row, this.deps.users.plantCodesOf([row.id]).get(row.id) ?? []);
  }
}

function gone(message: string): AppError {
  return new AppError('invitation_gone', 410, message);
}

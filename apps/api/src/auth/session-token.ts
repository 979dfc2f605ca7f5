import jwt from 'jsonwebtoken';
import { roleSchema, type Role } from '@keelson/contracts';

/** A session lasts 8 hours. */
export const SESSION_TTL_SECONDS = 8 * 60 * 60;

/** The verified claims of a session token. */
export interface SessionClaims {
  userId: number;
  role: Role;
}

/** Why a token was refused. */
export class SessionTokenError extends Error {
  override readonly name = 'SessionTokenError';
}

/** Signs and verifies session tokens: JWT, HS256 only, claims `sub` (user id) and `role`. */
export class SessionTokens {
  constructor(
    private readonly secret: string,
    private readonly ttlSeconds: number = SESSION_TTL_SECONDS,
  ) {}

  /** A token for the user, valid for the session lifetime. */
  sign(userId: number, role: Role): string {
    return jwt.sign({ role }, this.secret, {
      algorithm: 'HS256',
      subject: String(userId),
      expiresIn: this.ttlSeconds,
    });
  }

  /** The claims of a valid token; throws {@link SessionTokenError} for any other. */
  verify(token: string): SessionClaims {
    let payload: string | jwt.JwtPayload;
    try {
      payload = jwt.verify(token, this.secret, { algorithms: ['HS256'] });
    } catch (error) {
      const reason = error instanceof jwt.TokenExpiredError ? 'expired' : 'not valid';
      throw new SessionTokenError(`The session token is ${reason}.`);
    }
    if (typeof payload === 'string' || !payload.sub || !/^[1-9]\d*$/.test(payload.sub)) {
      throw new SessionTokenError('The session token names no user.');
    }
    const role = roleSchema.safeParse(payload.role);
    if (!role.success) {
      throw new SessionTokenError('The session token names no known role.');
    }
    return { userId: Number(payload.sub), role: role.data };
  }
}

import { createHash, randomBytes } from 'node:crypto';

/** How long an invitation link stays valid: 72 hours. */
export const INVITATION_TTL_MS = 72 * 60 * 60 * 1000;

/** A new invitation token and the hash stored for it. */
export interface InvitationToken {
  /** Sent in the e-mail link only; never stored. */
  token: string;
  tokenHash: string;
}

/** SHA-256 (hex) of a token: what the database keeps. */
export function hashInvitationToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** 32 random bytes, base64url (43 characters), with its hash. */
export function createInvitationToken(): InvitationToken {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashInvitationToken(token) };
}

import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';

/** bcrypt reads at most this many bytes of a password; longer ones are refused, not cut. */
export const BCRYPT_MAX_PASSWORD_BYTES = 72;

/** Hashes and checks passwords with bcrypt. */
export interface PasswordHasher {
  hash(password: string): Promise<string>;
  verify(password: string, hash: string): Promise<boolean>;
  /**
   * Spends the same time as a real check against a hash made at startup, so an unknown e-mail
   * answers as slowly as a known one. Always false.
   */
  verifyAgainstDummy(password: string): Promise<false>;
}

/** A bcrypt {@link PasswordHasher} with `cost` (12 normally, 4 in test mode). */
export function createPasswordHasher(cost: number): PasswordHasher {
  let dummyHash: string | undefined;
  return {
    hash: (password) => bcrypt.hash(password, cost),
    verify: (password, hash) => bcrypt.compare(password, hash),
    async verifyAgainstDummy(password) {
      dummyHash ??= await bcrypt.hash(randomBytes(24).toString('base64url'), cost);
      await bcrypt.compare(password, dummyHash);
      return false;
    },
  };
}

/** True when the password is longer than bcrypt can read. */
export function isTooLongForBcrypt(password: string): boolean {
  return Buffer.byteLength(password, 'utf8') > BCRYPT_MAX_PASSWORD_BYTES;
}

import { randomBytes } from 'node:crypto';
import { chmodSync, mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import type { KeelsonMode } from '@keelson/contracts';

/** Bytes of randomness in a generated secret. */
export const GENERATED_SECRET_BYTES = 48;

/** What {@link resolveJwtSecret} needs. */
export interface JwtSecretInput {
  mode: KeelsonMode;
  /** JWT_SECRET from the environment, if set. */
  given: string | undefined;
  /** Where demo mode keeps its generated secret. */
  secretFile: string;
}

/** The secret and where it came from. */
export interface ResolvedJwtSecret {
  secret: string;
  source: 'environment' | 'file' | 'generated-for-test';
}

/**
 * Picks the secret that signs session tokens: the given one when set; in test mode a fresh
 * random one per process; in demo mode the one stored in `secretFile`, created with mode 0600 on
 * first start. Production never reaches the file branch (the config refuses to start first).
 */
export function resolveJwtSecret(input: JwtSecretInput): ResolvedJwtSecret {
  if (input.given) {
    return { secret: input.given, source: 'environment' };
  }
  if (input.mode === 'test') {
    return {
      secret: randomBytes(GENERATED_SECRET_BYTES).toString('base64url'),
      source: 'generated-for-test',
    };
  }
  if (input.mode === 'production') {
    throw new Error('JWT_SECRET is required in production mode.');
  }
  return { secret: readOrCreateSecretFile(input.secretFile), source: 'file' };
}

function readOrCreateSecretFile(path: string): string {
  try {
    const stored = readFileSync(path, 'utf8').trim();
    if (stored.length >= 32) {
      // Tighten the permissions if someone loosened them.
      if ((statSync(path).mode & 0o077) !== 0) {
        chmodSync(path, 0o600);
      }
      return stored;
    }
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') {
      throw new Error(`Cannot read the session secret ${path}: ${(error as Error).message}`);
    }
  }
  mkdirSync(dirname(path), { recursive: true });
  const secret = randomBytes(GENERATED_SECRET_BYTES).toString('base64url');
  writeFileSync(path, `${secret}\n`, { mode: 0o600 });
  chmodSync(path, 0o600);
  return secret;
}

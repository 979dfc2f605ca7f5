import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { REPOSITORY_ROOT } from './app-config';

let cached: string | undefined;

/** The version in the repository's package.json, read once. */
export function appVersion(): string {
  if (cached === undefined) {
    const manifest = JSON.parse(readFileSync(resolve(REPOSITORY_ROOT, 'package.json'), 'utf8'));
    cached = typeof manifest.version === 'string' ? manifest.version : '0.0.0';
  }
  return cached as string;
}

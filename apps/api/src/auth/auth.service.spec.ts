import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IN_MEMORY, openDatabase, type OpenDatabase } from '@keelson/db';
import { AppError } from '../http/app-error';
import { InvitationRepository } from '../users/invitation.repository';
import { UsersRepository } from '../users/users.repository';
import { AuthService, LOGIN_REFUSED_MESSAGE } from './auth.service';
import { createPasswordHasher, type PasswordHasher } from './password-hasher';
import { SessionTokens } from './session-token';

/** Counts the bcrypt comparisons each sign-in makes (the cost of the answer). */
function countingHasher(inner: PasswordHasher) {
  const calls = { real: 0, dummy: 0 };
  const hasher: PasswordHasher = {
    hash: inner.hash,
    async verify(password, hash) {
      calls.real += 1;
      return inner.verify(password, hash);
    },
    async verifyAgainstDummy(password) {
      calls.dummy += 1;
      return inner.verifyAgainstDummy(password);
    },
  };
  return { hasher, calls };
}

let database: OpenDatabase;
let service: AuthService;
let calls: { real: number; dummy: number };

beforeAll(async () => {
  database = openDatabase(IN_MEMORY);
  const inner = createPasswordHasher(4);
  const hash = await inner.hash('correct horse');
  const users = new UsersRepository(database.db);
  const base = { createdAt: 'x', updatedAt: 'x' };
  users.insert({ ...base, email: 'on@x.test', name: 'On', role: 'viewer', passwordHash: hash });
  users.insert({
    ...base,
    email: 'off@x.test',
    name: 'Off',
    role: 'viewer',
    passwordHash: hash,
    isActive: false,
  });
  users.insert({ ...base, email: 'new@x.test', name: 'New', role: 'viewer', passwordHash: null });
  const counting = countingHasher(inner);
  calls = counting.calls;
  service = new AuthService({
    users,
    invitations: new InvitationRepository(database.db),
    hasher: counting.hasher,
    tokens: new SessionTokens('s'.repeat(40)),
    now: () => new Date('2026-01-01T00:00:00Z'),
  });
});
afterAll(() => database.close());

describe('AuthService.login', () => {
  it.each([
    ['wrong password', 'on@x.test', 'wrong', { real: 1, dummy: 0 }],
    ['unknown e-mail', 'nobody@x.test', 'correct horse', { real: 0, dummy: 1 }],
    ['deactivated account', 'off@x.test', 'correct horse', { real: 1, dummy: 0 }],
    ['account without password', 'new@x.test', 'correct horse', { real: 0, dummy: 1 }],
  ])(
    'refuses a %s after exactly one bcrypt comparison of the same cost',
    async (_case, email, password, expected) => {
      calls.real = 0;
      calls.dummy = 0;
      const failure = await service.login(email, password).catch((error: unknown) => error);
      expect(failure).toBeInstanceOf(AppError);
      expect((failure as AppError).status).toBe(401);
      expect((failure as AppError).message).toBe(LOGIN_REFUSED_MESSAGE);
      expect(calls).toEqual(expected);
    },
  );

  it('starts a session for the right password', async () => {
    const answer = await service.login('on@x.test', 'correct horse');
    expect(answer.user.email).toBe('on@x.test');
    const resolved = service.resolveSession(answer.token);
    expect('user' in resolved && resolved.user.email).toBe('on@x.test');
  });
});

describe('createPasswordHasher', () => {
  it('makes bcrypt hashes at the given cost that verify only the right password', async () => {
    const hasher = createPasswordHasher(4);
    const hash = await hasher.hash('secret one');
    // bcrypt's modular crypt format: $2b$<cost>$ (bcryptjs writes 2b).
    expect(hash).toMatch(/^\$2[aby]\$04\$/);
    expect(await hasher.verify('secret one', hash)).toBe(true);
    expect(await hasher.verify('secret two', hash)).toBe(false);
    expect(await hasher.verifyAgainstDummy('secret one')).toBe(false);
  });
});

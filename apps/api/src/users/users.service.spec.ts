import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { asc, eq } from 'drizzle-orm';
import {
  IN_MEMORY,
  auditEvents,
  openDatabase,
  plants,
  users,
  type OpenDatabase,
} from '@keelson/db';
import { AppError } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { Mailer, OutgoingMail } from '../mail/mailer';
import { PlantsRepository } from '../plants/plants.repository';
import { InvitationRepository } from './invitation.repository';
import { UsersRepository } from './users.repository';
import { UsersService } from './users.service';

// The acting administrator; stored in beforeAll, since the audit trail points at real users.
const ADMIN: SessionUser = {
  id: 0,
  email: 'admin@x.test',
  name: 'Ada Admin',
  role: 'admin',
  plantCodes: [],
};

let database: OpenDatabase;
let sent: OutgoingMail[];
let isMailDown: boolean;
let service: UsersService;

beforeAll(() => {
  database = openDatabase(IN_MEMORY);
  const stamp = '2026-04-01T09:00:00.000Z';
  ADMIN.id = database.db.insert(users).values({ email: ADMIN.email, name: ADMIN.name,
    role: 'admin', passwordHash: 'not-a-real-hash', isActive: true, createdAt: stamp,
    updatedAt: stamp }).returning().get().id;
  sent = [];
  isMailDown = false;
  const mailer: Mailer = {
    async send(mail) {
      if (isMailDown) throw new Error('connect ECONNREFUSED 127.0.0.1:25');
      sent.push(mail);
    },
    close() {},
  };
  service = new UsersService({
    users: new UsersRepository(database.db),
    invitations: new InvitationRepository(database.db),
    plants: new PlantsRepository(database.db),
    mailer,
    publicUrl: () => 'https://keelson.example',
    now: () => new Date('2026-04-01T10:00:00.000Z'),
  });
});
afterAll(() => database.close());

describe('UsersService.invite', () => {
  it('e-mails a text and an HTML part that both carry the set-password link', async () => {
    await service.invite(ADMIN, {
      email: 'o@x.test',
      name: 'Olga <Ops> & Co',
      role: 'viewer',
      plantCodes: [],
    });
    const mail = sent.at(-1)!;
    expect(mail.to).toEqual(['o@x.test']);
    const link = /https:\/\/keelson\.example\/set-password\?token=[\w-]{43}/.exec(mail.text)?.[0];
    expect(link).toBeDefined();
    expect(mail.html).toContain(`href="${link}"`);
    // The name is escaped in the HTML part.
    expect(mail.html).toContain('Olga &#60;Ops&#62; &#38; Co');
    expect(mail.text).toContain('until 2026-04-04 10:00 UTC');
  });

  it('keeps the user and answers 502 naming the address when the mail server is down', async () => {
    isMailDown = true;
    try {
      const failure = await service
        .invite(ADMIN, { email: 'm@x.test', name: 'Mo', role: 'buyer', plantCodes: [] })
        .catch((error: unknown) => error);
      expect(failure).toBeInstanceOf(AppError);
      expect((failure as AppError).status).toBe(502);
      expect((failure as AppError).message).toContain('m@x.test');
    } finally {
      isMailDown = false;
    }
    const stored = new UsersRepository(database.db).findByEmail('m@x.test');
    expect(stored?.passwordHash).toBeNull();
    // Re-sending works once mail is back.
    await service.resendInvitation(ADMIN, stored!.id);
    expect(sent.at(-1)!.subject).toBe('Reminder: set your Keelson password');
  });

  it('refuses to re-send to a deactivated user', async () => {
    const user = await service.invite(ADMIN, {
      email: 'd@x.test',
      name: 'Dee',
      role: 'viewer',
      plantCodes: [],
    });
    service.update(ADMIN, user.id, { isActive: false });
    const failure = await service.resendInvitation(ADMIN, user.id).catch((error) => error);
    expect((failure as AppError).code).toBe('user_inactive');
  });
});

describe('the audit trail of user changes', () => {
  const trailOf = (userId: number) => database.db.select().from(auditEvents)
    .where(eq(auditEvents.subjectId, String(userId))).orderBy(asc(auditEvents.id)).all()
    .filter((event) => event.subjectType === 'user');

  it('records an invitation with who was invited, as what, and no token', async () => {
    const user = await service.invite(ADMIN, {
      email: 'Ivy@X.test', name: 'Ivy', role: 'viewer', plantCodes: [] });
    const events = trailOf(user.id);
    expect(events.map((event) => [event.action, event.userId])).toEqual([
      ['user.invited', ADMIN.id]]);
    expect(events[0]!.before).toBeNull();
    expect(events[0]!.after).toEqual({ email: 'ivy@x.test', name: 'Ivy', role: 'viewer',
      plantCodes: [] });
    // The set-password link's token is in the e-mail only.
    const token = /token=([\w-]{43})/.exec(sent.at(-1)!.text)![1]!;
    expect(JSON.stringify(events)).not.toContain(token);
  });

  it('records a name edit, role and plant changes, deactivating and reactivating', async () => {
    database.db.insert(plants).values([{ code: 'P-A', name: 'Plant A', country: 'DE' },
      { code: 'P-B', name: 'Plant B', country: 'SE' }]).run();
    const user = await service.invite(ADMIN, {
      email: 'rolf@x.test', name: 'Rolf', role: 'buyer', plantCodes: [] });
    service.update(ADMIN, user.id, { name: 'Rolf Berg' });
    service.update(ADMIN, user.id, { role: 'plant_manager', plantCodes: ['P-B', 'P-A'] });
    service.update(ADMIN, user.id, { plantCodes: ['P-A'] });
    service.update(ADMIN, user.id, { isActive: false });
    service.update(ADMIN, user.id, { isActive: true, name: 'Rolf Berg' });

    const events = trailOf(user.id);
    expect(events.map((event) => [event.action, event.before, event.after])).toEqual([
      ['user.invited', null, { email: 'rolf@x.test', name: 'Rolf', role: 'buyer',
        plantCodes: [] }],
      ['user.updated', { name: 'Rolf' }, { name: 'Rolf Berg' }],
      ['user.role_changed', { role: 'buyer', plantCodes: [] },
        { role: 'plant_manager', plantCodes: ['P-B', 'P-A'] }],
      ['user.role_changed', { role: 'plant_manager', plantCodes: ['P-A', 'P-B'] },
        { role: 'plant_manager', plantCodes: ['P-A'] }],
      ['user.deactivated', { isActive: true }, { isActive: false }],
      // The unchanged name is not recorded again.
      ['user.reactivated', { isActive: false }, { isActive: true }],
    ]);
    expect(new Set(events.map((event) => event.userId))).toEqual(new Set([ADMIN.id]));
    expect(JSON.stringify(events)).not.toMatch(/passwordHash|hash/i);
  });

  it('records nothing when a refused change leaves the user as they were', async () => {
    const user = await service.invite(ADMIN, {
      email: 'nia@x.test', name: 'Nia', role: 'viewer', plantCodes: [] });
    expect(() => service.update(ADMIN, user.id, { role: 'plant_manager', plantCodes: ['P-X'] }))
      .toThrow(/Unknown plant P-X/);
    expect(trailOf(user.id).map((event) => event.action)).toEqual(['user.invited']);
  });
});

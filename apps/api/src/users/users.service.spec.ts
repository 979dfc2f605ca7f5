import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IN_MEMORY, openDatabase, type OpenDatabase } from '@keelson/db';
import { AppError } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { Mailer, OutgoingMail } from '../mail/mailer';
import { PlantsRepository } from '../plants/plants.repository';
import { InvitationRepository } from './invitation.repository';
import { UsersRepository } from './users.repository';
import { UsersService } from './users.service';

const ADMIN: SessionUser = {
  id: 999,
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

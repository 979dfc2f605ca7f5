import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UserDto } from '@keelson/contracts';
import { createTestApp, type TestApp } from '../testing/test-app';
import { INVITATION_TTL_MS } from './invitation-token';

let t: TestApp;
let admin: string;

beforeAll(async () => {
  t = await createTestApp();
  admin = `Bearer ${t.tokenFor('admin@demo.test')}`;
});
afterAll(() => t.close());

const api = () => request(t.app);

function listUsers(query: string) {
  return api().get(`/api/users?${query}`).set('Authorization', admin);
}

/** The token in the newest stored message's link (what the person clicks). */
function latestLinkToken(to: string): { token: string; text: string; html: string } {
  const row = t.database.sqlite
    .prepare(
      `select text, html from mail_messages where to_addresses like ? order by id desc limit 1`,
    )
    .get(`%${to}%`) as { text: string; html: string } | undefined;
  if (!row) throw new Error(`No e-mail to ${to} was stored.`);
  const match = /http:\/\/keelson\.test:4200\/set-password\?token=([A-Za-z0-9_-]+)/.exec(row.text);
  if (!match) throw new Error(`No set-password link in: ${row.text}`);
  return { token: match[1]!, text: row.text, html: row.html };
}

describe('GET /api/users', () => {
  it('lists every demo user sorted by name, with plants for plant managers', async () => {
    const response = await listUsers('');
    expect(response.status).toBe(200);
    expect(response.body.total).toBe(7);
    const names = response.body.items.map((user: UserDto) => user.name);
    expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b)));
    const pia = response.body.items.find((user: UserDto) => user.name === 'Pia Lindqvist');
    expect(pia.plantCodes).toEqual(['P-NORTH']);
  });

  it('filters by role and by text in name or e-mail', async () => {
    const managers = await listUsers('role=plant_manager');
    expect(managers.body.items.map((user: UserDto) => user.email).sort()).toEqual([
      'plant.east@demo.test',
      'plant.north@demo.test',
      'plant.south@demo.test',
    ]);
    const byName = await listUsers('q=okaf');
    expect(byName.body.items.map((user: UserDto) => user.email)).toEqual(['risk@demo.test']);
    const byEmail = await listUsers('q=BUYER@');
    expect(byEmail.body.total).toBe(1);
    // A LIKE wildcard is searched for literally.
    expect((await listUsers('q=%25')).body.total).toBe(0);
  });

  it('sorts by e-mail descending and pages', async () => {
    const response = await listUsers('sort=email&order=desc&limit=2&offset=1');
    expect(response.body.total).toBe(7);
    expect(response.body.items.map((user: UserDto) => user.email)).toEqual([
      'risk@demo.test',
      'plant.south@demo.test',
    ]);
  });

  it('refuses an unknown sort field naming the query parameter', async () => {
    const response = await listUsers('sort=password');
    expect(response.status).toBe(400);
    expect(response.body.error.details.issues[0].path).toBe('query.sort');
  });

  it('refuses a viewer with 403 naming the needed role', async () => {
    const response = await api()
      .get('/api/users')
      .set('Authorization', `Bearer ${t.tokenFor('viewer@demo.test')}`);
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(response.body.error.message).toMatch(/Administrator/);
  });
});

describe('invitations', () => {
  it('invites through the real SMTP sink; the link sets a password once', async () => {
    const invited = await api()
      .post('/api/users/invitations')
      .set('Authorization', admin)
      .send({ email: 'New.Person@Demo.test', name: 'Nora New', role: 'buyer' });
    expect(invited.status).toBe(201);
    expect(invited.body.user).toMatchObject({
      email: 'new.person@demo.test',
      role: 'buyer',
      isInvitePending: true,
      isActive: true,
    });

    const stored = t.mail.list(10, 0).rows[0]!;
    expect(stored.toAddresses).toEqual(['new.person@demo.test']);
    expect(stored.subject).toBe('You are invited to Keelson');
    expect(stored.fromAddress).toContain(t.config.mailFrom);
    const { token, html } = latestLinkToken('new.person@demo.test');
    expect(html).toContain(`/set-password?token=${token}`);
    // Only the SHA-256 of the token is stored.
    const hashes = t.database.sqlite.prepare('select token_hash from invitations').pluck().all();
    expect(hashes).not.toContain(token);

    // The invited person cannot sign in yet.
    const early = await api()
      .post('/api/auth/login')
      .set('x-keelson-csrf', '1')
      .send({ email: 'new.person@demo.test', password: 'anything-at-all' });
    expect(early.status).toBe(401);

    const lookup = await api().get(`/api/auth/invitations/${token}`);
    expect(lookup.status).toBe(200);
    expect(lookup.body).toEqual({
      email: 'new.person@demo.test',
      name: 'Nora New',
      expiresAt: new Date(t.clock.now.getTime() + INVITATION_TTL_MS).toISOString(),
    });

    const set = await api()
      .post('/api/auth/set-password')
      .set('x-keelson-csrf', '1')
      .send({ token, password: 'a long new password' });
    expect(set.status).toBe(200);
    expect(set.body.user.isInvitePending).toBe(false);

    const again = await api()
      .post('/api/auth/set-password')
      .set('x-keelson-csrf', '1')
      .send({ token, password: 'another password!' });
    expect(again.status).toBe(410);
    expect((await api().get(`/api/auth/invitations/${token}`)).status).toBe(410);

    const signedIn = await api()
      .post('/api/auth/login')
      .set('x-keelson-csrf', '1')
      .send({ email: 'new.person@demo.test', password: 'a long new password' });
    expect(signedIn.status).toBe(200);
  });

  it('refuses an expired invitation with 410 and an unknown one with 404', async () => {
    await api()
      .post('/api/users/invitations')
      .set('Authorization', admin)
      .send({ email: 'late@demo.test', name: 'Lars Late', role: 'viewer' });
    const { token } = latestLinkToken('late@demo.test');
    const started = t.clock.now;
    t.clock.now = new Date(started.getTime() + INVITATION_TTL_MS + 1000);
    try {
      const lookup = await api().get(`/api/auth/invitations/${token}`);
      expect(lookup.status).toBe(410);
      expect(lookup.body.error.message).toMatch(/expired/);
      const set = await api()
        .post('/api/auth/set-password')
        .set('x-keelson-csrf', '1')
        .send({ token, password: 'too late for this' });
      expect(set.status).toBe(410);
    } finally {
      t.clock.now = started;
    }
    expect((await api().get('/api/auth/invitations/unknown-token-123')).status).toBe(404);
  });

  it('re-sends an invitation: the old link stops working, the new one works', async () => {
    await api()
      .post('/api/users/invitations')
      .set('Authorization', admin)
      .send({ email: 'again@demo.test', name: 'Ada Again', role: 'viewer' });
    const first = latestLinkToken('again@demo.test').token;
    const resent = await api()
      .post(`/api/users/${t.userId('again@demo.test')}/invitations`)
      .set('Authorization', admin);
    expect(resent.status).toBe(204);
    const second = latestLinkToken('again@demo.test');
    expect(second.token).not.toBe(first);
    expect(second.text).toContain('Alma Reyes invited you');
    expect((await api().get(`/api/auth/invitations/${first}`)).status).toBe(410);
    expect((await api().get(`/api/auth/invitations/${second.token}`)).status).toBe(200);
  });

  it('answers 409 for an e-mail already in use (any case)', async () => {
    const response = await api()
      .post('/api/users/invitations')
      .set('Authorization', admin)
      .send({ email: 'BUYER@demo.test', name: 'Twin', role: 'buyer' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('email_taken');
  });

  it('requires existing plants for a plant manager and none for other roles', async () => {
    const unknown = await api()
      .post('/api/users/invitations')
      .set('Authorization', admin)
      .send({
        email: 'pm@demo.test',
        name: 'Pat',
        role: 'plant_manager',
        plantCodes: ['P-EAST', 'P-MOON'],
      });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details.issues).toEqual([
      { path: 'body.plantCodes.1', message: 'There is no plant with code P-MOON.' },
    ]);
    const none = await api()
      .post('/api/users/invitations')
      .set('Authorization', admin)
      .send({ email: 'pm@demo.test', name: 'Pat', role: 'plant_manager' });
    expect(none.status).toBe(400);
    const wrongRole = await api()
      .post('/api/users/invitations')
      .set('Authorization', admin)
      .send({ email: 'pm@demo.test', name: 'Pat', role: 'buyer', plantCodes: ['P-EAST'] });
    expect(wrongRole.status).toBe(400);
    // Nothing was created by the refused requests.
    expect((await listUsers('q=pm@demo')).body.total).toBe(0);
  });
});

describe('PATCH /api/users/:id', () => {
  it('changes the role and plants; leaving plant manager drops the plants', async () => {
    const id = t.userId('viewer@demo.test');
    const promoted = await api()
      .patch(`/api/users/${id}`)
      .set('Authorization', admin)
      .send({ role: 'plant_manager', plantCodes: ['P-EAST', 'P-SOUTH', 'P-EAST'] });
    expect(promoted.status).toBe(200);
    expect(promoted.body.user).toMatchObject({
      role: 'plant_manager',
      plantCodes: ['P-EAST', 'P-SOUTH'],
    });
    const back = await api()
      .patch(`/api/users/${id}`)
      .set('Authorization', admin)
      .send({ role: 'viewer' });
    expect(back.body.user).toMatchObject({ role: 'viewer', plantCodes: [] });
    const links = t.database.sqlite
      .prepare('select count(*) from user_plants where user_id = ?')
      .pluck()
      .get(id);
    expect(links).toBe(0);
  });

  it('takes effect on the next request of that user', async () => {
    const id = t.userId('buyer@demo.test');
    const token = t.tokenFor('buyer@demo.test');
    await api().patch(`/api/users/${id}`).set('Authorization', admin).send({ isActive: false });
    const me = await api().get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    expect(me.status).toBe(401);
    await api().patch(`/api/users/${id}`).set('Authorization', admin).send({ isActive: true });
    const meAgain = await api().get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    expect(meAgain.status).toBe(200);
  });

  it('refuses an administrator demoting or deactivating themself (409)', async () => {
    const self = t.userId('admin@demo.test');
    for (const body of [{ role: 'buyer' }, { isActive: false }]) {
      const response = await api()
        .patch(`/api/users/${self}`)
        .set('Authorization', admin)
        .send(body);
      expect(response.status).toBe(409);
      expect(response.body.error.code).toBe('self_change_refused');
    }
    const rename = await api()
      .patch(`/api/users/${self}`)
      .set('Authorization', admin)
      .send({ name: 'Alma Reyes' });
    expect(rename.status).toBe(200);
  });

  it('refuses unknown plants, an empty body and an unknown user', async () => {
    const id = t.userId('plant.south@demo.test');
    const plants = await api()
      .patch(`/api/users/${id}`)
      .set('Authorization', admin)
      .send({ plantCodes: ['P-NOPE'] });
    expect(plants.status).toBe(400);
    expect(plants.body.error.message).toContain('P-NOPE');
    const empty = await api().patch(`/api/users/${id}`).set('Authorization', admin).send({});
    expect(empty.status).toBe(400);
    const unknown = await api()
      .patch('/api/users/99999')
      .set('Authorization', admin)
      .send({ name: 'Nobody' });
    expect(unknown.status).toBe(404);
    const badId = await api()
      .patch('/api/users/abc')
      .set('Authorization', admin)
      .send({ name: 'x' });
    expect(badId.status).toBe(400);
    expect(badId.body.error.details.issues[0].path).toBe('params.id');
  });
});

describe('the audit trail of user administration', () => {
  const trailOf = (id: number) => t.database.sqlite
    .prepare(`select action, user_id as userId, before, after from audit_events
      where subject_type = 'user' and subject_id = ? order by id`)
    .all(String(id)) as { action: string; userId: number; before: string; after: string }[];

  it('records the invitation and the role change with the acting administrator', async () => {
    const invited = await api().post('/api/users/invitations').set('Authorization', admin)
      .send({ email: 'tove@demo.test', name: 'Tove Lund', role: 'viewer', plantCodes: [] });
    expect(invited.status).toBe(201);
    const id = (invited.body as { user: UserDto }).user.id;
    const changed = await api().patch(`/api/users/${id}`).set('Authorization', admin)
      .send({ role: 'plant_manager', plantCodes: ['P-SOUTH'] });
    expect(changed.status).toBe(200);

    const events = trailOf(id);
    const adminId = t.userId('admin@demo.test');
    expect(events.map((event) => [event.action, event.userId])).toEqual([
      ['user.invited', adminId], ['user.role_changed', adminId]]);
    expect(JSON.parse(events[1]!.before)).toEqual({ role: 'viewer', plantCodes: [] });
    expect(JSON.parse(events[1]!.after)).toEqual({ role: 'plant_manager',
      plantCodes: ['P-SOUTH'] });
    const { token } = latestLinkToken('tove@demo.test');
    expect(JSON.stringify(events)).not.toContain(token);
  });

  it('records nothing for a refused change', async () => {
    const id = t.userId('risk@demo.test');
    const before = trailOf(id).length;
    const refused = await api().patch(`/api/users/${id}`).set('Authorization', admin)
      .send({ role: 'buyer', plantCodes: ['P-NORTH'] });
    expect(refused.status).toBe(400);
    expect(trailOf(id)).toHaveLength(before);
  });
});

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RegisterEntryDetailDto, RegisterListDto } from '@keelson/contracts';
import { SCORING_DEFAULTS } from '@keelson/scoring';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { syncRegisterFromRun } from './register-sync';
import { seedRun } from './register-test-runs';

// The demo network (version 1) names the suppliers; the run rows are written here with scores
// worked out by hand: rating = impact band x likelihood, banded with the defaults of spec
// section 7 (low 1-4, medium 5-9, high 10-16, critical 20-25).
let t: TestApp;
let idOf: Record<string, number>;
beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  const runId = seedRun(t.database.db, [
    // 5 x 4 = 20: critical.
    { code: 'S-2-SHARED-B', name: 'Hanabusa Sintered Metals', singlePointOfFailure: true,
      likelihood: 4, impactBand: 5, rating: 20, ratingBand: 'critical', plants: ['P-EAST'] },
    // 4 x 3 = 12: high.
    { code: 'S-2-SHARED-A', name: 'Kestrel Forgings', singlePointOfFailure: true,
      likelihood: 3, impactBand: 4, rating: 12, ratingBand: 'high',
      plants: ['P-NORTH', 'P-SOUTH'] },
    // 2 x 3 = 6: medium.
    { code: 'S-1-001', name: 'Álvarez-Roca Fasteners', likelihood: 3, impactBand: 2,
      rating: 6, ratingBand: 'medium', plants: ['P-SOUTH'] },
  ]);
  syncRegisterFromRun(t.database.db, runId, SCORING_DEFAULTS, t.clock.now);
  const rows = t.database.sqlite.prepare('select id, supplier_code as code from register_entries')
    .all() as { id: number; code: string }[];
  idOf = Object.fromEntries(rows.map((row) => [row.code, row.id]));
});
afterAll(() => t.close());

const as = (role: keyof typeof ACCOUNT_OF_ROLE) =>
  ({ Authorization: `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}` });
const list = async (role: keyof typeof ACCOUNT_OF_ROLE, query: Record<string, string> = {}) => {
  const response = await request(t.app).get('/api/register').query(query).set(as(role));
  expect(response.status).toBe(200);
  return response.body as RegisterListDto;
};
const codes = (body: RegisterListDto) => body.items.map((item) => item.supplierCode);
const issuePaths = (body: { error: { details?: { issues?: { path: string }[] } } }) =>
  (body.error.details?.issues ?? []).map((issue) => issue.path);

describe('GET /api/register', () => {
  it('lists every entry by rating, with names from the latest network version', async () => {
    const body = await list('viewer');
    expect(body.total).toBe(3);
    expect(codes(body)).toEqual(['S-2-SHARED-B', 'S-2-SHARED-A', 'S-1-001']);
    expect(body.items[0]).toMatchObject({ supplierName: 'Hanabusa Sintered Metals',
      plants: ['P-EAST'], origin: 'automatic', status: 'open', computedLikelihood: 4,
      likelihoodOverride: null, likelihood: 4, impactBand: 5, rating: 20,
      ratingBand: 'critical', owner: null });
    expect(body.items[1]!.plants).toEqual(['P-NORTH', 'P-SOUTH']);
  });

  it('searches title, supplier code and supplier name, filters and sorts', async () => {
    expect(codes(await list('buyer', { q: 'kestrel' }))).toEqual(['S-2-SHARED-A']);
    expect(codes(await list('buyer', { q: 's-2-shared', sort: 'supplierCode', order: 'asc' })))
      .toEqual(['S-2-SHARED-A', 'S-2-SHARED-B']);
    expect(codes(await list('buyer', { q: 'Medium-rated' }))).toEqual(['S-1-001']);
    expect(codes(await list('buyer', { ratingBand: 'critical' }))).toEqual(['S-2-SHARED-B']);
    expect(codes(await list('buyer', { plant: 'P-SOUTH', sort: 'rating', order: 'asc' })))
      .toEqual(['S-1-001', 'S-2-SHARED-A']);
    const page = await list('buyer', { limit: '1', offset: '1' });
    expect([codes(page), page.total]).toEqual([['S-2-SHARED-A'], 3]);
  });

  it('filters the entries a re-scoring flagged, by flag or all of them', async () => {
    const setFlag = t.database.sqlite.prepare('update register_entries set flag = ? where id = ?');
    setFlag.run('supplier_removed', idOf['S-1-001']);
    setFlag.run('no_longer_matters', idOf['S-2-SHARED-B']);
    try {
      expect(codes(await list('viewer', { flag: 'supplier_removed' }))).toEqual(['S-1-001']);
      expect(codes(await list('viewer', { flag: 'flagged' })))
        .toEqual(['S-2-SHARED-B', 'S-1-001']);
      expect((await list('viewer', { flag: 'flagged' })).items[1]!.flag)
        .toBe('supplier_removed');
      const bad = await request(t.app).get('/api/register').query({ flag: 'stale' })
        .set(as('viewer'));
      expect(bad.status).toBe(400);
      expect(issuePaths(bad.body)).toEqual(['query.flag']);
    } finally {
      setFlag.run(null, idOf['S-1-001']);
      setFlag.run(null, idOf['S-2-SHARED-B']);
    }
  });

  it('shows a plant manager only entries with one of their plants', async () => {
    expect(codes(await list('plant_manager'))).toEqual(['S-2-SHARED-A']);
    const other = await request(t.app).get('/api/register').query({ plant: 'P-SOUTH' })
      .set(as('plant_manager'));
    expect(other.status).toBe(403);
    expect(other.body.error.message).toContain('query.plant');
  });

  it('names the query field that is not valid', async () => {
    const response = await request(t.app).get('/api/register').query({ sort: 'colour' })
      .set(as('viewer'));
    expect(response.status).toBe(400);
    expect(issuePaths(response.body)).toEqual(['query.sort']);
  });

  it('needs a session', async () => {
    expect((await request(t.app).get('/api/register')).status).toBe(401);
  });
});

describe('GET /api/register/:id', () => {
  it('answers the entry to every role, and 404 outside a plant manager\'s plants', async () => {
    for (const role of ['viewer', 'buyer', 'risk_manager', 'admin'] as const) {
      const response = await request(t.app).get(`/api/register/${idOf['S-2-SHARED-B']}`)
        .set(as(role));
      expect(response.status).toBe(200);
      expect((response.body as RegisterEntryDetailDto).overrides).toEqual([]);
    }
    const own = await request(t.app).get(`/api/register/${idOf['S-2-SHARED-A']}`)
      .set(as('plant_manager'));
    expect(own.status).toBe(200);
    const other = await request(t.app).get(`/api/register/${idOf['S-2-SHARED-B']}`)
      .set(as('plant_manager'));
    expect(other.status).toBe(404);
    expect((await request(t.app).get('/api/register/99999').set(as('viewer'))).status).toBe(404);
  });
});

describe('GET /api/register/owners', () => {
  it('lists active users for those who assign owners, and refuses the others', async () => {
    const viewerId = t.userId(ACCOUNT_OF_ROLE.viewer);
    t.database.sqlite.prepare('update users set is_active = 0 where id = ?').run(viewerId);
    const response = await request(t.app).get('/api/register/owners').set(as('risk_manager'));
    t.database.sqlite.prepare('update users set is_active = 1 where id = ?').run(viewerId);
    expect(response.status).toBe(200);
    const names = response.body.items.map((owner: { name: string }) => owner.name);
    expect(names).toEqual(['Alma Reyes', 'Bruno Keller', 'Pia Lindqvist', 'Rania Okafor',
      'Sergio Marin', 'Tomasz Halwe']);
    for (const role of ['viewer', 'buyer', 'plant_manager'] as const) {
      expect((await request(t.app).get('/api/register/owners').set(as(role))).status).toBe(403);
    }
  });
});

describe('writing the register', () => {
  it('refuses viewers, buyers and plant managers with 403', async () => {
    const id = idOf['S-2-SHARED-A'];
    for (const role of ['viewer', 'buyer', 'plant_manager'] as const) {
      const create = await request(t.app).post('/api/register').set(as(role))
        .send({ supplierCode: 'S-1-002', title: 'Watch list' });
      const patch = await request(t.app).patch(`/api/register/${id}`).set(as(role))
        .send({ status: 'closed' });
      const override = await request(t.app).post(`/api/register/${id}/likelihood`).set(as(role))
        .send({ likelihood: 1, reason: 'Second source qualified in May' });
      expect([create.status, patch.status, override.status]).toEqual([403, 403, 403]);
    }
    const detail = await request(t.app).get(`/api/register/${id}`).set(as('admin'));
    expect(detail.body).toMatchObject({ status: 'open', likelihoodOverride: null });
  });

  it('needs the CSRF header with a cookie session', async () => {
    const cookie = await t.signIn(ACCOUNT_OF_ROLE.risk_manager);
    const bare = await request(t.app).patch(`/api/register/${idOf['S-1-001']}`)
      .set('Cookie', cookie).send({ notes: 'Checked' });
    expect(bare.status).toBe(403);
    const withHeader = await request(t.app).patch(`/api/register/${idOf['S-1-001']}`)
      .set(t.cookieHeaders(cookie)).send({ notes: 'Checked' });
    expect(withHeader.status).toBe(200);
    expect(withHeader.body.notes).toBe('Checked');
  });

  it('edits title, owner, status and notes; the owner must be an active user', async () => {
    const id = idOf['S-1-001'];
    const riskId = t.userId(ACCOUNT_OF_ROLE.risk_manager);
    t.clock.now = new Date('2026-03-04T12:00:00.000Z');
    const response = await request(t.app).patch(`/api/register/${id}`).set(as('admin'))
      .send({ title: 'Fastener supply at Castellar', ownerId: riskId, status: 'mitigating',
        notes: 'Second source in qualification.' });
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ title: 'Fastener supply at Castellar',
      owner: { id: riskId, name: 'Rania Okafor' }, status: 'mitigating',
      notes: 'Second source in qualification.', updatedAt: '2026-03-04T12:00:00.000Z' });

    const missing = await request(t.app).patch(`/api/register/${id}`).set(as('admin'))
      .send({ ownerId: 99999 });
    expect(missing.status).toBe(400);
    expect(issuePaths(missing.body)).toEqual(['body.ownerId']);
    const viewerId = t.userId(ACCOUNT_OF_ROLE.viewer);
    t.database.sqlite.prepare('update users set is_active = 0 where id = ?').run(viewerId);
    const inactive = await request(t.app).patch(`/api/register/${id}`).set(as('admin'))
      .send({ ownerId: viewerId });
    t.database.sqlite.prepare('update users set is_active = 1 where id = ?').run(viewerId);
    expect(inactive.status).toBe(400);
    expect(inactive.body.error.message).toContain('body.ownerId');
    const badStatus = await request(t.app).patch(`/api/register/${id}`).set(as('admin'))
      .send({ status: 'done' });
    expect(issuePaths(badStatus.body)).toEqual(['body.status']);
    expect((await request(t.app).patch('/api/register/99999').set(as('admin'))
      .send({ notes: 'x' })).status).toBe(404);
    const unchanged = await request(t.app).get(`/api/register/${id}`).set(as('viewer'));
    expect(unchanged.body.owner).toEqual({ id: riskId, name: 'Rania Okafor' });
  });
});

describe('POST /api/register/:id/likelihood', () => {
  it('sets and removes the override, re-rates, and keeps the history in order', async () => {
    const id = idOf['S-2-SHARED-A'];
    t.clock.now = new Date('2026-03-05T09:00:00.000Z');
    const set = await request(t.app).post(`/api/register/${id}/likelihood`).set(as('risk_manager'))
      .send({ likelihood: 5, reason: 'Owner announced insolvency proceedings' });
    expect(set.status).toBe(200);
    // Impact band 4 x overridden likelihood 5 = 20: critical (was 4 x 3 = 12, high).
    expect(set.body).toMatchObject({ computedLikelihood: 3, likelihoodOverride: 5,
      likelihood: 5, impactBand: 4, rating: 20, ratingBand: 'critical' });

    t.clock.now = new Date('2026-03-06T09:00:00.000Z');
    const change = await request(t.app).post(`/api/register/${id}/likelihood`).set(as('admin'))
      .send({ likelihood: 2, reason: 'A buyer took over the plant' });
    // 4 x 2 = 8: medium.
    expect(change.body).toMatchObject({ likelihood: 2, rating: 8, ratingBand: 'medium' });

    t.clock.now = new Date('2026-03-07T09:00:00.000Z');
    const removed = await request(t.app).post(`/api/register/${id}/likelihood`)
      .set(as('risk_manager')).send({ likelihood: null, reason: 'Back to the computed value' });
    expect(removed.body).toMatchObject({ likelihoodOverride: null, likelihood: 3, rating: 12,
      ratingBand: 'high' });
    const history = (removed.body as RegisterEntryDetailDto).overrides
      .map(({ likelihood, previous, reason, user, createdAt }) =>
        ({ likelihood, previous, reason, user: user?.name, createdAt }));
    expect(history).toEqual([
      { likelihood: 5, previous: null, reason: 'Owner announced insolvency proceedings',
        user: 'Rania Okafor', createdAt: '2026-03-05T09:00:00.000Z' },
      { likelihood: 2, previous: 5, reason: 'A buyer took over the plant',
        user: 'Alma Reyes', createdAt: '2026-03-06T09:00:00.000Z' },
      { likelihood: null, previous: 2, reason: 'Back to the computed value',
        user: 'Rania Okafor', createdAt: '2026-03-07T09:00:00.000Z' },
    ]);
  });

  it('requires a reason and a likelihood of 1-5, naming the field', async () => {
    const id = idOf['S-2-SHARED-B'];
    const cases: [Record<string, unknown>, string][] = [
      [{ likelihood: 3 }, 'body.reason'],
      [{ likelihood: 3, reason: '   ' }, 'body.reason'],
      [{ likelihood: 6, reason: 'Audit found gaps' }, 'body.likelihood'],
      [{ reason: 'Audit found gaps' }, 'body.likelihood'],
    ];
    for (const [body, path] of cases) {
      const response = await request(t.app).post(`/api/register/${id}/likelihood`)
        .set(as('risk_manager')).send(body);
      expect(response.status).toBe(400);
      expect(issuePaths(response.body)).toEqual([path]);
    }
    const detail = await request(t.app).get(`/api/register/${id}`).set(as('viewer'));
    expect(detail.body).toMatchObject({ likelihoodOverride: null, rating: 20, overrides: [] });
  });
});

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fewestAlternativesBySupplier } from '@keelson/scoring';
import { readNetworkModel } from '../network/network-store';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { RegisterRepository } from './register.repository';
import { seedRun } from './register-test-runs';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
});
afterAll(() => t.close());

const asRisk = () => ({ Authorization: `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE.risk_manager)}` });
const create = (body: Record<string, unknown>) =>
  request(t.app).post('/api/register').set(asRisk()).send(body);

describe('POST /api/register', () => {
  it('without a succeeded run, computes the likelihood from the data, band 1', async () => {
    // A failed run's rows are never used.
    seedRun(t.database.db, [{ code: 'S-2-SHARED-A', likelihood: 1, impactBand: 5, rating: 5,
      ratingBand: 'medium', plants: ['P-EAST'] }], { status: 'failed' });
    // The demo's S-2-SHARED-A: financial health 2, delivery score 3, no continuity plan, and
    // (checked here) the only qualified source of everything it sells.
    const supplier = t.database.sqlite.prepare(`select financial_health as health,
      delivery_score as delivery, has_continuity_plan as plan from network_suppliers
      where version_id = 1 and code = 'S-2-SHARED-A'`).get();
    expect(supplier).toEqual({ health: 2, delivery: 3, plan: 0 });
    const otherSources = t.database.sqlite.prepare(`select count(*) as n from network_sourcing o
      join network_sourcing s on s.version_id = o.version_id and s.item_code = o.item_code
        and s.buyer_code = o.buyer_code
      where s.version_id = 1 and s.supplier_code = 'S-2-SHARED-A' and s.is_qualified = 1
        and o.supplier_code <> 'S-2-SHARED-A' and o.is_qualified = 1`).get();
    expect(otherSources).toEqual({ n: 0 });
    // Factor risks: health (5-2)/4 = 0.75, delivery (5-3)/4 = 0.5, plan 1, alternatives 1,
    // country (h-1)/4 in [0, 1]. Weighted mean with 0.25/0.15/0.15/0.25/0.2:
    // 0.1875 + 0.075 + 0.15 + 0.25 + 0.2 (h-1)/4 lies in [0.6625, 0.8625], so 4 x mean lies in
    // [2.65, 3.45], rounds to 3, and the likelihood is 1 + 3 = 4 whatever the country's hazard.
    const response = await create({ supplierCode: 'S-2-SHARED-A', title: 'Forging capacity' });
    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({ supplierCode: 'S-2-SHARED-A',
      supplierName: 'Kestrel Forgings', title: 'Forging capacity', origin: 'manual',
      status: 'open', runId: null, computedLikelihood: 4, likelihood: 4, impactBand: 1,
      rating: 4, ratingBand: 'low', notes: '', owner: null, overrides: [] });
    // The plants it serves, from the network version.
    expect(response.body.plants).toEqual(['P-EAST', 'P-NORTH', 'P-SOUTH']);
    // The creation is in the audit trail, by the risk manager, with what was created.
    const audit = t.database.sqlite.prepare(`select action, user_id as userId, after
      from audit_events where subject_type = 'register_entry' and subject_id = ?`)
      .all(String(response.body.id)) as { action: string; userId: number; after: string }[];
    expect(audit.map((row) => row.action)).toEqual(['register.created']);
    expect(audit[0]!.userId).toBe(t.userId(ACCOUNT_OF_ROLE.risk_manager));
    expect(JSON.parse(audit[0]!.after)).toMatchObject({ entryId: response.body.id,
      supplierCode: 'S-2-SHARED-A', title: 'Forging capacity', rating: 4, ratingBand: 'low' });
  });

  it('takes the scores of the latest finished succeeded run with the supplier', async () => {
    const newer = seedRun(t.database.db, [{ code: 'S-1-002', likelihood: 3, impactBand: 4,
      rating: 12, ratingBand: 'high', plants: ['P-SOUTH'] }],
    { finishedAt: '2026-03-02T12:00:00.000Z' });
    seedRun(t.database.db, [{ code: 'S-1-002', likelihood: 1, impactBand: 1, rating: 1,
      ratingBand: 'low', plants: ['P-NORTH'] }], { finishedAt: '2026-03-01T12:00:00.000Z' });
    const ownerId = t.userId(ACCOUNT_OF_ROLE.admin);
    const response = await create({ supplierCode: 'S-1-002', title: 'Sole fastener line',
      ownerId, notes: 'Raised at the March review.' });
    expect(response.status).toBe(201);
    // 4 x 3 = 12: high.
    expect(response.body).toMatchObject({ runId: newer, computedLikelihood: 3, impactBand: 4,
      rating: 12, ratingBand: 'high', plants: ['P-SOUTH'],
      owner: { id: ownerId, name: 'Alma Reyes' }, notes: 'Raised at the March review.' });
    const listed = await request(t.app).get('/api/register').query({ q: 'Sole fastener' })
      .set(asRisk());
    expect(listed.body.total).toBe(1);
  });

  it('names an unknown supplier code, a missing title and an unknown owner', async () => {
    const unknown = await create({ supplierCode: 'S-9-NOPE', title: 'Ghost' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toContain('S-9-NOPE');
    expect(unknown.body.error.details.issues[0].path).toBe('body.supplierCode');
    const untitled = await create({ supplierCode: 'S-1-002' });
    expect(untitled.body.error.details.issues[0].path).toBe('body.title');
    const owner = await create({ supplierCode: 'S-1-002', title: 'Owned', ownerId: 4242 });
    expect(owner.status).toBe(400);
    expect(owner.body.error.details.issues[0].path).toBe('body.ownerId');
  });
});

describe('RegisterRepository.fewestAlternatives', () => {
  it('agrees with fewestAlternativesBySupplier of @keelson/scoring on every demo supplier', () => {
    const model = readNetworkModel(t.database.db, 1)!;
    const expected = fewestAlternativesBySupplier(model);
    const repository = new RegisterRepository(t.database.db);
    const actual = new Map(model.suppliers.map((supplier) =>
      [supplier.code, repository.fewestAlternatives(1, supplier.code)]));
    expect(actual).toEqual(expected);
    // The demo has sole sources (0) as well as suppliers with alternatives.
    const values = new Set(actual.values());
    expect(values.has(0)).toBe(true);
    expect([...values].some((value) => value !== null && value > 0)).toBe(true);
  });
});

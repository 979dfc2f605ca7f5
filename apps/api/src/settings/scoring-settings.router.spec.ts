import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCORING_DEFAULTS, type ScoringSettings } from '@keelson/scoring';
import { syncRegisterFromRun } from '../register/register-sync';
import { seedRun } from '../register/register-test-runs';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { RESCORED_HEADER } from './scoring-settings.router';

let t: TestApp;
let runId: number;
beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  runId = seedRun(t.database.db, [
    // With the defaults (spec section 7): 5 x 4 = 20 critical, 4 x 3 = 12 high, 2 x 3 = 6 medium.
    { code: 'S-2-SHARED-B', singlePointOfFailure: true, likelihood: 4, impactBand: 5,
      rating: 20, ratingBand: 'critical', plants: ['P-EAST'] },
    { code: 'S-2-SHARED-A', singlePointOfFailure: true, likelihood: 3, impactBand: 4,
      rating: 12, ratingBand: 'high', plants: ['P-NORTH'] },
    { code: 'S-1-001', likelihood: 3, impactBand: 2, rating: 6, ratingBand: 'medium',
      plants: ['P-SOUTH'] },
  ]);
  syncRegisterFromRun(t.database.db, runId, SCORING_DEFAULTS, t.clock.now);
});
afterAll(() => t.close());

const bearer = (role: keyof typeof ACCOUNT_OF_ROLE) =>
  ({ Authorization: `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}` });
const put = (role: keyof typeof ACCOUNT_OF_ROLE, body: unknown) =>
  request(t.app).put('/api/settings/scoring').set(bearer(role)).send(body as object);
const bands = () => t.database.sqlite
  .prepare('select supplier_code as code, rating, rating_band as band from register_entries ' +
    'order by supplier_code').all();
const settingsWith = (changes: Partial<ScoringSettings>) =>
  ({ ...structuredClone(SCORING_DEFAULTS), ...changes });

describe('/api/settings/scoring', () => {
  it('answers the defaults to every role', async () => {
    for (const role of Object.keys(ACCOUNT_OF_ROLE) as (keyof typeof ACCOUNT_OF_ROLE)[]) {
      const response = await request(t.app).get('/api/settings/scoring').set(bearer(role));
      expect(response.status).toBe(200);
      expect(response.body).toEqual(SCORING_DEFAULTS);
    }
  });

  it('lets only administrators change them', async () => {
    for (const role of ['risk_manager', 'buyer', 'viewer', 'plant_manager'] as const) {
      expect((await put(role, SCORING_DEFAULTS)).status).toBe(403);
    }
  });

  it('names the field of each invalid setting and changes nothing', async () => {
    const cases: [unknown, string][] = [
      [settingsWith({ impactBandLimits: [0.001, 0.005, 0.004, 0.05] }),
        'body.impactBandLimits.2'],
      [settingsWith({ impactBandLimits: [0.001, 0.005, 0.02, 1.5] }), 'body.impactBandLimits.3'],
      [settingsWith({ ratingBandFloors: { medium: 10, high: 8, critical: 20 } }),
        'body.ratingBandFloors'],
      [settingsWith({ unknownCountryHazard: 6 }), 'body.unknownCountryHazard'],
      [{ ...settingsWith({}), likelihoodWeights: { ...SCORING_DEFAULTS.likelihoodWeights,
        alternatives: -1 } }, 'body.likelihoodWeights.alternatives'],
      [settingsWith({ likelihoodWeights: { financialHealth: 0, deliveryScore: 0,
        continuityPlan: 0, alternatives: 0, countryHazard: 0 } }), 'body.likelihoodWeights'],
    ];
    for (const [body, path] of cases) {
      const response = await put('admin', body);
      expect(response.status).toBe(400);
      expect(response.body.error.details.issues.map((issue: { path: string }) => issue.path))
        .toContain(path);
      expect(response.body.error.message).toContain(path);
    }
    const { unknownCountryHazard: _omitted, ...partial } = settingsWith({});
    const missing = await put('admin', partial);
    expect(missing.body.error.details.issues[0].path).toBe('body.unknownCountryHazard');
    const current = await request(t.app).get('/api/settings/scoring').set(bearer('viewer'));
    expect(current.body).toEqual(SCORING_DEFAULTS);
  });

  it('saves a change and re-rates the register; run rows keep their scores', async () => {
    const changed = settingsWith({ ratingBandFloors: { medium: 5, high: 13, critical: 21 } });
    const response = await put('admin', changed);
    expect(response.status).toBe(200);
    expect(response.body).toEqual(changed);
    // 20 is now below the critical floor 21 (high), 12 below the high floor 13 (medium); 6 stays
    // medium: two entries changed.
    expect(response.headers[RESCORED_HEADER]).toBe('2');
    expect(bands()).toEqual([
      { code: 'S-1-001', rating: 6, band: 'medium' },
      { code: 'S-2-SHARED-A', rating: 12, band: 'medium' },
      { code: 'S-2-SHARED-B', rating: 20, band: 'high' },
    ]);
    const runBands = t.database.sqlite.prepare('select rating_band as band from run_suppliers ' +
      'where run_id = ? order by code').all(runId);
    expect(runBands).toEqual([{ band: 'medium' }, { band: 'high' }, { band: 'critical' }]);
    expect((await request(t.app).get('/api/settings/scoring').set(bearer('buyer'))).body)
      .toEqual(changed);
    // The change is in the audit trail: by the administrator, the settings before and after.
    const audit = t.database.sqlite.prepare(`select user_id as userId, before, after
      from audit_events where action = 'settings.scoring_changed'`).all() as
      { userId: number; before: string; after: string }[];
    expect(audit).toHaveLength(1);
    expect(audit[0]!.userId).toBe(t.userId(ACCOUNT_OF_ROLE.admin));
    expect(JSON.parse(audit[0]!.before).ratingBandFloors)
      .toEqual(SCORING_DEFAULTS.ratingBandFloors);
    expect(JSON.parse(audit[0]!.after)).toMatchObject({
      ratingBandFloors: { medium: 5, high: 13, critical: 21 }, registerEntriesRescored: 2 });
  });

  it('uses the saved floors for a later override', async () => {
    const id = (t.database.sqlite.prepare(
      "select id from register_entries where supplier_code = 'S-2-SHARED-A'").get() as
      { id: number }).id;
    const response = await request(t.app).post(`/api/register/${id}/likelihood`)
      .set(bearer('risk_manager')).send({ likelihood: 5, reason: 'Key press out for months' });
    // 4 x 5 = 20 < 21: high under the saved floors (critical under the defaults).
    expect(response.body).toMatchObject({ rating: 20, ratingBand: 'high' });
  });
});

/**
 * Shared set-up of the plan specs: a test app with the demo network, register entries made by
 * a run written straight into the database (`seedRun`, scores stated, not computed), and
 * request helpers that sign in as a demo account with a Bearer token.
 */
import request from 'supertest';
import type { PlanChange, PlanDto } from '@keelson/contracts';
import { SCORING_DEFAULTS } from '@keelson/scoring';
import { syncRegisterFromRun } from '../register/register-sync';
import { seedRun } from '../register/register-test-runs';
import { createTestApp, type TestApp } from '../testing/test-app';

/** Demo accounts by a short name. */
export const ACCOUNTS = {
  admin: 'admin@demo.test',
  buyer: 'buyer@demo.test',
  risk: 'risk@demo.test',
  north: 'plant.north@demo.test',
  south: 'plant.south@demo.test',
  east: 'plant.east@demo.test',
  viewer: 'viewer@demo.test',
} as const;
/** A short account name, or the e-mail address of another user. */
export type Account = keyof typeof ACCOUNTS | `${string}@${string}`;

/**
 * The second source for S-2-SHARED-A that the what-if spec worked out on the demo network
 * (what-if.spec.ts): S-2-011 becomes a qualified source of M-01 for every buyer of it, so
 * S-2-SHARED-A stops being a single point of failure.
 */
export const SECOND_SOURCE: PlanChange[] = [
  { kind: 'add_source', itemCode: 'M-01', supplierCode: 'S-2-011', buyerCode: null },
];

/** A test app with register entries and the helpers of the plan specs. */
export interface PlanTestApp {
  t: TestApp;
  /** Register entry id by supplier code. */
  entryOf: Record<string, number>;
  get(account: Account, path: string): request.Test;
  post(account: Account, path: string, body?: object): request.Test;
  patch(account: Account, path: string, body: object): request.Test;
  del(account: Account, path: string): request.Test;
  /** A new draft for the entry of `supplierCode` by `account`; returns the plan. */
  draft(supplierCode: string, body?: object, account?: Account): Promise<PlanDto>;
  /** The audit rows of a subject, oldest first. */
  audit(subjectType: string, subjectId: number): AuditRow[];
}

/** An audit row as the specs read it. */
export interface AuditRow {
  action: string;
  userId: number | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

/**
 * Entries: S-2-SHARED-A (P-NORTH, P-SOUTH), S-2-SHARED-B (P-NORTH, P-SOUTH, P-EAST), S-1-001
 * (P-SOUTH) and S-1-002 (no plants).
 */
export async function createPlanTestApp(): Promise<PlanTestApp> {
  const t = await createTestApp({ withDemoNetwork: true });
  const runId = seedRun(t.database.db, [
    { code: 'S-2-SHARED-A', singlePointOfFailure: true, likelihood: 3, impactBand: 4,
      rating: 12, ratingBand: 'high', plants: ['P-NORTH', 'P-SOUTH'] },
    { code: 'S-2-SHARED-B', singlePointOfFailure: true, likelihood: 4, impactBand: 5,
      rating: 20, ratingBand: 'critical', plants: ['P-NORTH', 'P-SOUTH', 'P-EAST'] },
    { code: 'S-1-001', likelihood: 3, impactBand: 2, rating: 6, ratingBand: 'medium',
      plants: ['P-SOUTH'] },
    { code: 'S-1-002', likelihood: 3, impactBand: 2, rating: 6, ratingBand: 'medium',
      plants: [] },
  ]);
  syncRegisterFromRun(t.database.db, runId, SCORING_DEFAULTS, t.clock.now);
  const rows = t.database.sqlite.prepare('select id, supplier_code as code from register_entries')
    .all() as { id: number; code: string }[];
  const entryOf = Object.fromEntries(rows.map((row) => [row.code, row.id]));
  const emailOf = (account: Account) => (account.includes('@') ? account
    : ACCOUNTS[account as keyof typeof ACCOUNTS]);
  const auth = (account: Account) => ({ Authorization: `Bearer ${t.tokenFor(emailOf(account))}` });
  const helpers: PlanTestApp = {
    t,
    entryOf,
    get: (account, path) => request(t.app).get(path).set(auth(account)),
    post: (account, path, body = {}) => request(t.app).post(path).set(auth(account)).send(body),
    patch: (account, path, body) => request(t.app).patch(path).set(auth(account)).send(body),
    del: (account, path) => request(t.app).delete(path).set(auth(account)),
    async draft(supplierCode, body = {}, account = 'risk') {
      const response = await helpers.post(account, `/api/register/${entryOf[supplierCode]}/plans`,
        { strategy: 'second_source', description: 'Qualify a second forge.', ...body });
      if (response.status !== 201) {
        throw new Error(`draft answered ${response.status}: ${response.text}`);
      }
      return response.body as PlanDto;
    },
    audit(subjectType, subjectId) {
      return (t.database.sqlite.prepare(`select action, user_id as userId, before, after
        from audit_events where subject_type = ? and subject_id = ? order by id`)
        .all(subjectType, String(subjectId)) as { action: string; userId: number | null;
          before: string | null; after: string | null }[])
        .map((row) => ({ ...row, before: row.before === null ? null : JSON.parse(row.before),
          after: row.after === null ? null : JSON.parse(row.after) }));
    },
  };
  return helpers;
}

/**
 * The changes that matter leave their record in the audit trail, in the same transaction: the
 * demo import's commit, a succeeded run, a likelihood override and a register edit.
 */
import { asc } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, registerEntries } from '@keelson/db';
import { runToEnd } from '../runs/run-spec-helpers';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
}, 60_000);
afterAll(() => t.close());

const trail = () => t.database.db.select().from(auditEvents).orderBy(asc(auditEvents.id)).all();
const bearer = () => `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE.risk_manager)}`;

describe('the audit trail of the review', () => {
  it('records the import, the run, the override and the edit, with who and what', async () => {
    const risk = t.userId(ACCOUNT_OF_ROLE.risk_manager);
    const buyer = t.userId(ACCOUNT_OF_ROLE.buyer);
    expect(trail().map((e) => [e.action, e.subjectType, e.subjectId, e.userId])).toEqual([
      ['import.committed', 'network_version', '1', buyer],
    ]);
    const run = await runToEnd(t);
    const entry = t.database.db.select().from(registerEntries).all()
      .find((row) => row.supplierCode === 'S-2-SHARED-A')!;
    const override = await request(t.app).post(`/api/register/${entry.id}/likelihood`)
      .set('Authorization', bearer()).send({ likelihood: 5, reason: 'Floods every spring.' });
    expect(override.status).toBe(200);
    const edit = await request(t.app).patch(`/api/register/${entry.id}`)
      .set('Authorization', bearer()).send({ status: 'mitigating' });
    expect(edit.status).toBe(200);

    const events = trail();
    expect(events.map((e) => [e.action, e.subjectId, e.userId])).toEqual([
      ['import.committed', '1', buyer],
      ['run.succeeded', String(run.id), risk],
      ['register.likelihood_overridden', String(entry.id), risk],
      ['register.updated', String(entry.id), risk],
    ]);
    expect(events[1]!.after).toMatchObject({ networkVersionId: 1, suppliers: 148 });
    expect(events[2]!.before).toEqual({ likelihoodOverride: null, rating: entry.rating });
    expect(events[2]!.after).toMatchObject({ likelihoodOverride: 5,
      reason: 'Floods every spring.' });
    expect(events[3]!.before).toEqual({ status: 'open' });
    expect(events[3]!.after).toEqual({ status: 'mitigating' });
  });
});

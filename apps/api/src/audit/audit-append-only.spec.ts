/**
 * No route changes or deletes an audit record: the app's router stack (walked by the route
 * registry, which sees every mounted router) has only GET routes under /api/audit, and a write
 * to the trail's paths finds nothing. The table's own triggers are tested in audit-trail.spec.ts.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes } from '../http/route-registry';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { recordAudit } from './audit-trail';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('the audit trail has no writing route', () => {
  it('declares only GET routes under /api/audit, and all three of them', () => {
    const audit = listRoutes(t.app).filter((entry) => entry.path.startsWith('/api/audit'));
    expect(audit.map((entry) => `${entry.method} ${entry.path}`).sort()).toEqual([
      'GET /api/audit',
      'GET /api/audit/export.xlsx',
      'GET /api/audit/history/:subjectType/:subjectId',
    ]);
  });

  it('has no route anywhere in the API whose path names the audit trail and writes', () => {
    const writers = listRoutes(t.app).filter((entry) => /audit/i.test(entry.path) &&
      ['PUT', 'PATCH', 'DELETE', 'POST'].includes(entry.method));
    expect(writers).toEqual([]);
  });

  it('answers 404 to an administrator trying to change or delete a record', async () => {
    const id = recordAudit(t.database.db, { action: 'register.updated',
      subjectType: 'register_entry', subjectId: 1, userId: null, after: { notes: 'kept' } },
    t.clock.now);
    const admin = { Authorization: `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE.admin)}` };
    for (const method of ['put', 'patch', 'delete'] as const) {
      const response = await request(t.app)[method](`/api/audit/${id}`).set(admin)
        .send({ action: 'nothing' });
      expect(response.status, method).toBe(404);
    }
    const row = t.database.sqlite.prepare('select action, after from audit_events where id = ?')
      .get(id);
    expect(row).toEqual({ action: 'register.updated', after: '{"notes":"kept"}' });
  });
});

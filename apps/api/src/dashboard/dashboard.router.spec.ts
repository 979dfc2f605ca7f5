import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DashboardDto, MyTasksDto } from '@keelson/contracts';
import {
  importBatches,
  mitigationPlans,
  planDecisions,
  planTasks,
  rescoringRuns,
} from '@keelson/db';
import { SCORING_DEFAULTS } from '@keelson/scoring';
import { syncRegisterFromRun } from '../register/register-sync';
import { seedRun, type SeedRunSupplier } from '../register/register-test-runs';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';

// The demo network (version 1) is imported; the register, plans, tasks, re-scorings and a later
// import are written straight into the database, so every expected figure is counted by hand
// below. The test clock says 2026-03-02 09:00 UTC: "today" is 2026-03-02.
const SOUTH = 'plant.south@demo.test';
const entry = (code: string, rating: number, ratingBand: SeedRunSupplier['ratingBand'],
  plants: string[], singlePointOfFailure = false): SeedRunSupplier =>
  ({ code, name: `Supplier ${code}`, likelihood: 1, impactBand: 1, rating, ratingBand, plants,
    singlePointOfFailure });

let t: TestApp;
let idOf: Record<string, number>;
let runId: number;
let rescoringId: number;
let lastBatchId: number;
beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  const { db, sqlite } = t.database;
  runId = seedRun(db, [
    entry('S-2-SHARED-B', 20, 'critical', ['P-EAST'], true),
    entry('S-2-SHARED-A', 12, 'high', ['P-NORTH', 'P-SOUTH'], true),
    entry('S-1-001', 16, 'high', ['P-NORTH']),
    entry('S-1-002', 10, 'high', ['P-NORTH']),
    entry('S-1-003', 9, 'medium', ['P-NORTH']),
    entry('S-1-004', 8, 'medium', ['P-NORTH']),
    entry('S-1-005', 6, 'medium', ['P-NORTH']),
    entry('S-1-006', 5, 'medium', ['P-NORTH']),
    entry('S-1-007', 6, 'medium', ['P-SOUTH']),
  ], { label: 'Spring review', finishedAt: '2026-03-01T10:00:00.000Z' });
  // A later run that failed is not "the last run": its scores are in no register entry.
  seedRun(db, [], { label: 'Broken run', status: 'failed',
    finishedAt: '2026-03-01T12:00:00.000Z' });
  syncRegisterFromRun(db, runId, SCORING_DEFAULTS, t.clock.now);
  const rows = sqlite.prepare('select id, supplier_code as code from register_entries').all() as
    { id: number; code: string }[];
  idOf = Object.fromEntries(rows.map((row) => [row.code, row.id]));
  const setStatus = sqlite.prepare('update register_entries set status = ? where id = ?');
  setStatus.run('closed', idOf['S-1-003']);
  setStatus.run('mitigating', idOf['S-1-004']);
  setStatus.run('accepted', idOf['S-1-007']);

  const risk = t.userId(ACCOUNT_OF_ROLE.risk_manager);
  const north = t.userId(ACCOUNT_OF_ROLE.plant_manager);
  const south = t.userId(SOUTH);
  const plan = (code: string, status: string, submittedAt: string | null, authorId = risk) =>
    db.insert(mitigationPlans).values({ entryId: idOf[code]!, strategy: 'second_source',
      description: `Plan for ${code}`, status: status as 'draft', changes: [], authorId,
      createdAt: '2026-02-01T08:00:00.000Z', updatedAt: '2026-02-01T08:00:00.000Z',
      submittedAt }).returning({ id: mitigationPlans.id }).get().id;
  const decide = (planId: number, plantCode: string, submittedAt: string) =>
    db.insert(planDecisions).values({ planId, plantCode, decision: 'approved', userId: north,
      submittedAt, createdAt: submittedAt }).run();
  // Submitted: A (north and south undecided), B (north decided in this submission), C (north
  // decided in an earlier submission only: undecided now), D (east only), E (written by the
  // north manager: never theirs to approve; south undecided).
  const planA = plan('S-2-SHARED-A', 'submitted', '2026-02-10T08:00:00.000Z');
  const planB = plan('S-1-001', 'submitted', '2026-02-11T08:00:00.000Z');
  decide(planB, 'P-NORTH', '2026-02-11T08:00:00.000Z');
  const planC = plan('S-1-002', 'submitted', '2026-02-12T08:00:00.000Z');
  decide(planC, 'P-NORTH', '2026-02-05T08:00:00.000Z');
  plan('S-2-SHARED-B', 'submitted', '2026-02-13T08:00:00.000Z');
  plan('S-2-SHARED-A', 'submitted', '2026-02-14T08:00:00.000Z', north);
  plan('S-1-004', 'draft', null);
  const approved = plan('S-1-004', 'approved', '2026-01-10T08:00:00.000Z');
  const inProgress = plan('S-1-005', 'in_progress', '2026-01-10T08:00:00.000Z');
  const done = plan('S-1-006', 'done', '2026-01-10T08:00:00.000Z');
  const task = (planId: number, status: string, dueDate: string | null, ownerId: number) =>
    db.insert(planTasks).values({ planId, title: `Task due ${dueDate}`, ownerId, dueDate,
      status: status as 'todo', createdAt: '2026-01-10T08:00:00.000Z',
      updatedAt: '2026-01-10T08:00:00.000Z' }).run();
  task(approved, 'todo', '2026-03-01', north); // overdue
  task(approved, 'doing', '2026-02-01', risk); // overdue
  task(inProgress, 'todo', '2026-02-15', south); // overdue
  task(approved, 'done', '2026-02-01', north); // done
  task(approved, 'todo', '2026-03-02', north); // due today: not yet overdue
  task(approved, 'todo', null, north); // no due date
  task(done, 'todo', '2026-01-01', north); // plan done
  task(planA, 'todo', '2026-01-01', north); // plan not approved yet

  db.insert(rescoringRuns).values({ quarterLabel: '2025-Q4',
    networkVersionId: 1, status: 'failed', trigger: 'schedule', error: 'worker stopped',
    createdAt: '2025-10-06T06:00:00.000Z' }).run();
  const summary = { rescored: 9, created: 2, ratingChanged: 3, supplierRemoved: 1,
    noLongerMatters: 0, previousRescoringId: null, mailsSent: 4 };
  rescoringId = db.insert(rescoringRuns).values({ quarterLabel: '2026-Q1', networkVersionId: 1,
    analysisRunId: runId, status: 'succeeded', trigger: 'manual', summary,
    startedBy: risk, createdAt: '2026-03-01T09:00:00.000Z', startedAt: '2026-03-01T09:00:00.000Z',
    finishedAt: '2026-03-01T10:00:00.000Z' }).returning({ id: rescoringRuns.id }).get().id;

  lastBatchId = db.insert(importBatches).values({ status: 'rejected',
    fileName: 'suppliers-march.xlsx', fileSize: 1200, sha256: 'ab'.repeat(32), format: 'xlsx',
    sheets: [], counts: {}, errors: [], warnings: [], errorCount: 3, warningCount: 2,
    createdAt: '2026-03-02T09:30:00.000Z' }).returning({ id: importBatches.id }).get().id;
});
afterAll(() => t.close());

const dashboardOf = async (email: string): Promise<DashboardDto> => {
  const response = await request(t.app).get('/api/dashboard')
    .set({ Authorization: `Bearer ${t.tokenFor(email)}` });
  expect(response.status).toBe(200);
  return response.body as DashboardDto;
};
const ALL_BANDS = { low: 0, medium: 3, high: 3, critical: 1 };
const BY_STATUS = {
  open: { low: 0, medium: 2, high: 3, critical: 1 },
  mitigating: { low: 0, medium: 1, high: 0, critical: 0 },
};

describe('GET /api/dashboard', () => {
  it('gives a risk manager the register by band, the last run and re-scoring, plans and tasks',
    async () => {
      const body = await dashboardOf(ACCOUNT_OF_ROLE.risk_manager);
      expect(body).toMatchObject({ role: 'risk_manager', hasNetwork: true,
        openEntriesByBand: ALL_BANDS, entriesByStatus: BY_STATUS,
        lastRun: { id: runId, label: 'Spring review', finishedAt: '2026-03-01T10:00:00.000Z',
          kind: 'manual' },
        plansAwaitingApproval: 5, overdueTasks: 3, myOverdueTasks: 1, topRisks: null,
        lastImport: null });
      expect(body.lastRescoring).toEqual({ id: rescoringId, quarterLabel: '2026-Q1',
        status: 'succeeded', finishedAt: '2026-03-01T10:00:00.000Z',
        summary: expect.objectContaining({ rescored: 9, ratingChanged: 3, supplierRemoved: 1 }) });
    });

  it('gives an administrator the risk manager\'s figures and the last import', async () => {
    const body = await dashboardOf(ACCOUNT_OF_ROLE.admin);
    expect(body).toMatchObject({ role: 'admin', openEntriesByBand: ALL_BANDS,
      plansAwaitingApproval: 5, overdueTasks: 3, myOverdueTasks: 0,
      lastImport: { id: lastBatchId, warningCount: 2, errorCount: 3 } });
    expect(body.lastRun?.id).toBe(runId);
    expect(body.unsentMail).toEqual({ pending: 0, failed: 0 });
  });

  it('counts for administrators the e-mails the mail server has not taken', async () => {
    const { sqlite } = t.database;
    const insert = sqlite.prepare(`insert into mail_outbox (kind, to_addresses, subject, text,
      html, status, attempts, next_attempt_at, created_at) values ('digest', '["a@demo.test"]',
      's', 't', 'h', ?, 1, '2026-03-02T10:00:00.000Z', '2026-03-02T09:00:00.000Z')`);
    const ids = ['pending', 'pending', 'failed', 'sent']
      .map((status) => Number(insert.run(status).lastInsertRowid));
    try {
      expect((await dashboardOf(ACCOUNT_OF_ROLE.admin)).unsentMail)
        .toEqual({ pending: 2, failed: 1 });
      // Only administrators see (and can act on) the outbox.
      expect((await dashboardOf(ACCOUNT_OF_ROLE.risk_manager)).unsentMail).toBeNull();
    } finally {
      sqlite.prepare(`delete from mail_outbox where id in (${ids.join(',')})`).run();
    }
  });

  it('counts the overdue tasks the figures link to: everyone\'s and the person\'s own',
    async () => {
      const listed = async (email: string, path: string) => {
        const response = await request(t.app).get(`${path}?show=overdue`)
          .set({ Authorization: `Bearer ${t.tokenFor(email)}` });
        expect(response.status).toBe(200);
        return (response.body as MyTasksDto).items.length;
      };
      const risk = ACCOUNT_OF_ROLE.risk_manager;
      const body = await dashboardOf(risk);
      expect(await listed(risk, '/api/tasks')).toBe(body.overdueTasks);
      expect(await listed(risk, '/api/tasks/mine')).toBe(body.myOverdueTasks);
      const plant = ACCOUNT_OF_ROLE.plant_manager;
      expect(await listed(plant, '/api/tasks/mine')).toBe((await dashboardOf(plant)).overdueTasks);
    });

  it('gives a plant manager their plants\' top five risks and the plans waiting for them',
    async () => {
      const body = await dashboardOf(ACCOUNT_OF_ROLE.plant_manager);
      expect(body).toMatchObject({ role: 'plant_manager', hasNetwork: true,
        openEntriesByBand: { low: 0, medium: 3, high: 3, critical: 0 },
        plansAwaitingApproval: 2, overdueTasks: 1, lastRun: null, lastRescoring: null,
        lastImport: null });
      // Live P-NORTH entries by rating: 16, 12, 10, 8 (mitigating), 6; 5 is sixth, 9 closed.
      expect(body.topRisks!.map((risk) => [risk.supplierCode, risk.rating])).toEqual([
        ['S-1-001', 16], ['S-2-SHARED-A', 12], ['S-1-002', 10], ['S-1-004', 8], ['S-1-005', 6],
      ]);
      expect(body.topRisks![1]).toEqual({ id: idOf['S-2-SHARED-A'],
        title: expect.stringContaining('Supplier S-2-SHARED-A'), supplierCode: 'S-2-SHARED-A',
        rating: 12, ratingBand: 'high', plants: ['P-NORTH', 'P-SOUTH'] });
    });

  it('scopes another plant manager to their own plants and decisions', async () => {
    const body = await dashboardOf(SOUTH);
    // P-SOUTH: S-2-SHARED-A (open, high); S-1-007 is accepted. Plans A and E wait for south.
    expect(body.openEntriesByBand).toEqual({ low: 0, medium: 0, high: 1, critical: 0 });
    expect(body.topRisks!.map((risk) => risk.supplierCode)).toEqual(['S-2-SHARED-A']);
    expect([body.plansAwaitingApproval, body.overdueTasks]).toEqual([2, 1]);
    const east = await dashboardOf('plant.east@demo.test');
    expect(east.topRisks!.map((risk) => risk.supplierCode)).toEqual(['S-2-SHARED-B']);
    expect([east.plansAwaitingApproval, east.overdueTasks]).toEqual([1, 0]);
  });

  it('gives a buyer the last import with its warnings and errors', async () => {
    const body = await dashboardOf(ACCOUNT_OF_ROLE.buyer);
    expect(body).toEqual({ role: 'buyer', hasNetwork: true, openEntriesByBand: null,
      entriesByStatus: null, lastRun: null, lastRescoring: null, plansAwaitingApproval: null,
      overdueTasks: null, myOverdueTasks: null, unsentMail: null, topRisks: null,
      lastImport: { id: lastBatchId, fileName: 'suppliers-march.xlsx', status: 'rejected',
        warningCount: 2, errorCount: 3, createdAt: '2026-03-02T09:30:00.000Z' } });
  });

  it('gives a viewer the open entries by band and the last run only', async () => {
    const body = await dashboardOf(ACCOUNT_OF_ROLE.viewer);
    expect(body).toMatchObject({ role: 'viewer', openEntriesByBand: ALL_BANDS,
      lastRun: { id: runId }, lastRescoring: null, plansAwaitingApproval: null,
      overdueTasks: null, topRisks: null, lastImport: null });
  });

  it('needs a session', async () => {
    expect((await request(t.app).get('/api/dashboard')).status).toBe(401);
  });
});

describe('GET /api/dashboard in an empty workspace', () => {
  it('says there is no network and counts nothing', async () => {
    const empty = await createTestApp();
    try {
      const get = (email: string) => request(empty.app).get('/api/dashboard')
        .set({ Authorization: `Bearer ${empty.tokenFor(email)}` });
      const risk = (await get(ACCOUNT_OF_ROLE.risk_manager)).body as DashboardDto;
      expect(risk).toMatchObject({ hasNetwork: false,
        openEntriesByBand: { low: 0, medium: 0, high: 0, critical: 0 }, lastRun: null,
        lastRescoring: null, plansAwaitingApproval: 0, overdueTasks: 0 });
      const buyer = (await get(ACCOUNT_OF_ROLE.buyer)).body as DashboardDto;
      expect([buyer.hasNetwork, buyer.lastImport]).toEqual([false, null]);
      const plant = (await get(ACCOUNT_OF_ROLE.plant_manager)).body as DashboardDto;
      expect([plant.hasNetwork, plant.topRisks, plant.plansAwaitingApproval])
        .toEqual([false, [], 0]);
    } finally {
      await empty.close();
    }
  });
});

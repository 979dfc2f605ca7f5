/**
 * GET /api/audit (the filtered trail), its export and one subject's history: who may read what,
 * the filters, and that a register entry's history gathers its plans and their tasks. Plans,
 * tasks and their events are written straight into the database here, so this spec does not
 * depend on the plans component.
 */
import ExcelJS from 'exceljs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AuditHistoryDto, AuditListDto, Role } from '@keelson/contracts';
import {
  mitigationPlans,
  planTasks,
  registerEntries,
  registerEntryPlants,
} from '@keelson/db';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { recordAudit } from './audit-trail';
import { AUDIT_EXPORT_COLUMNS } from './audit-export';

let t: TestApp;
let north: number; // an entry at P-NORTH and P-SOUTH
let south: number; // an entry at P-SOUTH only
let plan: number;
let otherPlan: number;
let task: number;
let risk: number;
let pia: number;

const at = (day: number, hour = 9) =>
  new Date(`2026-03-${String(day).padStart(2, '0')}T${String(hour).padStart(2, '0')}:00:00Z`);

beforeAll(async () => {
  t = await createTestApp();
  const { db } = t.database;
  risk = t.userId(ACCOUNT_OF_ROLE.risk_manager);
  pia = t.userId(ACCOUNT_OF_ROLE.plant_manager);
  const entry = (code: string, plants: string[]) => {
    const stamp = at(3).toISOString();
    const id = db.insert(registerEntries).values({ supplierCode: code, title: `${code} risk`,
      origin: 'manual', computedLikelihood: 3, impactBand: 4, rating: 12, ratingBand: 'high',
      createdAt: stamp, updatedAt: stamp }).returning().get().id;
    db.insert(registerEntryPlants).values(plants.map((plantCode) => ({ entryId: id, plantCode })))
      .run();
    return id;
  };
  north = entry('S-2-SHARED-A', ['P-NORTH', 'P-SOUTH']);
  south = entry('S-1-001', ['P-SOUTH']);
  const newPlan = (entryId: number) => db.insert(mitigationPlans).values({ entryId,
    strategy: 'second_source', description: 'Qualify a second forge', changes: [],
    authorId: risk, createdAt: at(4).toISOString(), updatedAt: at(4).toISOString() })
    .returning().get().id;
  plan = newPlan(north);
  otherPlan = newPlan(south);
  task = db.insert(planTasks).values({ planId: plan, title: 'Audit the forge', ownerId: risk,
    createdAt: at(4).toISOString(), updatedAt: at(4).toISOString() }).returning().get().id;

  recordAudit(db, { action: 'register.updated', subjectType: 'register_entry',
    subjectId: north, userId: risk, before: { status: 'open', notes: '' },
    after: { status: 'mitigating', notes: 'Álvarez-Roca quotes 6 weeks' } }, at(5));
  recordAudit(db, { action: 'plan.created', subjectType: 'plan', subjectId: plan, userId: risk,
    after: { entryId: north, strategy: 'second_source' } }, at(6));
  // A task event that names neither plan nor entry: found through plan_tasks.
  recordAudit(db, { action: 'task.updated', subjectType: 'plan_task', subjectId: task,
    userId: risk, before: { status: 'todo' }, after: { status: 'doing' } }, at(7));
  // A deleted task's event: found through its planId and entryId only.
  recordAudit(db, { action: 'task.deleted', subjectType: 'plan_task', subjectId: 9999,
    userId: risk, before: { title: 'Old idea', planId: plan, entryId: north } }, at(8));
  recordAudit(db, { action: 'plan.approved', subjectType: 'plan', subjectId: plan, userId: pia,
    before: { planStatus: 'submitted' }, after: { entryId: north, plantCode: 'P-NORTH',
      decision: 'approved', comment: 'Fine by 50% of us', planStatus: 'submitted' } }, at(9, 23));
  recordAudit(db, { action: 'plan.created', subjectType: 'plan', subjectId: otherPlan,
    userId: risk, after: { entryId: south, strategy: 'second_source' } }, at(10));
  recordAudit(db, { action: 'user.role_changed', subjectType: 'user', subjectId: pia,
    userId: t.userId(ACCOUNT_OF_ROLE.admin), before: { role: 'viewer', plantCodes: [] },
    after: { role: 'plant_manager', plantCodes: ['P-NORTH'] } }, at(11));
});
afterAll(() => t.close());

const as = (role: Role) => ({ Authorization: `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}` });
const list = async (query: Record<string, string> = {}) => {
  const response = await request(t.app).get('/api/audit').query(query).set(as('admin'));
  expect(response.status).toBe(200);
  return response.body as AuditListDto;
};
const actions = (body: { items: { action: string }[] }) => body.items.map((item) => item.action);
const history = (role: Role, type: string, id: string | number) =>
  request(t.app).get(`/api/audit/history/${type}/${id}`).set(as(role));

describe('GET /api/audit', () => {
  it('lists the whole trail newest first with who did it, and pages with a total', async () => {
    const all = await list();
    expect(all.total).toBe(7);
    expect(all.items[0]).toMatchObject({ action: 'user.role_changed', subjectType: 'user',
      subjectId: String(pia), user: { name: 'Alma Reyes' } });
    expect(all.items.map((item) => item.createdAt))
      .toEqual([...all.items.map((item) => item.createdAt)].sort().reverse());
    const page = await list({ limit: '2', offset: '2' });
    expect(page.total).toBe(7);
    expect(page.items.map((item) => item.id)).toEqual(all.items.slice(2, 4).map((item) => item.id));
  });

  it('filters by exact action, by a prefix ending in a dot, subject, user and text', async () => {
    expect(actions(await list({ action: 'plan.created' }))).toEqual(['plan.created',
      'plan.created']);
    expect(actions(await list({ action: 'plan.' })))
      .toEqual(['plan.created', 'plan.approved', 'plan.created']);
    // Without the dot it is exact: no action is called "plan".
    expect((await list({ action: 'plan' })).total).toBe(0);
    expect(actions(await list({ subjectType: 'plan_task' }))).toEqual(['task.deleted',
      'task.updated']);
    expect((await list({ subjectType: 'plan', subjectId: String(otherPlan) })).total).toBe(1);
    expect(actions(await list({ userId: String(pia) }))).toEqual(['plan.approved']);
    // The text is searched in before/after JSON, with % taken literally.
    expect(actions(await list({ q: '50%' }))).toEqual(['plan.approved']);
    expect(actions(await list({ q: 'OLD IDEA' }))).toEqual(['task.deleted']);
    expect(actions(await list({ q: 'Álvarez' }))).toEqual(['register.updated']);
    // And _ too: "plan_" finds the plan_task subjects, not "plan." actions.
    expect(actions(await list({ q: 'plan_' }))).toEqual(['task.deleted', 'task.updated']);
  });

  it('takes from and to as whole days, both inclusive', async () => {
    // 2026-03-09 23:00 is inside a range that ends on the 9th.
    expect(actions(await list({ from: '2026-03-08', to: '2026-03-09' })))
      .toEqual(['plan.approved', 'task.deleted']);
    expect(actions(await list({ from: '2026-03-11' }))).toEqual(['user.role_changed']);
  });

  it('refuses a bad date naming the field, and everyone but administrators', async () => {
    const bad = await request(t.app).get('/api/audit').query({ from: '9 March' })
      .set(as('admin'));
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error)).toContain('query.from');
    for (const role of ['risk_manager', 'plant_manager', 'buyer', 'viewer'] as const) {
      const refused = await request(t.app).get('/api/audit').set(as(role));
      expect(refused.status, role).toBe(403);
      expect(refused.body.error.message).toContain('Administrator');
    }
  });
});

describe('GET /api/audit/export.xlsx', () => {
  it('exports every match of the filters, one row per event, and an About sheet', async () => {
    const response = await request(t.app).get('/api/audit/export.xlsx')
      .query({ action: 'plan.' }).set(as('admin')).buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(response.status).toBe(200);
    expect(response.headers['content-disposition']).toMatch(/keelson-audit-.*\.xlsx/);
    const workbook = new ExcelJS.Workbook();
    const bytes = response.body as Buffer;
    await workbook.xlsx.load(
      bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    const sheet = workbook.getWorksheet('Audit trail')!;
    const rows = (sheet.getSheetValues() as unknown[][]).filter(Boolean)
      .map((row) => row.slice(1));
    expect(rows[0]).toEqual([...AUDIT_EXPORT_COLUMNS]);
    expect(rows.slice(1).map((row) => row[2]))
      .toEqual(['plan.created', 'plan.approved', 'plan.created']);
    const approved = rows[2]!;
    expect(approved[0]).toBe('2026-03-09T23:00:00.000Z');
    expect(approved[1]).toBe('Pia Lindqvist');
    expect(approved[3]).toBe(`plan ${plan}`);
    expect(JSON.parse(approved[4] as string)).toEqual({ planStatus: 'submitted' });
    expect(JSON.parse(approved[5] as string)).toMatchObject({ plantCode: 'P-NORTH' });
    const about = workbook.getWorksheet('About')!.getColumn(1).values.join('\n');
    expect(about).toContain('append-only');
    expect(about).toContain('action = plan.');
  });

  it('is for administrators only', async () => {
    const refused = await request(t.app).get('/api/audit/export.xlsx').set(as('risk_manager'));
    expect(refused.status).toBe(403);
  });
});

describe('GET /api/audit/history/:subjectType/:subjectId', () => {
  it("gathers a register entry's own events and its plans' and tasks' events", async () => {
    const response = await history('viewer', 'register_entry', north);
    expect(response.status).toBe(200);
    expect(actions(response.body as AuditHistoryDto)).toEqual(['plan.approved', 'task.deleted',
      'task.updated', 'plan.created', 'register.updated']);
  });

  it("gathers a plan's events and its tasks', not another plan's", async () => {
    const response = await history('risk_manager', 'plan', plan);
    expect(actions(response.body as AuditHistoryDto)).toEqual(['plan.approved', 'task.deleted',
      'task.updated', 'plan.created']);
    const other = await history('buyer', 'plan', otherPlan);
    expect(actions(other.body as AuditHistoryDto)).toEqual(['plan.created']);
  });

  it('answers 404 outside a plant manager\'s plants, as for a missing subject', async () => {
    expect((await history('plant_manager', 'register_entry', north)).status).toBe(200);
    expect((await history('plant_manager', 'plan', plan)).status).toBe(200);
    const outside = await history('plant_manager', 'register_entry', south);
    expect(outside.status).toBe(404);
    expect(outside.body.error.message).toBe(`Register entry ${south} was not found.`);
    expect((await history('plant_manager', 'plan', otherPlan)).status).toBe(404);
    expect((await history('admin', 'plan', 424242)).body.error.message)
      .toBe('Plan 424242 was not found.');
  });

  it('keeps other subject types for administrators, with a clear 403', async () => {
    const refused = await history('risk_manager', 'user', pia);
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/history of a user is for administrators/);
    const run = await history('plant_manager', 'analysis_run', 1);
    expect(run.status).toBe(403);
    expect(run.body.error.message).toMatch(/^The history of an analysis run is for admin/);
    const allowed = await history('admin', 'user', pia);
    expect(actions(allowed.body as AuditHistoryDto)).toEqual(['user.role_changed']);
  });

  it('refuses an id that is not a number, naming the parameter', async () => {
    const bad = await history('admin', 'register_entry', 'abc');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toContain('params.subjectId');
  });
});

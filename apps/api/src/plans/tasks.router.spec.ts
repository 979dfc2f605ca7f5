/**
 * Task rules through the API: owners must be active users, tasks are edited while the plan is a
 * draft or rejected and worked on once it is approved (by the owner, a risk manager or an
 * administrator), deletion, comments with their audit record, and the order of my tasks.
 */
import type ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MyTasksDto, PlanDto, PlanTaskDetailDto } from '@keelson/contracts';
import { ACCOUNT_OF_ROLE } from '../testing/test-app';
import { downloadWorkbook } from '../testing/workbook-download';
import { createPlanTestApp, type PlanTestApp } from './plan-test-setup';

let s: PlanTestApp;
let viewer: number;
let buyer: number;
beforeAll(async () => {
  s = await createPlanTestApp();
  viewer = s.t.userId('viewer@demo.test');
  buyer = s.t.userId('buyer@demo.test');
}, 60_000);
afterAll(() => s.t.close());

/** Submits and approves a plan on S-1-001 (P-SOUTH only). */
const approve = async (plan: PlanDto) => {
  await s.post('risk', `/api/plans/${plan.id}/submit`).expect(200);
  const response = await s.post('south', `/api/plans/${plan.id}/decisions`,
    { plantCode: 'P-SOUTH', decision: 'approved' });
  expect(response.status).toBe(200);
  return response.body as PlanDto;
};

describe('task owners', () => {
  it('must be active users, named by the body field', async () => {
    const entryId = s.entryOf['S-1-001']!;
    const missing = await s.post('risk', `/api/register/${entryId}/plans`, {
      strategy: 'other', description: 'x', tasks: [{ title: 'A' }, { title: 'B', ownerId: 9999 }],
    });
    expect(missing.status).toBe(400);
    expect(missing.body.error.message)
      .toBe('The request is not valid: body.tasks.1.ownerId: There is no user 9999.');
    const plan = await s.draft('S-1-001');
    s.t.database.sqlite.prepare('update users set is_active = 0 where id = ?').run(buyer);
    const inactive = await s.post('risk', `/api/plans/${plan.id}/tasks`,
      { title: 'Call the forge', ownerId: buyer });
    s.t.database.sqlite.prepare('update users set is_active = 1 where id = ?').run(buyer);
    expect(inactive.status).toBe(400);
    expect(inactive.body.error.details.issues).toEqual([{ path: 'body.ownerId',
      message: `User ${buyer} (Bruno Keller) is deactivated and cannot own a task.` }]);
    const untitled = await s.post('risk', `/api/plans/${plan.id}/tasks`, { title: ' ' });
    expect(untitled.status).toBe(400);
    expect(untitled.body.error.message).toContain('body.title: give the task a title');
  });
});

describe('editing tasks of a draft', () => {
  it('adds, edits and deletes tasks while the plan is a draft, with audit records', async () => {
    const plan = await s.draft('S-1-001');
    const added = await s.post('risk', `/api/plans/${plan.id}/tasks`,
      { title: 'Call the forge', ownerId: viewer, dueDate: '2026-03-10' });
    expect(added.status).toBe(201);
    const task = added.body as PlanTaskDetailDto;
    expect(task).toMatchObject({ planId: plan.id, title: 'Call the forge',
      owner: { id: viewer }, status: 'todo', isActive: false, isOverdue: false,
      plan: { id: plan.id, status: 'draft' } });
    const edited = await s.patch('admin', `/api/tasks/${task.id}`,
      { title: 'Call the forge twice', dueDate: null });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ title: 'Call the forge twice', dueDate: null,
      plan: { id: plan.id, status: 'draft' } });
    const early = await s.patch('viewer', `/api/tasks/${task.id}`, { status: 'doing' });
    expect(early.status).toBe(403);
    expect(early.body.error.message).toBe(`The tasks of plan ${plan.id} start when the plan is ` +
      'approved; until then their status stays "to do".');
    const notWriter = await s.patch('viewer', `/api/tasks/${task.id}`, { title: 'Mine' });
    expect(notWriter.status).toBe(403);
    expect(notWriter.body.error.message).toContain('Only a risk manager or an administrator');
    expect((await s.del('buyer', `/api/tasks/${task.id}`)).status).toBe(403);
    expect((await s.del('risk', `/api/tasks/${task.id}`)).status).toBe(204);
    expect((await s.get('risk', `/api/tasks/${task.id}`)).status).toBe(404);
    expect(s.audit('plan_task', task.id).map((row) => [row.action, row.before])).toEqual([
      ['task.created', null],
      ['task.updated', { title: 'Call the forge', dueDate: '2026-03-10' }],
      ['task.deleted', { title: 'Call the forge twice', ownerId: viewer, dueDate: null,
        status: 'todo' }],
    ]);
  });

  it('puts a rejected plan back to draft when a task is added', async () => {
    const plan = await s.draft('S-1-001');
    await s.post('risk', `/api/plans/${plan.id}/submit`).expect(200);
    await s.post('south', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-SOUTH', decision: 'rejected', comment: 'Needs an owner for the work.' })
      .expect(200);
    const added = await s.post('risk', `/api/plans/${plan.id}/tasks`,
      { title: 'Own the work', ownerId: viewer });
    expect((added.body as PlanTaskDetailDto).plan.status).toBe('draft');
    expect((await s.get('risk', `/api/plans/${plan.id}`)).body)
      .toMatchObject({ status: 'draft', rejectionComment: 'Needs an owner for the work.' });
    expect(s.audit('plan', plan.id).slice(-1)[0]).toMatchObject({ action: 'plan.updated',
      before: { status: 'rejected' }, after: { status: 'draft' } });
  });
});

describe('working on tasks of an approved plan', () => {
  it('lets the owner, a risk manager or an administrator change the status, nobody else',
    async () => {
      const plan = await approve(await s.draft('S-1-001', { tasks: [
        { title: 'Order stock', ownerId: viewer },
        { title: 'Check the shelf', ownerId: buyer }] }));
      const [own, other] = plan.tasks;
      expect(plan.status).toBe('approved');
      const refused = await s.patch('viewer', `/api/tasks/${other!.id}`, { status: 'done' });
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toBe('Only the task\'s owner (Bruno Keller), a risk ' +
        'manager or an administrator changes its status.');
      const south = await s.patch('south', `/api/tasks/${own!.id}`, { status: 'done' });
      expect(south.status).toBe(403);
      await s.patch('viewer', `/api/tasks/${own!.id}`, { status: 'done' }).expect(200);
      // Owner change on an active task: allowed to risk managers and administrators.
      const moved = await s.patch('risk', `/api/tasks/${other!.id}`, { ownerId: viewer });
      expect(moved.status).toBe(200);
      expect((moved.body as PlanTaskDetailDto).owner?.id).toBe(viewer);
      const cancelled = await s.patch('viewer', `/api/tasks/${other!.id}`,
        { status: 'cancelled' });
      expect((cancelled.body as PlanTaskDetailDto).plan.status).toBe('done');
      const afterDone = await s.patch('risk', `/api/tasks/${other!.id}`, { status: 'todo' });
      expect(afterDone.status).toBe(403);
      expect(afterDone.body.error.message)
        .toBe(`Plan ${plan.id} is done; its tasks cannot change any more.`);
      expect(s.audit('plan', plan.id).map((row) => row.action).slice(-3))
        .toEqual(['plan.approved', 'plan.in_progress', 'plan.done']);
    });

  it('lets a plant manager work on a task they own on a plan outside their plants', async () => {
    const north = s.t.userId('plant.north@demo.test');
    const plan = await approve(await s.draft('S-1-001', { tasks: [
      { title: 'Lend the gauge', ownerId: north }, { title: 'Not hers' }] }));
    const [own, other] = plan.tasks;
    expect((await s.get('north', `/api/plans/${plan.id}`)).status).toBe(404);
    expect((await s.get('north', `/api/tasks/${other!.id}`)).status).toBe(404);
    const mine = (await s.get('north', '/api/tasks/mine')).body as MyTasksDto;
    expect(mine.items.map((task) => task.id)).toEqual([own!.id]);
    expect((await s.get('north', `/api/tasks/${own!.id}`)).status).toBe(200);
    const done = await s.patch('north', `/api/tasks/${own!.id}`, { status: 'done' });
    expect(done.status).toBe(200);
    await s.post('north', `/api/tasks/${own!.id}/comments`, { text: 'Sent by courier.' })
      .expect(201);
  });

  it('takes comments from anyone who may see the plan, with an audit record', async () => {
    const plan = await s.draft('S-1-001', { tasks: [{ title: 'Order stock' }] });
    const taskId = plan.tasks[0]!.id;
    const first = await s.post('viewer', `/api/tasks/${taskId}/comments`,
      { text: 'Which supplier?' });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ text: 'Which supplier?',
      user: { id: viewer, name: 'Vera Novak' }, createdAt: s.t.clock.now.toISOString() });
    await s.post('south', `/api/tasks/${taskId}/comments`, { text: 'The usual one.' })
      .expect(201);
    const detail = (await s.get('buyer', `/api/tasks/${taskId}`)).body as PlanTaskDetailDto;
    expect(detail.comments.map((c) => [c.text, c.user?.name])).toEqual([
      ['Which supplier?', 'Vera Novak'], ['The usual one.', 'Sergio Marin']]);
    expect(detail.commentCount).toBe(2);
    expect(detail.plan).toMatchObject({ id: plan.id, entry: { supplierCode: 'S-1-001' } });
    const empty = await s.post('viewer', `/api/tasks/${taskId}/comments`, { text: '' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toContain('body.text');
    expect(s.audit('plan_task', taskId).slice(1)).toEqual([
      { action: 'task.commented', userId: viewer, before: null,
        after: { commentId: detail.comments[0]!.id, text: 'Which supplier?', planId: plan.id,
          entryId: s.entryOf['S-1-001'] } },
      { action: 'task.commented', userId: s.t.userId('plant.south@demo.test'), before: null,
        after: { commentId: detail.comments[1]!.id, text: 'The usual one.', planId: plan.id,
          entryId: s.entryOf['S-1-001'] } },
    ]);
  });
});

describe('GET /api/tasks/mine', () => {
  it('lists my open tasks on active plans, overdue first, then by due date, none last',
    async () => {
      const admin = s.t.userId('admin@demo.test');
      // Today is 2026-03-02 (the test clock): 02-01 and 02-20 are overdue.
      const plan = await approve(await s.draft('S-1-001', { tasks: [
        { title: 'Next week', ownerId: admin, dueDate: '2026-03-10' },
        { title: 'No date', ownerId: admin },
        { title: 'Long overdue', ownerId: admin, dueDate: '2026-02-01' },
        { title: 'Today', ownerId: admin, dueDate: '2026-03-02' },
        { title: 'Someone else\'s', ownerId: viewer, dueDate: '2026-01-01' },
        { title: 'Overdue', ownerId: admin, dueDate: '2026-02-20' },
        { title: 'Also no date', ownerId: admin },
      ] }));
      await s.draft('S-1-001', { tasks: [{ title: 'Draft only', ownerId: admin }] });
      const mine = async (query = '') => ((await s.get('admin', `/api/tasks/mine${query}`))
        .body as MyTasksDto).items;
      const items = await mine();
      expect(items.map((task) => [task.title, task.isOverdue])).toEqual([
        ['Long overdue', true], ['Overdue', true], ['Today', false], ['Next week', false],
        ['No date', false], ['Also no date', false]]);
      expect(items[0]).toMatchObject({ isActive: true, plan: { id: plan.id,
        strategy: 'second_source', status: 'approved',
        entry: { id: s.entryOf['S-1-001'], supplierCode: 'S-1-001' } } });
      const overdue = plan.tasks.find((task) => task.title === 'Long overdue')!;
      await s.patch('admin', `/api/tasks/${overdue.id}`, { status: 'done' }).expect(200);
      expect((await mine()).map((task) => task.title)[0]).toBe('Overdue');
      const all = await mine('?show=all');
      expect(all.map((task) => [task.title, task.isOverdue]).slice(0, 2))
        .toEqual([['Overdue', true], ['Long overdue', false]]);
      expect((await mine('?show=overdue')).map((task) => task.title)).toEqual(['Overdue']);
      const bad = await s.get('admin', '/api/tasks/mine?show=some');
      expect(bad.status).toBe(400);
      expect(bad.body.error.message).toContain('query.show');
    });
});

describe('GET /api/tasks', () => {
  it('lists everyone\'s tasks with their owners for risk managers and administrators only',
    async () => {
      const admin = s.t.userId('admin@demo.test');
      // Today is 2026-03-02 (the test clock).
      const plan = await approve(await s.draft('S-1-001', { tasks: [
        { title: 'Viewer, overdue', ownerId: viewer, dueDate: '2026-02-27' },
        { title: 'Buyer, later', ownerId: buyer, dueDate: '2026-04-01' },
        { title: 'Nobody, overdue', ownerId: null, dueDate: '2026-02-28' },
      ] }));
      await s.draft('S-1-001', { tasks: [{ title: 'Draft, overdue', ownerId: admin,
        dueDate: '2026-01-01' }] });
      const everyone = async (account: 'risk' | 'admin', query = '') =>
        ((await s.get(account, `/api/tasks${query}`)).body as MyTasksDto).items;

      const open = await everyone('risk');
      const ours = open.filter((task) => task.planId === plan.id);
      expect(ours.map((task) => [task.title, task.owner?.id ?? null, task.isOverdue])).toEqual([
        ['Viewer, overdue', viewer, true], ['Nobody, overdue', null, true],
        ['Buyer, later', buyer, false]]);
      // Overdue first over all plans; a draft's tasks are not on yet, so never listed.
      const firstNotOverdue = open.findIndex((task) => !task.isOverdue);
      expect(open.slice(firstNotOverdue).some((task) => task.isOverdue)).toBe(false);
      expect(open.some((task) => task.title === 'Draft, overdue')).toBe(false);
      // The same list as each owner's own, put together.
      const adminsOwn = ((await s.get('admin', '/api/tasks/mine')).body as MyTasksDto).items;
      expect(open.filter((task) => task.owner?.id === admin).map((task) => task.id))
        .toEqual(adminsOwn.map((task) => task.id));

      const overdue = await everyone('admin', '?show=overdue');
      expect(overdue.length).toBeGreaterThanOrEqual(2);
      expect(overdue.every((task) => task.isOverdue)).toBe(true);
      expect(overdue.map((task) => task.id))
        .toEqual(open.filter((task) => task.isOverdue).map((task) => task.id));

      for (const account of ['north', 'buyer', 'viewer'] as const) {
        const refused = await s.get(account, '/api/tasks');
        expect(refused.status).toBe(403);
        expect(refused.body.error.message).toMatch(/risk manager/i);
        expect((await s.get(account, '/api/tasks/export.xlsx')).status).toBe(403);
      }

      // The export holds the same rows in the same order, with the list's scope on "About".
      const exported = await download('risk', '/api/tasks/export.xlsx?show=overdue');
      expect(exported.fileName).toBe('keelson-tasks-everyone-overdue-2026-03-02.xlsx');
      expect(exported.rows.map((row) => row['Task'])).toEqual(overdue.map((task) => task.title));
      const viewerRow = exported.rows.find((row) => row['Task'] === 'Viewer, overdue')!;
      expect(viewerRow).toMatchObject({ Due: '2026-02-27', Overdue: 'yes',
        Status: 'To do', Plan: `Plan ${plan.id}: Second source` });
      expect(exported.about[1]).toContain(`${overdue.length} of everyone's overdue tasks`);
      expect(exported.about[2]).toContain('before 2026-03-02 (today, UTC)');
    });

  it('exports my own tasks for every role, named after me', async () => {
    const mine = await download('buyer', '/api/tasks/mine/export.xlsx?show=all');
    const listed = ((await s.get('buyer', '/api/tasks/mine?show=all')).body as MyTasksDto).items;
    expect(mine.rows.map((row) => row['Task'])).toEqual(listed.map((task) => task.title));
    expect(mine.rows.length).toBeGreaterThan(0);
    expect(mine.header).toEqual(['Task', 'Owner', 'Status', 'Due', 'Overdue', 'Plan',
      'Plan status', 'Register entry', 'Supplier']);
    expect(mine.about[1]).toContain('Bruno Keller\'s tasks in every status');
    expect((await s.get('buyer', '/api/tasks/mine/export.xlsx?show=some')).status).toBe(400);
  });
});

/** Downloads a task workbook and reads its "Tasks" rows and "About" lines back with exceljs. */
async function download(account: 'risk' | 'buyer', path: string) {
  const { response, workbook } = await downloadWorkbook(s.t, path,
    ACCOUNT_OF_ROLE[account === 'risk' ? 'risk_manager' : 'buyer']);
  expect(response.status).toBe(200);
  expect(response.headers['content-type']).toContain('spreadsheetml');
  const fileName = /filename="?([^";]+)"?/
    .exec(String(response.headers['content-disposition']))![1];
  const sheet = workbook.getWorksheet('Tasks')!;
  const header = (sheet.getRow(1).values as ExcelJS.CellValue[]).slice(1).map(String);
  const rows: Record<string, string>[] = [];
  sheet.eachRow((row, number) => {
    if (number === 1) return;
    const values = (row.values as ExcelJS.CellValue[]).slice(1);
    rows.push(Object.fromEntries(header.map((name, i) => [name, String(values[i] ?? '')])));
  });
  const about: string[] = [];
  workbook.getWorksheet('About')!.eachRow((row) => about.push(String(row.getCell(1).value)));
  return { fileName, header, rows, about };
}

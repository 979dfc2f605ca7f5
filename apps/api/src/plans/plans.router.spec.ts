/**
 * The plan lifecycle through the API: draft, what-if, submission, one decision per plant,
 * approval (tasks on, entry mitigating), work on the tasks to done; a rejection back to draft
 * and a resubmission; withdrawal; lists and approvals; and the audit trail of every step.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type {
  MyTasksDto, PlanDetailListDto, PlanDto, PlanListDto, PlanTaskDetailDto,
} from '@keelson/contracts';
import { createPlanTestApp, SECOND_SOURCE, type PlanTestApp } from './plan-test-setup';

let s: PlanTestApp;
beforeAll(async () => {
  s = await createPlanTestApp();
}, 60_000);
afterAll(() => s.t.close());

const later = (minutes: number) => {
  s.t.clock.now = new Date(s.t.clock.now.getTime() + minutes * 60_000);
};
const plan = async (id: number, account: Parameters<PlanTestApp['get']>[0] = 'risk') => {
  const response = await s.get(account, `/api/plans/${id}`);
  expect(response.status).toBe(200);
  return response.body as PlanDto;
};
const entryStatus = (id: number) => (s.t.database.sqlite
  .prepare('select status from register_entries where id = ?').get(id) as { status: string })
  .status;

describe('a second-source plan from draft to done', () => {
  it('drafts, runs the what-if, submits, is approved by both plants and is worked to done',
    async () => {
      const buyer = s.t.userId('buyer@demo.test');
      const risk = s.t.userId('risk@demo.test');
      const entryId = s.entryOf['S-2-SHARED-A']!;
      const created = await s.post('risk', `/api/register/${entryId}/plans`, {
        strategy: 'second_source', description: 'Qualify S-2-011 for M-01.',
        estimatedCost: 25_000, targetDate: '2026-06-30', changes: SECOND_SOURCE,
        tasks: [{ title: 'Send the drawing pack', ownerId: buyer, dueDate: '2026-03-20' },
          { title: 'Trial order' }],
      });
      expect(created.status).toBe(201);
      const draft = created.body as PlanDto;
      expect(draft).toMatchObject({ status: 'draft', strategy: 'second_source',
        author: { id: risk, name: 'Rania Okafor' }, plants: ['P-NORTH', 'P-SOUTH'],
        pendingPlants: [], whatIf: null, changes: SECOND_SOURCE,
        entry: { id: entryId, supplierCode: 'S-2-SHARED-A', status: 'open' },
        can: { edit: true, submit: false, withdraw: true, decideFor: [] } });
      expect(draft.tasks.map((task) => [task.title, task.owner?.id ?? null, task.isActive]))
        .toEqual([['Send the drawing pack', buyer, false], ['Trial order', null, false]]);

      const early = await s.post('risk', `/api/plans/${draft.id}/submit`);
      expect(early.status).toBe(409);
      expect(early.body.error.code).toBe('what_if_needed');
      expect(early.body.error.message).toContain('run the what-if so the approvers see the');

      later(5);
      const evaluated = await s.post('risk', `/api/plans/${draft.id}/what-if`);
      expect(evaluated.status).toBe(200);
      const whatIf = (evaluated.body as PlanDto).whatIf!;
      expect(whatIf).toMatchObject({ networkVersionId: 1, supplierCode: 'S-2-SHARED-A',
        changes: SECOND_SOURCE, evaluatedBy: { id: risk, name: 'Rania Okafor' },
        evaluatedAt: s.t.clock.now.toISOString() });
      expect([whatIf.before.singlePointOfFailure, whatIf.after.singlePointOfFailure])
        .toEqual([true, false]);
      expect(whatIf.after.revenueImpact).toBeLessThan(whatIf.before.revenueImpact);
      expect((evaluated.body as PlanDto).can.submit).toBe(true);

      later(5);
      const submitted = await s.post('risk', `/api/plans/${draft.id}/submit`);
      expect(submitted.status).toBe(200);
      expect(submitted.body).toMatchObject({ status: 'submitted',
        submittedAt: s.t.clock.now.toISOString(), pendingPlants: ['P-NORTH', 'P-SOUTH'],
        can: { edit: false, submit: false, withdraw: true } });
      expect((await plan(draft.id, 'north')).can.decideFor).toEqual(['P-NORTH']);

      const waiting = await s.get('north', '/api/plans?awaitingMe=true');
      expect((waiting.body as PlanListDto).items.map((item) => item.id)).toEqual([draft.id]);
      expect((waiting.body as PlanListDto).items[0]!.whatIfAfter)
        .toMatchObject({ singlePointOfFailure: false });
      // detail=full: the same plans, each whole (as GET /api/plans/:id answers the user).
      const full = await s.get('north', '/api/plans?awaitingMe=true&detail=full');
      expect(full.status).toBe(200);
      expect((full.body as PlanDetailListDto).items)
        .toEqual([await plan(draft.id, 'north')]);
      expect((await s.get('north', '/api/plans?detail=everything')).status).toBe(400);
      const none = await s.get('risk', '/api/plans?awaitingMe=true');
      expect((none.body as PlanListDto).total).toBe(0);

      later(60);
      const north = await s.post('north', `/api/plans/${draft.id}/decisions`,
        { plantCode: 'P-NORTH', decision: 'approved' });
      expect(north.status).toBe(200);
      expect(north.body).toMatchObject({ status: 'submitted', pendingPlants: ['P-SOUTH'],
        can: { decideFor: [] } });
      const stillWaiting = await s.get('north', '/api/plans?awaitingMe=true');
      expect((stillWaiting.body as PlanListDto).total).toBe(0);
      expect(entryStatus(entryId)).toBe('open');

      later(60);
      const south = await s.post('south', `/api/plans/${draft.id}/decisions`,
        { plantCode: 'P-SOUTH', decision: 'approved', comment: 'Fine by P-SOUTH.' });
      expect(south.status).toBe(200);
      const approved = south.body as PlanDto;
      expect(approved).toMatchObject({ status: 'approved', pendingPlants: [],
        decidedAt: s.t.clock.now.toISOString(), entry: { status: 'mitigating' } });
      expect(approved.decisions.map((d) => [d.plantCode, d.decision, d.user?.name]))
        .toEqual([['P-SOUTH', 'approved', 'Sergio Marin'], ['P-NORTH', 'approved',
          'Pia Lindqvist']]);
      expect(approved.tasks.every((task) => task.isActive)).toBe(true);
      expect(entryStatus(entryId)).toBe('mitigating');

      const mine = await s.get('buyer', '/api/tasks/mine');
      expect((mine.body as MyTasksDto).items.map((task) => [task.title, task.plan.id,
        task.plan.entry.supplierCode])).toEqual([['Send the drawing pack', draft.id,
        'S-2-SHARED-A']]);
      const [ownTask, otherTask] = approved.tasks;

      const doing = await s.patch('buyer', `/api/tasks/${ownTask!.id}`, { status: 'doing' });
      expect(doing.status).toBe(200);
      expect((doing.body as PlanTaskDetailDto).plan.status).toBe('in_progress');
      await s.patch('buyer', `/api/tasks/${ownTask!.id}`, { status: 'done' }).expect(200);
      expect((await plan(draft.id)).status).toBe('in_progress');
      const last = await s.patch('risk', `/api/tasks/${otherTask!.id}`, { status: 'done' });
      expect(last.status).toBe(200);
      expect((await plan(draft.id)).status).toBe('done');
      expect((await s.get('buyer', '/api/tasks/mine')).body.items).toEqual([]);
      expect((await s.get('buyer', '/api/tasks/mine?show=all')).body.items
        .map((task: { status: string }) => task.status)).toEqual(['done']);

      const trail = s.audit('plan', draft.id);
      expect(trail.map((row) => [row.action, row.userId])).toEqual([
        ['plan.created', risk],
        ['plan.what_if_evaluated', risk],
        ['plan.submitted', risk],
        ['plan.approved', s.t.userId('plant.north@demo.test')],
        ['plan.approved', s.t.userId('plant.south@demo.test')],
        ['plan.in_progress', buyer],
        ['plan.done', risk],
      ]);
      expect(trail[1]!.after).toMatchObject({ entryId, networkVersionId: 1,
        before: { singlePointOfFailure: true }, after: { singlePointOfFailure: false } });
      expect(trail[2]).toMatchObject({ before: { status: 'draft' },
        after: { status: 'submitted', entryId, plants: ['P-NORTH', 'P-SOUTH'] } });
      expect(trail[3]!.after).toEqual({ plantCode: 'P-NORTH', decision: 'approved', comment: '',
        planStatus: 'submitted', entryId });
      expect(trail[4]!.after).toEqual({ plantCode: 'P-SOUTH', decision: 'approved',
        comment: 'Fine by P-SOUTH.', planStatus: 'approved', entryId });
      expect(trail[6]).toMatchObject({ before: { status: 'in_progress' },
        after: { status: 'done', entryId, tasksDone: 2, tasksCancelled: 0 } });
      expect(s.audit('register_entry', entryId).map((row) => [row.action, row.before, row.after]))
        .toEqual([['register.mitigating', { status: 'open' },
          { status: 'mitigating', planId: draft.id }]]);
      const taskTrail = s.audit('plan_task', ownTask!.id);
      expect(taskTrail.map((row) => [row.action, row.before, row.after])).toEqual([
        ['task.created', null, { planId: draft.id, entryId, title: 'Send the drawing pack',
          ownerId: buyer, dueDate: '2026-03-20' }],
        ['task.updated', { status: 'todo' }, { status: 'doing', planId: draft.id, entryId }],
        ['task.updated', { status: 'doing' }, { status: 'done', planId: draft.id, entryId }],
      ]);
    });
});

describe('a rejection', () => {
  it('rejects at once, goes back to draft on an edit with the comment kept, and is resubmitted',
    async () => {
      const entryId = s.entryOf['S-1-001']!;
      const draft = await s.draft('S-1-001', { strategy: 'safety_stock' });
      later(1);
      await s.post('risk', `/api/plans/${draft.id}/submit`).expect(200);
      const short = await s.post('south', `/api/plans/${draft.id}/decisions`,
        { plantCode: 'P-SOUTH', decision: 'rejected', comment: 'No' });
      expect(short.status).toBe(400);
      expect(short.body.error.message).toContain('body.comment');
      later(1);
      const rejected = await s.post('south', `/api/plans/${draft.id}/decisions`,
        { plantCode: 'P-SOUTH', decision: 'rejected', comment: 'Stock costs too much here.' });
      expect(rejected.status).toBe(200);
      expect(rejected.body).toMatchObject({ status: 'rejected',
        rejectionComment: 'Stock costs too much here.', pendingPlants: [],
        can: { edit: false, submit: false, decideFor: [] } });
      expect((await plan(draft.id)).can).toMatchObject({ edit: true, submit: true });
      expect(entryStatus(entryId)).toBe('open');

      later(1);
      const edited = await s.patch('risk', `/api/plans/${draft.id}`,
        { description: 'Four weeks of stock, not eight.' });
      expect(edited.status).toBe(200);
      expect(edited.body).toMatchObject({ status: 'draft',
        description: 'Four weeks of stock, not eight.',
        rejectionComment: 'Stock costs too much here.' });

      later(1);
      const again = await s.post('risk', `/api/plans/${draft.id}/submit`);
      expect(again.status).toBe(200);
      expect(again.body.pendingPlants).toEqual(['P-SOUTH']);
      const approved = await s.post('south', `/api/plans/${draft.id}/decisions`,
        { plantCode: 'P-SOUTH', decision: 'approved' });
      expect(approved.status).toBe(200);
      const body = approved.body as PlanDto;
      // No tasks: nothing left to do, so the approval finishes the plan.
      expect(body.status).toBe('done');
      expect(body.decisions.map((d) => d.decision)).toEqual(['approved', 'rejected']);
      expect(new Set(body.decisions.map((d) => d.submittedAt)).size).toBe(2);
      expect(s.audit('plan', draft.id).map((row) => row.action)).toEqual(['plan.created',
        'plan.submitted', 'plan.rejected', 'plan.updated', 'plan.submitted', 'plan.approved',
        'plan.done']);
      expect(s.audit('plan', draft.id)[3]).toMatchObject({
        before: { description: 'Qualify a second forge.', status: 'rejected' },
        after: { description: 'Four weeks of stock, not eight.', status: 'draft', entryId } });
    });
});

describe('withdrawal', () => {
  it('withdraws a submitted plan, which then leaves the approvals and cannot be edited',
    async () => {
      const draft = await s.draft('S-2-SHARED-B');
      await s.post('risk', `/api/plans/${draft.id}/submit`).expect(200);
      const withdrawn = await s.post('admin', `/api/plans/${draft.id}/withdraw`);
      expect(withdrawn.status).toBe(200);
      expect(withdrawn.body).toMatchObject({ status: 'withdrawn',
        can: { edit: false, submit: false, withdraw: false, decideFor: [] } });
      const again = await s.post('admin', `/api/plans/${draft.id}/withdraw`);
      expect(again.status).toBe(403);
      expect(again.body.error.message).toBe(`Plan ${draft.id} is withdrawn already and cannot ` +
        'be withdrawn.');
      const waiting = await s.get('east', '/api/plans?awaitingMe=true');
      expect(waiting.body.items).toEqual([]);
      const edit = await s.patch('risk', `/api/plans/${draft.id}`, { description: 'Again.' });
      expect(edit.status).toBe(403);
      expect(edit.body.error.message).toBe(`Plan ${draft.id} is withdrawn and cannot be edited.`);
      expect(s.audit('plan', draft.id).at(-1)).toMatchObject({ action: 'plan.withdrawn',
        userId: s.t.userId('admin@demo.test'), before: { status: 'submitted' },
        after: { status: 'withdrawn' } });
    });
});

describe('lists', () => {
  it('lists an entry\'s plans and filters the plan list by status and entry', async () => {
    const entryId = s.entryOf['S-2-SHARED-A']!;
    const forEntry = await s.get('viewer', `/api/register/${entryId}/plans`);
    expect(forEntry.status).toBe(200);
    expect((forEntry.body as PlanListDto).items.map((item) => item.entry.id))
      .toEqual([entryId]);
    const done = await s.get('buyer', '/api/plans?status=done');
    expect((done.body as PlanListDto).total).toBe(2);
    const byEntry = await s.get('buyer', `/api/plans?entryId=${entryId}&limit=1`);
    expect((byEntry.body as PlanListDto).items.map((item) => item.status)).toEqual(['done']);
    const bad = await s.get('buyer', '/api/plans?status=finished');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toContain('query.status');
    expect((await s.get('viewer', '/api/register/99999/plans')).status).toBe(404);
    expect((await s.get('viewer', '/api/plans/99999')).status).toBe(404);
  });

  it('edits a draft\'s fields and names the body field that is not valid', async () => {
    const draft = await s.draft('S-2-SHARED-A');
    const edited = await s.patch('risk', `/api/plans/${draft.id}`,
      { estimatedCost: 1200, targetDate: '2026-09-01', strategy: 'contract_terms' });
    expect(edited.body).toMatchObject({ estimatedCost: 1200, targetDate: '2026-09-01',
      strategy: 'contract_terms', status: 'draft' });
    const bad = await s.patch('risk', `/api/plans/${draft.id}`, { targetDate: '1 May' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toContain('body.targetDate');
    const badChange = await s.post('risk', `/api/plans/${draft.id}/what-if`, { changes: [
      { kind: 'add_source', itemCode: 'M-404', supplierCode: 'S-2-011', buyerCode: null }] });
    expect(badChange.status).toBe(400);
    expect(badChange.body.error.message).toContain('body.changes[0].itemCode');
    // A what-if whose changes were edited afterwards no longer counts.
    await s.post('risk', `/api/plans/${draft.id}/what-if`, { changes: SECOND_SOURCE })
      .expect(200);
    expect((await plan(draft.id)).can.submit).toBe(true);
    await s.patch('risk', `/api/plans/${draft.id}`, { changes: [{ kind: 'set_recovery',
      supplierCode: 'S-2-SHARED-A', recoveryWeeks: 2 }] }).expect(200);
    const stale = await s.post('risk', `/api/plans/${draft.id}/submit`);
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('what_if_needed');
  });
});

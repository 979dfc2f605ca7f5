/**
 * Histories of a real plan's life through the API: a risk manager drafts a second-source plan
 * for S-2-SHARED-A (P-NORTH and P-SOUTH) with a task, runs the what-if, submits; both plant
 * managers approve. The entry's history then holds every step of the plan and its task, the
 * plan's history holds the plan's and the task's, and the trail shows who did each.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AuditHistoryDto, AuditListDto, PlanDto } from '@keelson/contracts';
import { createPlanTestApp, SECOND_SOURCE, type PlanTestApp } from '../plans/plan-test-setup';

let s: PlanTestApp;
let plan: PlanDto;
let entryId: number;
const later = (minutes: number) => {
  s.t.clock.now = new Date(s.t.clock.now.getTime() + minutes * 60_000);
};

beforeAll(async () => {
  s = await createPlanTestApp();
  entryId = s.entryOf['S-2-SHARED-A']!;
  later(1);
  plan = await s.draft('S-2-SHARED-A', { changes: SECOND_SOURCE,
    tasks: [{ title: 'Trial order' }] });
  later(1);
  await s.post('risk', `/api/plans/${plan.id}/what-if`).expect(200);
  later(1);
  await s.post('risk', `/api/plans/${plan.id}/submit`).expect(200);
  later(1);
  await s.post('north', `/api/plans/${plan.id}/decisions`,
    { plantCode: 'P-NORTH', decision: 'approved', comment: 'ok' }).expect(200);
  later(1);
  await s.post('south', `/api/plans/${plan.id}/decisions`,
    { plantCode: 'P-SOUTH', decision: 'approved' }).expect(200);
}, 60_000);
afterAll(() => s.t.close());

const history = async (account: Parameters<PlanTestApp['get']>[0], path: string) => {
  const response = await s.get(account, `/api/audit/history/${path}`);
  expect(response.status, response.text).toBe(200);
  return (response.body as AuditHistoryDto).items;
};

describe('the history of a plan that was approved', () => {
  it("shows every step on the register entry's history, newest first, with who", async () => {
    const items = await history('viewer', `register_entry/${entryId}`);
    const steps = items.map((item) => [item.action, item.user?.name]);
    // The last approval and the entry's move to mitigating share a transaction (and a time).
    expect(steps).toEqual([
      ['register.mitigating', 'Sergio Marin'],
      ['plan.approved', 'Sergio Marin'],
      ['plan.approved', 'Pia Lindqvist'],
      ['plan.submitted', 'Rania Okafor'],
      ['plan.what_if_evaluated', 'Rania Okafor'],
      ['task.created', 'Rania Okafor'],
      ['plan.created', 'Rania Okafor'],
    ]);
    const times = items.map((item) => item.createdAt);
    expect(times).toEqual([...times].sort().reverse());
    const north = items.find((item) => item.user?.name === 'Pia Lindqvist')!;
    expect(north.after).toMatchObject({ plantCode: 'P-NORTH', decision: 'approved',
      comment: 'ok', entryId });
  });

  it("keeps the plan's history to the plan and its task", async () => {
    const items = await history('south', `plan/${plan.id}`);
    expect(new Set(items.map((item) => item.subjectType))).toEqual(new Set(['plan',
      'plan_task']));
    expect(items.map((item) => item.action)).toContain('task.created');
    expect(items.map((item) => item.action)).not.toContain('register.mitigating');
  });

  it("answers 404 to the manager of a plant the plan doesn't touch", async () => {
    for (const path of [`register_entry/${entryId}`, `plan/${plan.id}`]) {
      const response = await s.get('east', `/api/audit/history/${path}`);
      expect(response.status, path).toBe(404);
    }
  });

  it("lists the plan's steps in the administrator's trail by the action prefix", async () => {
    const response = await s.get('admin', '/api/audit?action=plan.&subjectType=plan');
    const body = response.body as AuditListDto;
    expect(body.items.every((item) => item.subjectId === String(plan.id))).toBe(true);
    expect(body.items.map((item) => item.action).reverse().slice(0, 5)).toEqual([
      'plan.created', 'plan.what_if_evaluated', 'plan.submitted', 'plan.approved',
      'plan.approved']);
  });
});

/**
 * The permissions of the issue, each through the API with its 403 and message: a plant manager
 * decides only for their own plants and only once per plant, a risk manager cannot approve, a
 * buyer cannot draft, nobody approves their own plan, a decided plan cannot be edited; also the
 * refusals of submission (409) and the plant scoping of reads (404).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PlanDto, PlanListDto } from '@keelson/contracts';
import { createPlanTestApp, type PlanTestApp } from './plan-test-setup';

let s: PlanTestApp;
beforeAll(async () => {
  s = await createPlanTestApp();
}, 60_000);
afterAll(() => s.t.close());

/** A plan on S-2-SHARED-A (P-NORTH and P-SOUTH), submitted, with one task owned by the buyer. */
const submitted = async () => {
  const draft = await s.draft('S-2-SHARED-A', { tasks: [{ title: 'Audit the forge',
    ownerId: s.t.userId('buyer@demo.test'), dueDate: '2026-04-01' }] });
  await s.post('risk', `/api/plans/${draft.id}/submit`).expect(200);
  return draft;
};
/** A plan on S-2-SHARED-A approved by both plants. */
const approved = async () => {
  const plan = await submitted();
  await s.post('north', `/api/plans/${plan.id}/decisions`,
    { plantCode: 'P-NORTH', decision: 'approved' }).expect(200);
  await s.post('south', `/api/plans/${plan.id}/decisions`,
    { plantCode: 'P-SOUTH', decision: 'approved' }).expect(200);
  return plan;
};
const expect403 = (response: { status: number; body: { error: { message: string } } },
  message: string | RegExp) => {
  expect(response.status).toBe(403);
  if (typeof message === 'string') expect(response.body.error.message).toBe(message);
  else expect(response.body.error.message).toMatch(message);
};

describe('who drafts and edits', () => {
  it('refuses a buyer drafting, editing, evaluating, submitting or withdrawing', async () => {
    const message = 'This needs the role Risk manager or Administrator; you are signed in as ' +
      'Buyer.';
    const entryId = s.entryOf['S-2-SHARED-A']!;
    expect403(await s.post('buyer', `/api/register/${entryId}/plans`,
      { strategy: 'other', description: 'Mine.' }), message);
    const draft = await s.draft('S-2-SHARED-A');
    expect403(await s.patch('buyer', `/api/plans/${draft.id}`, { description: 'x' }), message);
    for (const action of ['what-if', 'submit', 'withdraw', 'tasks']) {
      expect403(await s.post('buyer', `/api/plans/${draft.id}/${action}`, { title: 'x' }),
        message);
    }
    expect((await s.get('buyer', `/api/plans/${draft.id}`)).body.can)
      .toEqual({ edit: false, submit: false, withdraw: false, decideFor: [] });
    expect(s.audit('plan', draft.id).map((row) => row.action)).toEqual(['plan.created']);
  });
});

describe('who decides', () => {
  it('refuses a risk manager or an administrator approving', async () => {
    const plan = await submitted();
    expect403(await s.post('risk', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'approved' }),
    'This needs the role Plant manager; you are signed in as Risk manager.');
    expect403(await s.post('admin', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'approved' }),
    'This needs the role Plant manager; you are signed in as Administrator.');
  });

  it('refuses a plant manager deciding for a plant that is not theirs', async () => {
    const plan = await submitted();
    expect403(await s.post('north', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-SOUTH', decision: 'approved' }),
    'You manage P-NORTH; this decision is for P-SOUTH.');
    // P-EAST's manager on a plan that does not touch P-EAST.
    expect403(await s.post('east', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-EAST', decision: 'approved' }),
    `Plan ${plan.id} needs decisions for P-NORTH, P-SOUTH; P-EAST is not a plant its risk ` +
      'touches.');
    expect403(await s.post('east', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'approved' }),
    'You manage P-EAST; this decision is for P-NORTH.');
    expect((await s.get('risk', `/api/plans/${plan.id}`)).body.decisions).toEqual([]);
  });

  it('lets each plant decide only once per submission', async () => {
    const plan = await submitted();
    await s.post('north', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'approved' }).expect(200);
    const message = `P-NORTH has already decided on plan ${plan.id}; a plan is decided only ` +
      'once per plant (in each submission).';
    expect403(await s.post('north', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'rejected', comment: 'Changed my mind.' }), message);
    // A second manager of the same plant cannot decide for it either.
    const other = s.t.database.sqlite.prepare(`insert into users (email, name, password_hash,
      role, is_active, created_at, updated_at) values ('north2@demo.test', 'Second North', 'x',
      'plant_manager', 1, '2026-03-01', '2026-03-01')`).run().lastInsertRowid;
    s.t.database.sqlite.prepare('insert into user_plants values (?, ?)').run(other, 'P-NORTH');
    const second = await s.post('north2@demo.test', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'approved' });
    expect403(second, message);
    const body = (await s.get('risk', `/api/plans/${plan.id}`)).body as PlanDto;
    expect([body.status, body.decisions.length, body.pendingPlants])
      .toEqual(['submitted', 1, ['P-SOUTH']]);
  });

  it('refuses the author approving their own plan', async () => {
    const plan = await submitted();
    // The author became P-NORTH's manager after writing the plan.
    s.t.database.sqlite.prepare('update mitigation_plans set author_id = ? where id = ?')
      .run(s.t.userId('plant.north@demo.test'), plan.id);
    expect403(await s.post('north', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'approved' }),
    `Nobody approves their own plan: you wrote plan ${plan.id}, so the other plant managers ` +
      'decide on it.');
    expect((await s.get('north', `/api/plans/${plan.id}`)).body.can.decideFor).toEqual([]);
    const waiting = (await s.get('north', '/api/plans?awaitingMe=true')).body as PlanListDto;
    expect(waiting.items.map((item) => item.id)).not.toContain(plan.id);
  });

  it('refuses a decision on a draft, a decided plan and a withdrawn plan', async () => {
    const draft = await s.draft('S-2-SHARED-A');
    expect403(await s.post('north', `/api/plans/${draft.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'approved' }),
    `Plan ${draft.id} is a draft and not submitted, so there is nothing to decide yet.`);
    const plan = await approved();
    expect403(await s.post('north', `/api/plans/${plan.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'rejected', comment: 'Too late now.' }),
    `Plan ${plan.id} is approved; a decided plan cannot be decided again.`);
    await s.post('risk', `/api/plans/${draft.id}/submit`).expect(200);
    await s.post('risk', `/api/plans/${draft.id}/withdraw`).expect(200);
    expect403(await s.post('north', `/api/plans/${draft.id}/decisions`,
      { plantCode: 'P-NORTH', decision: 'approved' }), `Plan ${draft.id} was withdrawn.`);
  });
});

describe('a decided plan', () => {
  it('cannot be edited, evaluated, resubmitted or given tasks', async () => {
    const plan = await approved();
    const message = `Plan ${plan.id} is approved; a decided plan cannot be edited.`;
    expect403(await s.patch('risk', `/api/plans/${plan.id}`, { description: 'Later.' }),
      message);
    expect403(await s.post('risk', `/api/plans/${plan.id}/what-if`), message);
    expect403(await s.post('risk', `/api/plans/${plan.id}/submit`), message);
    expect403(await s.post('risk', `/api/plans/${plan.id}/tasks`, { title: 'One more' }),
      message);
    const task = plan.tasks[0]!;
    expect403(await s.patch('risk', `/api/tasks/${task.id}`, { title: 'Renamed' }), message);
    expect403(await s.patch('admin', `/api/tasks/${task.id}`, { dueDate: '2026-05-01' }),
      message);
    expect403(await s.del('risk', `/api/tasks/${task.id}`), message);
    // The task's status and comments stay open to work on.
    await s.patch('buyer', `/api/tasks/${task.id}`, { status: 'doing' }).expect(200);
    expect403(await s.patch('risk', `/api/plans/${plan.id}`, { description: 'Later.' }),
      `Plan ${plan.id} is in progress; a decided plan cannot be edited.`);
    await s.post('viewer', `/api/tasks/${task.id}/comments`, { text: 'Looks good.' })
      .expect(201);
  });

  it('cannot be edited while it waits for its decisions', async () => {
    const plan = await submitted();
    expect403(await s.patch('risk', `/api/plans/${plan.id}`, { description: 'Later.' }),
      `Plan ${plan.id} is waiting for approval and cannot be edited; withdraw it and draft a ` +
        'new plan if it must change.');
    expect403(await s.post('risk', `/api/plans/${plan.id}/submit`), /waiting for approval/);
  });
});

describe('submission refusals', () => {
  it('refuses an entry without plants and a plant without an active manager (409)', async () => {
    const noPlants = await s.draft('S-1-002');
    const refused = await s.post('risk', `/api/plans/${noPlants.id}/submit`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('plan_without_plants');
    expect(refused.body.error.message).toContain('touches no plant');

    const east = s.t.userId('plant.east@demo.test');
    s.t.database.sqlite.prepare('update users set is_active = 0 where id = ?').run(east);
    const plan = await s.draft('S-2-SHARED-B');
    const noManager = await s.post('risk', `/api/plans/${plan.id}/submit`);
    s.t.database.sqlite.prepare('update users set is_active = 1 where id = ?').run(east);
    expect(noManager.status).toBe(409);
    expect(noManager.body.error).toMatchObject({ code: 'plant_without_manager',
      message: `Plant P-EAST has no active plant manager to approve plan ${plan.id}; ask an ` +
        'administrator to assign one.' });
    expect((await s.get('risk', `/api/plans/${plan.id}`)).body.status).toBe('draft');
  });
});

describe('plant scoping of reads', () => {
  it('shows a plant manager only plans whose entry touches one of their plants', async () => {
    const south = await s.draft('S-1-001', { tasks: [{ title: 'Count the stock' }] });
    const shared = await s.draft('S-2-SHARED-A');
    expect((await s.get('north', `/api/plans/${south.id}`)).status).toBe(404);
    expect((await s.get('south', `/api/plans/${south.id}`)).status).toBe(200);
    expect((await s.get('north', `/api/plans/${shared.id}`)).status).toBe(200);
    const listed = (await s.get('north', '/api/plans')).body as PlanListDto;
    expect(listed.items.some((item) => item.id === south.id)).toBe(false);
    expect(listed.items.some((item) => item.id === shared.id)).toBe(true);
    expect(listed.items.every((item) => item.plants.includes('P-NORTH'))).toBe(true);
    expect((await s.get('north', `/api/register/${s.entryOf['S-1-001']}/plans`)).status)
      .toBe(404);
    const taskId = south.tasks[0]!.id;
    expect((await s.get('north', `/api/tasks/${taskId}`)).status).toBe(404);
    expect((await s.post('north', `/api/tasks/${taskId}/comments`, { text: 'Hello' })).status)
      .toBe(404);
    for (const account of ['viewer', 'buyer', 'admin'] as const) {
      expect((await s.get(account, `/api/plans/${south.id}`)).status).toBe(200);
    }
  });

  it('needs a session', async () => {
    expect((await s.get('viewer', '/api/plans').unset('Authorization')).status).toBe(401);
  });
});

/**
 * The plan services with a recording listener: which events go out, with which arguments, and
 * only after the transaction has committed; and the unique index on decisions as the backstop
 * when two decisions for one plant race past the service's own check.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '../http/auth-context';
import { PlantsRepository } from '../plants/plants.repository';
import { PlanApprovalsService } from './plan-approvals.service';
import type { PlanEvents } from './plan-events';
import { PlanViews } from './plan-views';
import { createPlanServices, type PlanServices } from './plans.module';
import { PlansRepository } from './plans.repository';
import { ACCOUNTS, createPlanTestApp, SECOND_SOURCE, type PlanTestApp } from './plan-test-setup';

let s: PlanTestApp;
let services: PlanServices;
/** Each event with whether a transaction was open when it arrived. */
let heard: { name: string; event: unknown; inTransaction: boolean }[];
beforeAll(async () => {
  s = await createPlanTestApp();
  const record = (name: string) => (event: unknown) => {
    heard.push({ name, event, inTransaction: s.t.database.sqlite.inTransaction });
  };
  const events: PlanEvents = { planSubmitted: record('planSubmitted'),
    planDecided: record('planDecided'), taskAssigned: record('taskAssigned') };
  services = createPlanServices({ db: s.t.database.db, now: () => s.t.clock.now,
    plants: new PlantsRepository(s.t.database.db) }, events);
}, 60_000);
afterAll(() => s.t.close());

const userOf = (account: keyof typeof ACCOUNTS): SessionUser => {
  const email = ACCOUNTS[account];
  const id = s.t.userId(email);
  const row = s.t.database.sqlite.prepare('select name, role from users where id = ?')
    .get(id) as { name: string; role: SessionUser['role'] };
  const plantCodes = (s.t.database.sqlite.prepare('select plant_code as code from user_plants ' +
    'where user_id = ? order by plant_code').all(id) as { code: string }[]).map((r) => r.code);
  return { id, email, name: row.name, role: row.role, plantCodes };
};

describe('plan events', () => {
  it('tells of the submission, each decision and the assignments, after the commit',
    async () => {
    heard = [];
    const risk = userOf('risk');
    const buyer = userOf('buyer');
    const plan = services.plans.create(risk, s.entryOf['S-2-SHARED-A']!, {
      strategy: 'second_source', description: 'Second forge.', estimatedCost: null,
      targetDate: null, changes: SECOND_SOURCE,
      tasks: [{ title: 'Drawings', ownerId: buyer.id, dueDate: null },
        { title: 'Nobody yet', ownerId: null, dueDate: null }] });
    await services.plans.whatIf(risk, plan.id, undefined);
    // Owner changes on a draft are no assignment yet: the tasks start at approval.
    services.tasks.update(risk, plan.tasks[1]!.id, { ownerId: risk.id });
    services.tasks.update(risk, plan.tasks[1]!.id, { ownerId: null });
    expect(heard).toEqual([]);

    services.approvals.submit(risk, plan.id);
    services.approvals.decide(userOf('north'), plan.id,
      { plantCode: 'P-NORTH', decision: 'approved', comment: '' });
    const south = userOf('south');
    services.approvals.decide(south, plan.id,
      { plantCode: 'P-SOUTH', decision: 'approved', comment: 'Yes.' });
    services.tasks.update(risk, plan.tasks[1]!.id, { ownerId: buyer.id });
    services.tasks.update(buyer, plan.tasks[0]!.id, { status: 'doing' });

    expect(heard).toEqual([
      { name: 'planSubmitted', inTransaction: false,
        event: { planId: plan.id, plants: ['P-NORTH', 'P-SOUTH'], byUserId: risk.id } },
      { name: 'planDecided', inTransaction: false,
        event: { planId: plan.id, plantCode: 'P-NORTH', decision: 'approved', comment: '',
          byUserId: userOf('north').id, planStatus: 'submitted' } },
      { name: 'planDecided', inTransaction: false,
        event: { planId: plan.id, plantCode: 'P-SOUTH', decision: 'approved', comment: 'Yes.',
          byUserId: south.id, planStatus: 'approved' } },
      // Approval turns the owned task on; the task without an owner tells nobody.
      { name: 'taskAssigned', inTransaction: false,
        event: { taskId: plan.tasks[0]!.id, assigneeId: buyer.id, byUserId: risk.id } },
      { name: 'taskAssigned', inTransaction: false,
        event: { taskId: plan.tasks[1]!.id, assigneeId: buyer.id, byUserId: risk.id } },
    ]);
  });

  it('tells of a rejection with its comment and the plan\'s new status', () => {
    heard = [];
    const risk = userOf('risk');
    const plan = services.plans.create(risk, s.entryOf['S-2-SHARED-B']!, {
      strategy: 'accept', description: 'Accept it.', estimatedCost: null, targetDate: null,
      changes: [], tasks: [{ title: 'Write it up', ownerId: risk.id, dueDate: null }] });
    services.approvals.submit(risk, plan.id);
    const east = userOf('east');
    services.approvals.decide(east, plan.id,
      { plantCode: 'P-EAST', decision: 'rejected', comment: 'Not for P-EAST.' });
    expect(heard.map((entry) => [entry.name, entry.event])).toEqual([
      ['planSubmitted', { planId: plan.id, plants: ['P-EAST', 'P-NORTH', 'P-SOUTH'],
        byUserId: risk.id }],
      ['planDecided', { planId: plan.id, plantCode: 'P-EAST', decision: 'rejected',
        comment: 'Not for P-EAST.', byUserId: east.id, planStatus: 'rejected' }],
    ]);
  });

  it('sends nothing when the change is refused', () => {
    heard = [];
    const risk = userOf('risk');
    const plan = services.plans.create(risk, s.entryOf['S-1-002']!, {
      strategy: 'other', description: 'No plants.', estimatedCost: null, targetDate: null,
      changes: [], tasks: [] });
    expect(() => services.approvals.submit(risk, plan.id)).toThrow(/touches no plant/);
    expect(heard).toEqual([]);
  });
});

describe('the unique index on decisions', () => {
  it('answers a second decision for a plant with the same 403 when the check was passed',
    () => {
      heard = [];
      const risk = userOf('risk');
      const north = userOf('north');
      const plan = services.plans.create(risk, s.entryOf['S-2-SHARED-A']!, {
        strategy: 'other', description: 'Race.', estimatedCost: null, targetDate: null,
        changes: [], tasks: [] });
      services.approvals.submit(risk, plan.id);
      services.approvals.decide(north, plan.id,
        { plantCode: 'P-NORTH', decision: 'approved', comment: '' });
      // A repository that does not see the first decision when checking, as a concurrent
      // request would not.
      const repository = new PlansRepository(s.t.database.db);
      const blind = Object.assign(Object.create(repository) as PlansRepository, {
        decisions: () => [],
      });
      const now = () => s.t.clock.now;
      const racing = new PlanApprovalsService({ repository: blind,
        views: new PlanViews(blind, s.t.database.db, now),
        plants: new PlantsRepository(s.t.database.db), db: s.t.database.db,
        events: { planSubmitted() {}, planDecided() {}, taskAssigned() {} }, now });
      let caught: unknown;
      try {
        racing.decide(north, plan.id, { plantCode: 'P-NORTH', decision: 'rejected',
          comment: 'Second try.' });
      } catch (error) {
        caught = error;
      }
      expect(caught).toMatchObject({ status: 403, code: 'forbidden',
        message: `P-NORTH has already decided on plan ${plan.id}; a plan is decided only once ` +
          'per plant (in each submission).' });
      const stored = services.plans.detail(risk, plan.id);
      expect([stored.status, stored.decisions.length]).toEqual(['submitted', 1]);
      expect(s.audit('plan', plan.id).map((row) => row.action))
        .toEqual(['plan.created', 'plan.submitted', 'plan.approved']);
    });
});

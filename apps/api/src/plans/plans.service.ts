/**
 * Mitigation plans: lists within a user's plants, drafts with their tasks, edits while a plan
 * is a draft or rejected (a rejected plan goes back to draft), the what-if on the latest network
 * version, new tasks, and withdrawal. Submission and decisions are in plan-approvals.service.ts.
 */
import type {
  CreatePlanInput,
  CreateTaskInput,
  ListPlansQuery,
  PlanChange,
  PlanDetailListDto,
  PlanDto,
  PlanListDto,
  UpdatePlanInput,
  WhatIfResultDto,
  WhatIfSideDto,
} from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { recordAudit } from '../audit/audit-trail';
import { CountriesRepository } from '../countries/countries.repository';
import { conflict, forbidden } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { latestNetworkVersionId, readNetworkModel } from '../network/network-store';
import { plantScopeOf } from '../network/plant-scope';
import { countryKey } from '../runs/run-rows';
import { loadScoringSettings } from '../settings/scoring-settings.repository';
import { changesOf } from './plan-dto';
import { assertEditable, canonicalJson, WITHDRAWABLE_STATUSES } from './plan-rules';
import { movePlan, reopenIfRejected, type TransitionContext } from './plan-transitions';
import type { PlanViews } from './plan-views';
import type { PlansRepository } from './plans.repository';
import { evaluateWhatIfInWorker, type WhatIfEvaluator } from './evaluate-what-if-in-worker';

/** What the plans service is built from. */
export interface PlansServiceDeps {
  repository: PlansRepository;
  views: PlanViews;
  db: KeelsonDatabase;
  now: () => Date;
  /** Where the what-if is computed: a worker thread unless a spec gives another. */
  evaluateWhatIf?: WhatIfEvaluator;
}

/** The editable fields of a plan, as stored. */
const PLAN_FIELDS = ['strategy', 'description', 'estimatedCost', 'targetDate', 'changes'] as const;

/** Drafting, editing, evaluating and withdrawing plans. */
export class PlansService {
  constructor(private readonly deps: PlansServiceDeps) {}

  /**
   * A page of the plans the user may see. `awaitingMe` keeps those the user can decide on now
   * (a plant manager's approvals), oldest submission first.
   */
  list(user: SessionUser, query: ListPlansQuery): PlanListDto | PlanDetailListDto {
    const { repository, views } = this.deps;
    let plans = repository.plans({ status: query.status, entryId: query.entryId,
      plants: plantScopeOf(user) });
    if (query.awaitingMe) {
      const decidable = views.decidableBy(user, plans);
      plans = plans.filter((plan) => (decidable.get(plan.id) ?? []).length > 0)
        .sort((a, b) => (a.submittedAt ?? '').localeCompare(b.submittedAt ?? '') || a.id - b.id);
    }
    const page = plans.slice(query.offset, query.offset + query.limit);
    if (query.detail === 'full') {
      return { items: page.map((plan) => views.detail(user, plan.id)), total: plans.length };
    }
    return { items: views.summaries(page), total: plans.length };
  }

  /** The plans of one register entry (404 when the user may not see the entry). */
  listForEntry(user: SessionUser, entryId: number): PlanListDto {
    this.deps.views.entry(user, entryId);
    const plans = this.deps.repository.plans({ entryId, plants: null });
    return { items: this.deps.views.summaries(plans), total: plans.length };
  }

  /** One plan with its decisions, tasks and what the user may do. */
  detail(user: SessionUser, id: number): PlanDto {
    return this.deps.views.detail(user, id);
  }

  /** A new draft for a register entry, with its tasks; the user is its author. */
  create(user: SessionUser, entryId: number, input: CreatePlanInput): PlanDto {
    const { repository, views, db } = this.deps;
    const entry = views.entry(user, entryId);
    input.tasks.forEach((task, index) => views.checkOwner(task.ownerId,
      `body.tasks.${index}.ownerId`));
    const now = this.deps.now();
    const stamp = now.toISOString();
    const id = repository.transaction(() => {
      const planId = repository.insertPlan({ entryId: entry.id, strategy: input.strategy,
        description: input.description, estimatedCost: input.estimatedCost,
        targetDate: input.targetDate, status: 'draft', changes: input.changes, whatIf: null,
        authorId: user.id, createdAt: stamp, updatedAt: stamp });
      recordAudit(db, { action: 'plan.created', subjectType: 'plan', subjectId: planId,
        userId: user.id, after: { entryId: entry.id, strategy: input.strategy,
          description: input.description, estimatedCost: input.estimatedCost,
          targetDate: input.targetDate, changes: input.changes, tasks: input.tasks.length } },
      now);
      for (const task of input.tasks) this.insertTask(user, { id: planId, entryId }, task, now);
      return planId;
    });
    return this.detail(user, id);
  }

  /** Changes a draft or rejected plan; a rejected plan goes back to draft. */
  update(user: SessionUser, id: number, input: UpdatePlanInput): PlanDto {
    const { repository, views, db } = this.deps;
    const { plan } = views.plan(user, id);
    assertEditable(plan);
    const before: Record<string, unknown> = {};
    const after: Record<string, unknown> = {};
    for (const field of PLAN_FIELDS) {
      const value = input[field];
      if (value === undefined || canonicalJson(value) === canonicalJson(plan[field])) continue;
      before[field] = plan[field];
      after[field] = value;
    }
    const reopens = plan.status === 'rejected';
    if (Object.keys(after).length === 0 && !reopens) return this.detail(user, id);
    const now = this.deps.now();
    repository.transaction(() => {
      repository.updatePlan(id, { ...after, ...(reopens ? { status: 'draft' } : {}),
        updatedAt: now.toISOString() });
      recordAudit(db, { action: 'plan.updated', subjectType: 'plan', subjectId: id,
        userId: user.id,
        before: { ...before, ...(reopens ? { status: plan.status } : {}) },
        after: { ...after, ...(reopens ? { status: 'draft' } : {}), entryId: plan.entryId } },
      now);
    });
    return this.detail(user, id);
  }

  /**
   * Runs the what-if on the latest network version: the entry's supplier failing alone, before
   * and after the changes (those in the body, saved to the plan first, or the plan's own), and
   * stores the result with the plan. The computing happens in a worker thread; the plan is read
   * and checked again once it is done, since it may have been submitted or edited meanwhile.
   */
  async whatIf(user: SessionUser, id: number, bodyChanges: PlanChange[] | undefined):
    Promise<PlanDto> {
    const { repository, views, db } = this.deps;
    const { plan: asked, entry } = views.plan(user, id);
    assertEditable(asked);
    const changes = bodyChanges ?? changesOf(asked);
    const versionId = latestNetworkVersionId(db);
    const model = versionId === null ? null : readNetworkModel(db, versionId);
    if (versionId === null || model === null) {
      throw conflict('no_network', 'No network has been imported yet, so there is nothing to ' +
        'run the what-if on; import the network first.');
    }
    const hazards = new Map(new CountriesRepository(db).list()
      .map((country) => [countryKey(country.code), country.hazard]));
    const evaluate = this.deps.evaluateWhatIf ?? evaluateWhatIfInWorker;
    const sides = await evaluate(model, entry.supplierCode, changes, { hazards,
      settings: loadScoringSettings(db), likelihoodOverride: entry.likelihoodOverride });
    const { plan } = views.plan(user, id);
    assertEditable(plan);
    if (bodyChanges === undefined && canonicalJson(changes) !== canonicalJson(plan.changes)) {
      throw conflict('plan_changed', 'The plan\'s network changes were edited while the ' +
        'what-if ran; run it again.');
    }
    const now = this.deps.now();
    const result: WhatIfResultDto = { networkVersionId: versionId,
      supplierCode: entry.supplierCode, changes, before: sides.before, after: sides.after,
      evaluatedAt: now.toISOString(), evaluatedBy: { id: user.id, name: user.name } };
    const changed = canonicalJson(changes) !== canonicalJson(plan.changes);
    repository.transaction(() => {
      const context = this.context(user, now);
      if (changed) {
        repository.updatePlan(id, { changes, updatedAt: now.toISOString() });
        recordAudit(db, { action: 'plan.updated', subjectType: 'plan', subjectId: id,
          userId: user.id, before: { changes: plan.changes },
          after: { changes, entryId: plan.entryId } }, now);
      }
      reopenIfRejected(context, plan);
      repository.updatePlan(id, { whatIf: result as unknown as Record<string, unknown> });
      recordAudit(db, { action: 'plan.what_if_evaluated', subjectType: 'plan', subjectId: id,
        userId: user.id, after: { entryId: plan.entryId, networkVersionId: versionId,
          supplierCode: entry.supplierCode, changes: changes.length,
          before: sideSummary(sides.before), after: sideSummary(sides.after) } }, now);
    });
    return this.detail(user, id);
  }

  /** Adds a task to a draft or rejected plan (a rejected plan goes back to draft); its id. */
  addTask(user: SessionUser, planId: number, input: CreateTaskInput): number {
    const { repository, views } = this.deps;
    const { plan } = views.plan(user, planId);
    assertEditable(plan);
    views.checkOwner(input.ownerId, 'body.ownerId');
    const now = this.deps.now();
    return repository.transaction(() => {
      reopenIfRejected(this.context(user, now), plan);
      return this.insertTask(user, plan, input, now);
    });
  }

  /** Withdraws a plan that is not done (or withdrawn already); its tasks stop being active. */
  withdraw(user: SessionUser, id: number): PlanDto {
    const { plan } = this.deps.views.plan(user, id);
    if (!WITHDRAWABLE_STATUSES.includes(plan.status)) {
      throw forbidden(`Plan ${id} is ${plan.status === 'done' ? 'done' : 'withdrawn already'}` +
        ' and cannot be withdrawn.', { status: plan.status });
    }
    const now = this.deps.now();
    this.deps.repository.transaction(() => {
      movePlan(this.context(user, now), plan, 'withdrawn', 'plan.withdrawn');
    });
    return this.detail(user, id);
  }

  private insertTask(
    user: SessionUser,
    plan: { id: number; entryId: number },
    input: CreateTaskInput,
    now: Date,
  ): number {
    const stamp = now.toISOString();
    const taskId = this.deps.repository.insertTask({ planId: plan.id, title: input.title,
      ownerId: input.ownerId, dueDate: input.dueDate, status: 'todo', createdAt: stamp,
      updatedAt: stamp });
    recordAudit(this.deps.db, { action: 'task.created', subjectType: 'plan_task',
      subjectId: taskId, userId: user.id, after: { planId: plan.id, entryId: plan.entryId,
        title: input.title, ownerId: input.ownerId, dueDate: input.dueDate } }, now);
    return taskId;
  }

  private context(user: SessionUser, now: Date): TransitionContext {
    return { repository: this.deps.repository, db: this.deps.db, userId: user.id, now };
  }
}

/** The numbers of a what-if side the audit trail keeps. */
function sideSummary(side: WhatIfSideDto): Record<string, unknown> {
  return { productsLost: side.productsLost.length, revenueImpact: side.revenueImpact,
    singlePointOfFailure: side.singlePointOfFailure, rating: side.rating,
    ratingBand: side.ratingBand };
}

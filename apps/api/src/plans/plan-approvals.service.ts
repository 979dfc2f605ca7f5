/**
 * Submission and decisions: a plan goes to the manager of every plant its register entry
 * touches; each plant decides once per submission. The last approval approves the plan, turns
 * its tasks on and moves the entry to `mitigating`; one rejection rejects the plan at once.
 * Events go out after the transaction has committed.
 */
import type { DecidePlanInput, PlanDto, PlanStatus } from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { recordAudit } from '../audit/audit-trail';
import { conflict, forbidden } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { PlantsRepository } from '../plants/plants.repository';
import { changesOf, whatIfOf } from './plan-dto';
import type { PlanEvents } from './plan-events';
import { currentDecisions, needsWhatIf, notEditable } from './plan-rules';
import { movePlan, settleActivePlan, type TransitionContext } from './plan-transitions';
import type { LoadedPlan, PlanViews } from './plan-views';
import type { PlansRepository } from './plans.repository';

/** What the approvals service is built from. */
export interface PlanApprovalsServiceDeps {
  repository: PlansRepository;
  views: PlanViews;
  plants: Pick<PlantsRepository, 'managersOf'>;
  db: KeelsonDatabase;
  events: PlanEvents;
  now: () => Date;
}

/** Submitting plans and recording plant managers' decisions. */
export class PlanApprovalsService {
  constructor(private readonly deps: PlanApprovalsServiceDeps) {}

  /**
   * Submits a draft or rejected plan to the managers of the entry's plants. Refused (409) when
   * the entry has no plants, a plant has no active manager, or the what-if is out of date.
   */
  submit(user: SessionUser, id: number): PlanDto {
    const { repository, views } = this.deps;
    const { plan, entry } = views.plan(user, id);
    if (plan.status !== 'draft' && plan.status !== 'rejected') throw notEditable(plan);
    const plants = entry.plants;
    if (plants.length === 0) {
      throw conflict('plan_without_plants', `Register entry ${entry.id} touches no plant, so ` +
        `no plant manager can approve plan ${id}; the entry gets its plants from an analysis ` +
        'run.', { entryId: entry.id });
    }
    for (const plant of plants) {
      if (this.deps.plants.managersOf(plant).length === 0) {
        throw conflict('plant_without_manager', `Plant ${plant} has no active plant manager to ` +
          `approve plan ${id}; ask an administrator to assign one.`, { plantCode: plant });
      }
    }
    if (needsWhatIf(changesOf(plan), whatIfOf(plan))) {
      throw conflict('what_if_needed', `Plan ${id} proposes network changes that the what-if ` +
        'has not been run on; run the what-if so the approvers see the numbers.');
    }
    const now = this.submissionTime(plan.submittedAt);
    const submittedAt = now.toISOString();
    repository.transaction(() => {
      movePlan(this.context(user, now), plan, 'submitted', 'plan.submitted', {
        changes: { submittedAt },
        after: { submittedAt, plants },
      });
    });
    this.deps.events.planSubmitted({ planId: id, plants: [...plants], byUserId: user.id });
    return views.detail(user, id);
  }

  /**
   * One plant manager's decision for one plant of a submitted plan. Refused (403) for a plant
   * that is not the user's or not the plan's, a plant that has decided on this submission, the
   * plan's author, and a plan that is not waiting for decisions.
   */
  decide(user: SessionUser, id: number, input: DecidePlanInput): PlanDto {
    const { repository, views, db } = this.deps;
    // Out of scope is 403 with the reason here, not 404: the rule is the point of the answer.
    const loaded = views.anyPlan(id);
    const { plan, entry } = loaded;
    this.checkDecision(user, loaded, input);
    const now = this.deps.now();
    const stamp = now.toISOString();
    const submittedAt = plan.submittedAt!;
    let status: PlanStatus = plan.status;
    repository.transaction(() => {
      try {
        repository.insertDecision({ planId: id, plantCode: input.plantCode,
          decision: input.decision, comment: input.comment, userId: user.id, submittedAt,
          createdAt: stamp });
      } catch (error) {
        if ((error as { code?: string }).code === 'SQLITE_CONSTRAINT_UNIQUE') {
          throw alreadyDecided(id, input.plantCode);
        }
        throw error;
      }
      const context = this.context(user, now);
      if (input.decision === 'rejected') {
        status = 'rejected';
        repository.updatePlan(id, { status, decidedAt: stamp, rejectionComment: input.comment,
          updatedAt: stamp });
      } else {
        const decided = new Set(currentDecisions(plan, repository.decisions([id]))
          .map((decision) => decision.plantCode));
        if (entry.plants.every((plant) => decided.has(plant))) {
          status = 'approved';
          repository.updatePlan(id, { status, decidedAt: stamp, updatedAt: stamp });
        }
      }
      recordAudit(db, { action: `plan.${input.decision}`, subjectType: 'plan', subjectId: id,
        userId: user.id, before: { status: plan.status },
        after: { plantCode: input.plantCode, decision: input.decision, comment: input.comment,
          planStatus: status, entryId: entry.id } }, now);
      if (status === 'approved') {
        this.startMitigating(context, loaded);
        settleActivePlan(context, { ...plan, status });
      }
    });
    this.deps.events.planDecided({ planId: id, plantCode: input.plantCode,
      decision: input.decision, comment: input.comment, byUserId: user.id, planStatus: status });
    if (status === 'approved') {
      for (const task of repository.tasksOf([id])) {
        if (task.ownerId !== null) {
          this.deps.events.taskAssigned({ taskId: task.id, assigneeId: task.ownerId,
            byUserId: plan.authorId });
        }
      }
    }
    return views.detail(user, id);
  }

  private checkDecision(user: SessionUser, loaded: LoadedPlan, input: DecidePlanInput): void {
    const { plan, entry } = loaded;
    if (plan.authorId === user.id) {
      throw forbidden(`Nobody approves their own plan: you wrote plan ${plan.id}, so the other ` +
        'plant managers decide on it.');
    }
    if (plan.status !== 'submitted') {
      const why = plan.status === 'draft' || plan.status === 'rejected'
        ? `is ${plan.status === 'draft' ? 'a draft' : 'rejected'} and not submitted, so there ` +
          'is nothing to decide yet'
        : plan.status === 'withdrawn' ? 'was withdrawn'
          : `is ${plan.status.replace('_', ' ')}; a decided plan cannot be decided again`;
      throw forbidden(`Plan ${plan.id} ${why}.`, { status: plan.status });
    }
    if (!user.plantCodes.includes(input.plantCode)) {
      const own = user.plantCodes.length > 0 ? user.plantCodes.join(', ') : 'no plants';
      throw forbidden(`You manage ${own}; this decision is for ${input.plantCode}.`,
        { plantCode: input.plantCode, plantCodes: user.plantCodes });
    }
    if (!entry.plants.includes(input.plantCode)) {
      throw forbidden(`Plan ${plan.id} needs decisions for ${entry.plants.join(', ')}; ` +
        `${input.plantCode} is not a plant its risk touches.`,
      { plantCode: input.plantCode, plants: entry.plants });
    }
    const decisions = currentDecisions(plan, this.deps.repository.decisions([plan.id]));
    if (decisions.some((decision) => decision.plantCode === input.plantCode)) {
      throw alreadyDecided(plan.id, input.plantCode);
    }
  }

  /** Moves the register entry to `mitigating` (with its audit record) unless it is already. */
  private startMitigating(context: TransitionContext, loaded: LoadedPlan): void {
    const { entry, plan } = loaded;
    if (entry.status === 'mitigating') return;
    this.deps.repository.setEntryStatus(entry.id, 'mitigating', context.now.toISOString());
    recordAudit(this.deps.db, { action: 'register.mitigating', subjectType: 'register_entry',
      subjectId: entry.id, userId: context.userId, before: { status: entry.status },
      after: { status: 'mitigating', planId: plan.id } }, context.now);
  }

  /**
   * The clock, moved 1 ms past the previous submission when needed: the submission time keys
   * the decisions, so a resubmission must never share it with the one before.
   */
  private submissionTime(previous: string | null): Date {
    const now = this.deps.now();
    if (previous === null || now.getTime() > Date.parse(previous)) return now;
    return new Date(Date.parse(previous) + 1);
  }

  private context(user: SessionUser, now: Date): TransitionContext {
    return { repository: this.deps.repository, db: this.deps.db, userId: user.id, now };
  }
}

function alreadyDecided(planId: number, plantCode: string) {
  return forbidden(`${plantCode} has already decided on plan ${planId}; a plan is decided ` +
    'only once per plant (in each submission).', { plantCode });
}

/**
 * Reading plans as a user may see them: a plant manager sees the plans whose register entry
 * touches one of their plants (404 for the others, as the register answers); everyone else
 * sees every plan. Builds the summaries and the full plan with what the user may do.
 */
import type { PlanDto, PlanSummaryDto } from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { latestNetworkVersionId } from '../network/network-store';
import { plantScopeOf } from '../network/plant-scope';
import { changesOf, toPlanDto, toPlanSummaryDto, whatIfOf } from './plan-dto';
import { pendingPlants, permissionsOf, todayOf } from './plan-rules';
import type { PlanEntrySummary, PlanRecord, PlansRepository, TaskRecord } from './plans.repository';

/** A plan with its entry. */
export interface LoadedPlan {
  plan: PlanRecord;
  entry: PlanEntrySummary;
}

/** Reads plans within a user's scope and maps them to DTOs. */
export class PlanViews {
  constructor(
    private readonly repository: PlansRepository,
    private readonly db: KeelsonDatabase,
    private readonly now: () => Date,
  ) {}

  /** Whether the user may see plans of an entry with these plants. */
  mayRead(user: SessionUser, plants: readonly string[]): boolean {
    const scope = plantScopeOf(user);
    return scope === null || plants.some((plant) => scope.includes(plant));
  }

  /** A register entry the user may see; 404 otherwise. */
  entry(user: SessionUser, entryId: number): PlanEntrySummary {
    const entry = this.repository.entries(latestNetworkVersionId(this.db), [entryId])
      .get(entryId);
    if (!entry || !this.mayRead(user, entry.plants)) {
      throw notFound(`Register entry ${entryId} was not found.`);
    }
    return entry;
  }

  /** A plan and its entry regardless of scope (decisions answer 403, not 404); 404 if absent. */
  anyPlan(id: number): LoadedPlan {
    const plan = this.repository.plan(id);
    const entry = plan
      ? this.repository.entries(latestNetworkVersionId(this.db), [plan.entryId]).get(plan.entryId)
      : undefined;
    if (!plan || !entry) throw notFound(`Plan ${id} was not found.`);
    return { plan, entry };
  }

  /** A plan the user may see; 404 otherwise. */
  plan(user: SessionUser, id: number): LoadedPlan {
    const loaded = this.anyPlan(id);
    if (!this.mayRead(user, loaded.entry.plants)) throw notFound(`Plan ${id} was not found.`);
    return loaded;
  }

  /** Summaries of plans, in the order given, with their pending plants. */
  summaries(plans: readonly PlanRecord[]): PlanSummaryDto[] {
    const entries = this.repository.entries(latestNetworkVersionId(this.db),
      plans.map((plan) => plan.entryId));
    const decisions = this.repository.decisions(plans.filter((plan) => plan.status === 'submitted')
      .map((plan) => plan.id));
    return plans.flatMap((plan) => {
      const entry = entries.get(plan.entryId);
      return entry ? [toPlanSummaryDto(plan, entry, pendingPlants(plan, entry.plants, decisions))]
        : [];
    });
  }

  /** Plants of a plan the user could decide for now (empty for everyone but plant managers). */
  decidableBy(user: SessionUser, plans: readonly PlanRecord[]): Map<number, string[]> {
    const entries = this.repository.entries(latestNetworkVersionId(this.db),
      plans.map((plan) => plan.entryId));
    const decisions = this.repository.decisions(plans.map((plan) => plan.id));
    return new Map(plans.map((plan) => {
      const entry = entries.get(plan.entryId);
      const pending = entry ? pendingPlants(plan, entry.plants, decisions) : [];
      return [plan.id, permissionsOf(user, { plan, changes: changesOf(plan),
        whatIf: whatIfOf(plan), pendingPlants: pending }).decideFor];
    }));
  }

  /** The full plan as the user sees it. */
  detail(user: SessionUser, id: number): PlanDto {
    const { plan, entry } = this.plan(user, id);
    const decisions = this.repository.decisions([plan.id]);
    const tasks = this.repository.tasksOf([plan.id]);
    const pending = pendingPlants(plan, entry.plants, decisions);
    const can = permissionsOf(user, { plan, changes: changesOf(plan), whatIf: whatIfOf(plan),
      pendingPlants: pending });
    return toPlanDto(plan, entry, pending, { decisions, tasks, can,
      today: todayOf(this.now()) });
  }

  /**
   * A task and its plan, when the user may see the plan or owns the task (a plant manager can
   * own a task of a plan outside their plants); 404 otherwise.
   */
  task(user: SessionUser, taskId: number): LoadedPlan & { task: TaskRecord } {
    const task = this.repository.task(taskId);
    if (!task) throw notFound(`Task ${taskId} was not found.`);
    const loaded = this.repository.plan(task.planId);
    if (!loaded) throw notFound(`Task ${taskId} was not found.`);
    const entry = this.repository.entries(latestNetworkVersionId(this.db), [loaded.entryId])
      .get(loaded.entryId);
    if (!entry || (!this.mayRead(user, entry.plants) && task.ownerId !== user.id)) {
      throw notFound(`Task ${taskId} was not found.`);
    }
    return { task, plan: loaded, entry };
  }

  /** Throws 400 naming `path` unless `ownerId` is an active user. */
  checkOwner(ownerId: number | null | undefined, path: string): void {
    if (ownerId === null || ownerId === undefined) return;
    const owner = this.repository.user(ownerId);
    if (owner && owner.isActive) return;
    const message = owner
      ? `User ${ownerId} (${owner.name}) is deactivated and cannot own a task.`
      : `There is no user ${ownerId}.`;
    throw invalidRequest(`The request is not valid: ${path}: ${message}`,
      { issues: [{ path, message }] });
  }
}

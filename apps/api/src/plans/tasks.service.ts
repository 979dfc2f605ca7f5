/**
 * Tasks of plans: my tasks, a task with its comments, edits while the plan is a draft or
 * rejected, status changes (by the owner, a risk manager or an administrator) once the plan is
 * approved, owner changes, deletion from an editable plan, and comments.
 */
import type {
  CreateTaskCommentInput,
  MyTaskDto,
  MyTasksDto,
  MyTasksQuery,
  PlanStatus,
  PlanTaskDetailDto,
  TaskCommentDto,
  TaskStatus,
  UpdateTaskInput,
} from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { recordAudit } from '../audit/audit-trail';
import { forbidden } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { latestNetworkVersionId } from '../network/network-store';
import { toPlanTaskDto, toTaskCommentDto } from './plan-dto';
import type { PlanEvents } from './plan-events';
import {
  ACTIVE_STATUSES,
  assertEditable,
  isActivePlan,
  isEditable,
  isPlanWriter,
  notEditable,
  todayOf,
} from './plan-rules';
import { reopenIfRejected, settleActivePlan, type TransitionContext } from './plan-transitions';
import type { LoadedPlan, PlanViews } from './plan-views';
import type { PlansRepository, TaskRecord } from './plans.repository';
import { buildTasksWorkbook } from './tasks-export';

/** What the tasks service is built from. */
export interface TasksServiceDeps {
  repository: PlansRepository;
  views: PlanViews;
  db: KeelsonDatabase;
  events: PlanEvents;
  now: () => Date;
}

const OPEN_TASKS: readonly TaskStatus[] = ['todo', 'doing'];
const ALL_TASKS: readonly TaskStatus[] = ['todo', 'doing', 'done', 'cancelled'];

/** Tasks and their comments. */
export class TasksService {
  constructor(private readonly deps: TasksServiceDeps) {}

  /**
   * The user's tasks on active plans (`show=open`: to do or doing; `overdue`: those due before
   * today; `all`: every status, and also the tasks of plans that are done): overdue first, then
   * by due date (none last), then id.
   */
  mine(user: SessionUser, query: MyTasksQuery): MyTasksDto {
    return this.list(user.id, query);
  }

  /**
   * Everyone's tasks, as {@link mine} lists them, with their owners: for risk managers and
   * administrators (the router checks the role), who follow every plant's plans.
   */
  everyone(query: MyTasksQuery): MyTasksDto {
    return this.list(null, query);
  }

  /** The list of {@link mine} or {@link everyone} as a workbook, with its file name. */
  async exportWorkbook(user: SessionUser, whose: 'mine' | 'everyone', query: MyTasksQuery):
    Promise<{ bytes: Uint8Array; fileName: string }> {
    const list = whose === 'everyone' ? this.everyone(query) : this.mine(user, query);
    const now = this.deps.now();
    const today = todayOf(now);
    const bytes = await buildTasksWorkbook(list.items, {
      whose: whose === 'everyone' ? 'everyone' : { mine: user.name }, show: query.show }, now,
    today);
    return { bytes, fileName: `keelson-tasks-${whose}-${query.show}-${today}.xlsx` };
  }

  private list(ownerId: number | null, query: MyTasksQuery): MyTasksDto {
    const { repository, db } = this.deps;
    const planStatuses: PlanStatus[] = query.show === 'all'
      ? ['approved', 'in_progress', 'done'] : [...ACTIVE_STATUSES];
    const rows = repository.tasksOwnedBy(ownerId, planStatuses,
      query.show === 'all' ? ALL_TASKS : OPEN_TASKS);
    const entries = repository.entries(latestNetworkVersionId(db),
      rows.map((row) => row.entryId));
    const today = todayOf(this.deps.now());
    const items: MyTaskDto[] = rows.map((row) => {
      const entry = entries.get(row.entryId);
      return { ...toPlanTaskDto(row, row.planStatus, today),
        plan: { id: row.planId, strategy: row.planStrategy, status: row.planStatus,
          entry: { id: row.entryId, title: entry?.title ?? '',
            supplierCode: entry?.supplierCode ?? '' } } };
    }).filter((task) => query.show !== 'overdue' || task.isOverdue);
    items.sort((a, b) => Number(b.isOverdue) - Number(a.isOverdue)
      || compareDueDates(a.dueDate, b.dueDate) || a.id - b.id);
    return { items };
  }

  /** One task with its comments and its plan. */
  detail(user: SessionUser, taskId: number): PlanTaskDetailDto {
    const { task, plan } = this.deps.views.task(user, taskId);
    const [summary] = this.deps.views.summaries([plan]);
    return {
      ...toPlanTaskDto(task, plan.status, todayOf(this.deps.now())),
      comments: this.deps.repository.comments(taskId).map(toTaskCommentDto),
      plan: summary!,
    };
  }

  /**
   * Changes a task. Title and due date: risk managers and administrators while the plan is a
   * draft or rejected. Owner: the same, also while the tasks are active (the new owner hears of
   * it). Status: the owner, a risk manager or an administrator, while the tasks are active; the
   * first task started moves the plan to `in_progress`, the last one finished to `done`.
   */
  update(user: SessionUser, taskId: number, input: UpdateTaskInput): PlanTaskDetailDto {
    const { repository, views, db } = this.deps;
    const loaded = views.task(user, taskId);
    const { task, plan } = loaded;
    // The rules apply to what was asked, even when it changes nothing.
    this.checkUpdate(user, loaded, input);
    const changes = changedFields(task, input);
    if (Object.keys(changes).length === 0) return this.detail(user, taskId);
    views.checkOwner(changes.ownerId, 'body.ownerId');
    const now = this.deps.now();
    repository.transaction(() => {
      repository.updateTask(taskId, { ...changes, updatedAt: now.toISOString() });
      const before = Object.fromEntries(Object.keys(changes)
        .map((key) => [key, task[key as keyof typeof changes]]));
      recordAudit(db, { action: 'task.updated', subjectType: 'plan_task', subjectId: taskId,
        userId: user.id, before,
        after: { ...changes, planId: plan.id, entryId: plan.entryId } }, now);
      const context = this.context(user, now);
      if (isEditable(plan.status)) reopenIfRejected(context, plan);
      if (changes.status !== undefined) settleActivePlan(context, plan);
    });
    if (changes.ownerId !== undefined && changes.ownerId !== null && isActivePlan(plan.status)) {
      this.deps.events.taskAssigned({ taskId, assigneeId: changes.ownerId, byUserId: user.id });
    }
    return this.detail(user, taskId);
  }

  /** Deletes a task of a draft or rejected plan (a rejected plan goes back to draft). */
  remove(user: SessionUser, taskId: number): void {
    const { repository, views, db } = this.deps;
    const { task, plan } = views.task(user, taskId);
    assertEditable(plan);
    const now = this.deps.now();
    repository.transaction(() => {
      repository.deleteTask(taskId);
      recordAudit(db, { action: 'task.deleted', subjectType: 'plan_task', subjectId: taskId,
        userId: user.id, before: { title: task.title, ownerId: task.ownerId,
          dueDate: task.dueDate, status: task.status },
        after: { planId: plan.id, entryId: plan.entryId } }, now);
      reopenIfRejected(this.context(user, now), plan);
    });
  }

  /** Adds a comment; anyone who may see the plan may comment on its tasks. */
  comment(user: SessionUser, taskId: number, input: CreateTaskCommentInput): TaskCommentDto {
    const { repository, views, db } = this.deps;
    const { plan } = views.task(user, taskId);
    const now = this.deps.now();
    const commentId = repository.transaction(() => {
      const id = repository.insertComment({ taskId, userId: user.id, text: input.text,
        createdAt: now.toISOString() });
      recordAudit(db, { action: 'task.commented', subjectType: 'plan_task', subjectId: taskId,
        userId: user.id, after: { commentId: id, text: input.text, planId: plan.id,
          entryId: plan.entryId } }, now);
      return id;
    });
    return toTaskCommentDto(repository.comments(taskId)
      .find((comment) => comment.id === commentId)!);
  }

  private checkUpdate(
    user: SessionUser,
    loaded: LoadedPlan & { task: TaskRecord },
    changes: UpdateTaskInput,
  ): void {
    const { task, plan } = loaded;
    const writer = isPlanWriter(user);
    const editsContent = changes.title !== undefined || changes.dueDate !== undefined;
    if ((editsContent || changes.ownerId !== undefined) && !writer) {
      throw forbidden('Only a risk manager or an administrator changes the title, owner or due ' +
        'date of a task; the owner may change its status.');
    }
    if (editsContent && !isEditable(plan.status)) throw notEditable(plan);
    if (changes.ownerId !== undefined && !isEditable(plan.status)
      && !isActivePlan(plan.status)) {
      throw notEditable(plan);
    }
    if (changes.status === undefined) return;
    if (!isActivePlan(plan.status)) {
      throw forbidden(plan.status === 'done' || plan.status === 'withdrawn'
        ? `Plan ${plan.id} is ${plan.status}; its tasks cannot change any more.`
        : `The tasks of plan ${plan.id} start when the plan is approved; until then their ` +
          'status stays "to do".', { status: plan.status });
    }
    if (!writer && task.ownerId !== user.id) {
      const owner = task.ownerName ?? 'nobody yet';
      throw forbidden(`Only the task's owner (${owner}), a risk manager or an administrator ` +
        'changes its status.');
    }
  }

  private context(user: SessionUser, now: Date): TransitionContext {
    return { repository: this.deps.repository, db: this.deps.db, userId: user.id, now };
  }
}

/** The fields of `input` that differ from the task. */
function changedFields(task: TaskRecord, input: UpdateTaskInput): UpdateTaskInput {
  const changes: UpdateTaskInput = {};
  if (input.title !== undefined && input.title !== task.title) changes.title = input.title;
  if (input.ownerId !== undefined && input.ownerId !== task.ownerId) {
    changes.ownerId = input.ownerId;
  }
  if (input.dueDate !== undefined && input.dueDate !== task.dueDate) {
    changes.dueDate = input.dueDate;
  }
  if (input.status !== undefined && input.status !== task.status) changes.status = input.status;
  return changes;
}

/** Due dates ascending, tasks without one last. */
function compareDueDates(a: string | null, b: string | null): number {
  if (a === b) return 0;
  if (a === null) return 1;
  if (b === null) return -1;
  return a < b ? -1 : 1;
}

import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  CreatePlanInput,
  CreateTaskCommentInput,
  CreateTaskInput,
  DecidePlanInput,
  ListPlansQuery,
  MyTasksDto,
  MyTasksQuery,
  PlanDetailListDto,
  PlanDto,
  PlanListDto,
  PlanTaskDetailDto,
  PlanTaskDto,
  RegisterOwnersDto,
  TaskCommentDto,
  UpdatePlanInput,
  UpdateTaskInput,
} from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** A query for GET /api/plans; every field is optional (the server has defaults). */
export type PlansQuery = Partial<Omit<ListPlansQuery, 'awaitingMe' | 'detail'>> & {
  awaitingMe?: boolean;
};

/**
 * Data access for mitigation plans and their tasks: an entry's plans, one plan, its what-if,
 * submission, withdrawal and decisions, and the tasks (mine, one, edit, comment).
 */
@Injectable({ providedIn: 'root' })
export class PlansApi {
  private readonly http = inject(HttpClient);

  /** GET /api/register/:entryId/plans: the plans of one register entry. */
  listForEntry(entryId: number): Observable<PlanListDto> {
    return this.http.get<PlanListDto>(`/api/register/${entryId}/plans`);
  }

  /** POST /api/register/:entryId/plans: a new draft with its changes and tasks. */
  create(entryId: number, input: CreatePlanInput): Observable<PlanDto> {
    return this.http.post<PlanDto>(`/api/register/${entryId}/plans`, input);
  }

  /** GET /api/plans: plans matching the query (`awaitingMe` for the approvals). */
  list(query: PlansQuery = {}): Observable<PlanListDto> {
    return this.http.get<PlanListDto>('/api/plans', { params: plansParams(query) });
  }

  /**
   * GET /api/plans?detail=full: whole plans (both what-if sides, decisions, tasks) in one
   * request, as the approvals page shows them.
   */
  listFull(query: PlansQuery = {}): Observable<PlanDetailListDto> {
    return this.http.get<PlanDetailListDto>('/api/plans',
      { params: plansParams(query).set('detail', 'full') });
  }

  /** GET /api/plans/:id: a plan with its what-if, decisions, tasks and what I may do. */
  get(id: number): Observable<PlanDto> {
    return this.http.get<PlanDto>(`/api/plans/${id}`);
  }

  /** PATCH /api/plans/:id: edits a draft. */
  update(id: number, input: UpdatePlanInput): Observable<PlanDto> {
    return this.http.patch<PlanDto>(`/api/plans/${id}`, input);
  }

  /** POST /api/plans/:id/what-if: re-analyses the network with the plan's changes. */
  runWhatIf(id: number): Observable<PlanDto> {
    return this.http.post<PlanDto>(`/api/plans/${id}/what-if`, {});
  }

  /** POST /api/plans/:id/submit: sends the plan to the plant managers. */
  submit(id: number): Observable<PlanDto> {
    return this.http.post<PlanDto>(`/api/plans/${id}/submit`, {});
  }

  /** POST /api/plans/:id/withdraw: the author takes the plan back for good. */
  withdraw(id: number): Observable<PlanDto> {
    return this.http.post<PlanDto>(`/api/plans/${id}/withdraw`, {});
  }

  /** POST /api/plans/:id/decisions: a plant manager approves or rejects for one plant. */
  decide(id: number, input: DecidePlanInput): Observable<PlanDto> {
    return this.http.post<PlanDto>(`/api/plans/${id}/decisions`, input);
  }

  /** POST /api/plans/:id/tasks: adds a task to a plan. */
  addTask(planId: number, input: CreateTaskInput): Observable<PlanTaskDto> {
    return this.http.post<PlanTaskDto>(`/api/plans/${planId}/tasks`, input);
  }

  /** GET /api/tasks/mine: my tasks, overdue first. */
  myTasks(query: Partial<MyTasksQuery> = {}): Observable<MyTasksDto> {
    const params = query.show ? new HttpParams().set('show', query.show) : new HttpParams();
    return this.http.get<MyTasksDto>('/api/tasks/mine', { params });
  }

  /** The address of a task list's xlsx export: mine, or everyone's (risk managers, admins). */
  tasksExportUrl(whose: 'mine' | 'everyone', show: MyTasksQuery['show']): string {
    return `${whose === 'everyone' ? '/api/tasks/export.xlsx' : '/api/tasks/mine/export.xlsx'}` +
      `?show=${show}`;
  }

  /** GET /api/tasks: everyone's tasks with their owners (risk managers and admins). */
  everyoneTasks(query: Partial<MyTasksQuery> = {}): Observable<MyTasksDto> {
    const params = query.show ? new HttpParams().set('show', query.show) : new HttpParams();
    return this.http.get<MyTasksDto>('/api/tasks', { params });
  }

  /** GET /api/tasks/:id: a task with its comments and plan. */
  task(id: number): Observable<PlanTaskDetailDto> {
    return this.http.get<PlanTaskDetailDto>(`/api/tasks/${id}`);
  }

  /** PATCH /api/tasks/:id: title, owner, due date or status. */
  updateTask(id: number, input: UpdateTaskInput): Observable<PlanTaskDto> {
    return this.http.patch<PlanTaskDto>(`/api/tasks/${id}`, input);
  }

  /** DELETE /api/tasks/:id: removes a task while its plan is a draft. */
  deleteTask(id: number): Observable<unknown> {
    return this.http.delete<unknown>(`/api/tasks/${id}`);
  }

  /** POST /api/tasks/:id/comments: a comment on a task. */
  comment(id: number, input: CreateTaskCommentInput): Observable<TaskCommentDto> {
    return this.http.post<TaskCommentDto>(`/api/tasks/${id}/comments`, input);
  }

  /** GET /api/register/owners: who a task can be given to (risk managers and admins ask). */
  owners(): Observable<RegisterOwnersDto> {
    return this.http.get<RegisterOwnersDto>('/api/register/owners');
  }
}

/** The query of GET /api/plans as parameters; empty values are left out. */
function plansParams(query: PlansQuery): HttpParams {
  let params = new HttpParams();
  for (const [key, value] of Object.entries(query) as [string, unknown][]) {
    if (value !== undefined && value !== null && value !== '') {
      params = params.set(key, String(value));
    }
  }
  return params;
}

import { DatePipe } from '@angular/common';
import {
  type AfterViewInit,
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortHeader } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  PLAN_STRATEGY_LABELS,
  TASK_LIST_SHOWS,
  TASK_STATUS_LABELS,
  type MyTaskDto,
  type MyTasksDto,
  type TaskListShow,
  type TaskStatus,
} from '@keelson/contracts';
import type { Observable, Subscription } from 'rxjs';
import { Session } from '../auth/session';
import { apiErrorMessage } from '../shared/api-error-message';
import { PlansApi } from './plans-api';
import { TaskStatusMenu } from './task-status-menu';

/** Which of the tasks the page shows (`?show=`): open, overdue only, or all. */
export type TaskFilter = TaskListShow;

/** Whose tasks the page shows (`?whose=`): mine, or everyone's (risk managers and admins). */
export type TaskOwnerFilter = 'mine' | 'everyone';

/** The page's filters read from its address; anything unknown falls back to the default. */
export function readTaskFilters(params: { get(name: string): string | null },
  mayListEveryone: boolean): { show: TaskFilter; whose: TaskOwnerFilter } {
  const show = params.get('show');
  return {
    show: (TASK_LIST_SHOWS as readonly string[]).includes(show ?? '')
      ? show as TaskFilter : 'open',
    whose: mayListEveryone && params.get('whose') === 'everyone' ? 'everyone' : 'mine',
  };
}

/** The value a column sorts by; the server's order (overdue first, then by due date) is kept
 * until a header is clicked. */
export function taskSortValue(task: MyTaskDto, column: string): string | number {
  switch (column) {
    case 'title':
      return task.title.toLowerCase();
    case 'entry':
      return task.plan.entry.title.toLowerCase();
    case 'dueDate':
      // No date sorts last in ascending order.
      return task.dueDate ?? '9999-12-31';
    case 'status':
      return task.status;
    case 'owner':
      // Nobody's sorts last in ascending order.
      return task.owner?.name.toLowerCase() ?? '\uffff';
    default:
      return task.id;
  }
}

/** The words a task is found by in the page's filter box (lower case). */
export function taskSearchText(task: MyTaskDto): string {
  return [task.title, task.owner?.name ?? '', task.plan.entry.title, task.plan.entry.supplierCode,
    `plan ${task.plan.id}`, `no. ${task.plan.entry.id}`].join(' ').toLowerCase();
}

/**
 * My tasks: the tasks of plans assigned to the signed-in person, overdue first (and marked),
 * with their plan and register entry a click away, "Mark done" and a status menu; open tasks,
 * overdue ones or all of them. Risk managers and administrators can switch to everyone's tasks,
 * with an owner column. The filters live in the address, so the home page links to them.
 */
@Component({
  selector: 'kl-my-tasks-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatAnchor,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatPrefix,
    MatProgressBar,
    MatSort,
    MatSortHeader,
    MatTableModule,
    RouterLink,
    TaskStatusMenu,
  ],
  templateUrl: './my-tasks-page.html',
  styleUrl: './my-tasks-page.scss',
})
export class MyTasksPage implements AfterViewInit {
  private readonly plansApi = inject(PlansApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly sort = viewChild.required(MatSort);

  /** Risk managers and administrators follow every plant's plans, so everyone's tasks. */
  protected readonly mayListEveryone = inject(Session).hasRole('risk_manager', 'admin');
  private readonly params = toSignal(this.route.queryParamMap, { requireSync: true });
  private readonly filters = computed(() => readTaskFilters(this.params(), this.mayListEveryone));
  protected readonly filter = computed(() => this.filters().show);
  protected readonly whose = computed(() => this.filters().whose);
  protected readonly exportUrl = computed(() =>
    this.plansApi.tasksExportUrl(this.whose(), this.filter()));
  protected readonly title = computed(() => (this.whose() === 'everyone'
    ? 'Everyone\'s tasks' : 'My tasks'));
  protected readonly columns = computed(() => (this.whose() === 'everyone'
    ? ['title', 'owner', 'entry', 'dueDate', 'status', 'actions']
    : ['title', 'entry', 'dueDate', 'status', 'actions']));
  // Keyed by string: mat-table's row context is untyped.
  protected readonly strategyLabels: Readonly<Record<string, string>> = PLAN_STRATEGY_LABELS;
  protected readonly statusLabels: Readonly<Record<string, string>> = TASK_STATUS_LABELS;
  protected readonly isLoading = signal(true);
  protected readonly busyTaskId = signal<number | null>(null);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly tasks = new MatTableDataSource<MyTaskDto>([]);
  protected readonly count = signal(0);
  protected readonly searchText = signal('');
  /** The list request in flight: a newer one replaces it, so answers never arrive out of order. */
  private loading: Subscription | null = null;

  constructor() {
    this.tasks.sortingDataAccessor = taskSortValue;
    this.tasks.filterPredicate = (task, filter) => filter.split(/\s+/)
      .every((word) => taskSearchText(task).includes(word));
    // Loads on the first reading of the address and again whenever a filter changes it.
    this.route.queryParamMap.pipe(takeUntilDestroyed()).subscribe(() => this.load());
  }

  ngAfterViewInit(): void {
    this.tasks.sort = this.sort();
  }

  /** Keeps the rows whose task, owner, entry or supplier holds every word typed. */
  protected search(text: string): void {
    this.searchText.set(text);
    this.tasks.filter = text.trim().toLowerCase();
  }

  protected show(filter: TaskFilter): void {
    this.setFilters({ show: filter === 'open' ? null : filter });
  }

  protected showWhose(whose: TaskOwnerFilter): void {
    this.setFilters({ whose: whose === 'mine' ? null : whose });
  }

  protected markDone(task: MyTaskDto): void {
    this.change(task, 'done');
  }

  protected change(task: MyTaskDto, status: TaskStatus): void {
    if (this.busyTaskId() !== null) {
      return;
    }
    this.busyTaskId.set(task.id);
    this.errorMessage.set(null);
    this.plansApi.updateTask(task.id, { status }).subscribe({
      next: () => {
        this.busyTaskId.set(null);
        this.snackBar.open(`"${task.title}" is now ${TASK_STATUS_LABELS[status].toLowerCase()}.`,
          'Close', { duration: 5000 });
        this.load();
      },
      error: (error: unknown) => {
        this.busyTaskId.set(null);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }

  private setFilters(queryParams: Record<string, string | null>): void {
    void this.router.navigate([], { relativeTo: this.route, queryParams,
      queryParamsHandling: 'merge', replaceUrl: true });
  }

  private load(): void {
    this.isLoading.set(true);
    const query = { show: this.filter() };
    const tasks: Observable<MyTasksDto> = this.whose() === 'everyone'
      ? this.plansApi.everyoneTasks(query) : this.plansApi.myTasks(query);
    this.loading?.unsubscribe();
    this.loading = tasks.subscribe({
      next: (answer) => {
        this.tasks.data = answer.items;
        this.count.set(answer.items.length);
        this.errorMessage.set(null);
        this.isLoading.set(false);
      },
      error: (error: unknown) => {
        this.errorMessage.set(apiErrorMessage(error));
        this.isLoading.set(false);
      },
    });
  }
}

import { DatePipe } from '@angular/common';
import {
  type AfterViewInit,
  ChangeDetectionStrategy,
  Component,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortHeader } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import {
  PLAN_STRATEGY_LABELS,
  TASK_STATUS_LABELS,
  type MyTaskDto,
  type TaskStatus,
} from '@keelson/contracts';
import { apiErrorMessage } from '../shared/api-error-message';
import { PlansApi } from './plans-api';
import { TaskStatusMenu } from './task-status-menu';

/** Which of my tasks the page shows. */
export type TaskFilter = 'open' | 'all';

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
    default:
      return task.id;
  }
}

/**
 * My tasks: the tasks of plans assigned to the signed-in person, overdue first (and marked),
 * with their plan and register entry a click away, "Mark done" and a status menu; open tasks or
 * all of them.
 */
@Component({
  selector: 'kl-my-tasks-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatIcon,
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
  private readonly sort = viewChild.required(MatSort);

  protected readonly columns = ['title', 'entry', 'dueDate', 'status', 'actions'];
  // Keyed by string: mat-table's row context is untyped.
  protected readonly strategyLabels: Readonly<Record<string, string>> = PLAN_STRATEGY_LABELS;
  protected readonly statusLabels: Readonly<Record<string, string>> = TASK_STATUS_LABELS;
  protected readonly filter = signal<TaskFilter>('open');
  protected readonly isLoading = signal(true);
  protected readonly busyTaskId = signal<number | null>(null);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly tasks = new MatTableDataSource<MyTaskDto>([]);
  protected readonly count = signal(0);

  constructor() {
    this.tasks.sortingDataAccessor = taskSortValue;
    this.load();
  }

  ngAfterViewInit(): void {
    this.tasks.sort = this.sort();
  }

  protected show(filter: TaskFilter): void {
    this.filter.set(filter);
    this.load();
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

  private load(): void {
    this.isLoading.set(true);
    this.plansApi.myTasks({ show: this.filter() }).subscribe({
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

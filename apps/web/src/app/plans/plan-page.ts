import { DatePipe, DecimalPipe } from '@angular/common';
import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import {
  PLAN_STRATEGY_LABELS,
  TASK_STATUS_LABELS,
  type PlanDto,
  type PlanTaskDto,
  type TaskStatus,
} from '@keelson/contracts';
import type { Observable } from 'rxjs';
import { Session } from '../auth/session';
import { type ConfirmDialogData, ConfirmDialog } from '../shared/confirm-dialog';
import { RatingChip } from '../register/rating-chip';
import { apiErrorMessage } from '../shared/api-error-message';
import { HistoryPanel } from '../shared/history-panel/history-panel';
import { type DecisionDialogData, DecisionDialog } from './decision-dialog';
import { fieldIssues, formPathOf } from './plan-form';
import { PLAN_WRITERS, describeChange } from './plan-labels';
import { PlanStatusChip } from './plan-status-chip';
import { PlansApi } from './plans-api';
import { TaskComments } from './task-comments';
import { TaskStatusMenu } from './task-status-menu';
import { WhatIfTable } from './what-if-table';

/**
 * What to show when an action failed: a what-if's refusal of a change names the change by its
 * number ("Change 1: ..."), as the page lists them; anything else is the server's message.
 */
export function actionErrorMessage(error: unknown): string {
  const issue = fieldIssues(error instanceof HttpErrorResponse ? error.error : null)[0];
  const path = issue ? formPathOf(issue.path) : [];
  if (issue && path[0] === 'changes' && /^\d+$/.test(path[1] ?? '')) {
    return `Change ${Number(path[1]) + 1}: ${issue.message}. Edit the plan to correct it.`;
  }
  return apiErrorMessage(error);
}

/**
 * One mitigation plan: its entry and supplier, the proposed changes with the what-if's numbers,
 * submission and withdrawal, each plant's decision, the tasks (their status changes once the
 * plan is approved) and the plan's history. Buttons follow what the server says the signed-in
 * user may do (`PlanDto.can`); the server checks again on every call.
 */
@Component({
  selector: 'kl-plan-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    DecimalPipe,
    HistoryPanel,
    MatButton,
    MatIcon,
    MatProgressBar,
    PlanStatusChip,
    RatingChip,
    RouterLink,
    TaskComments,
    TaskStatusMenu,
    WhatIfTable,
  ],
  templateUrl: './plan-page.html',
  styleUrl: './plan-page.scss',
})
export class PlanPage {
  /** The `:id` route parameter. */
  readonly id = input.required<string>();

  private readonly plansApi = inject(PlansApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(Session);

  protected readonly plan = signal<PlanDto | null>(null);
  protected readonly isLoading = signal(true);
  // Counts the reads of the page, so the history panel reads again after every action (not all
  // of them change \`updatedAt\`).
  protected readonly loadCount = signal(0);
  protected readonly isBusy = signal(false);
  protected readonly loadError = signal<string | null>(null);
  protected readonly actionError = signal<string | null>(null);
  protected readonly openTaskId = signal<number | null>(null);
  protected readonly strategyLabels = PLAN_STRATEGY_LABELS;
  protected readonly taskStatusLabels = TASK_STATUS_LABELS;
  protected readonly describeChange = describeChange;
  protected readonly isWriter = computed(() => this.session.hasRole(...PLAN_WRITERS));
  protected readonly isReturned = computed(() => {
    const plan = this.plan();
    return plan !== null && plan.rejectionComment !== null
      && (plan.status === 'draft' || plan.status === 'rejected');
  });

  constructor() {
    effect(() => {
      const id = Number(this.id());
      untracked(() => this.load(id));
    });
  }

  protected supplierRiskLink(plan: PlanDto): unknown[] | null {
    return plan.entry.runId === null
      ? null
      : ['/risk', plan.entry.runId, 'suppliers', plan.entry.supplierCode];
  }

  protected canChangeTask(task: PlanTaskDto): boolean {
    const me = this.session.user();
    return task.isActive && me !== null && (task.owner?.id === me.id || this.isWriter());
  }

  protected toggleComments(taskId: number): void {
    this.openTaskId.update((open) => (open === taskId ? null : taskId));
  }

  /** Reads the plan again (after a comment: its count and the history change). */
  protected reload(): void {
    const plan = this.plan();
    if (plan) this.load(plan.id);
  }

  protected runWhatIf(plan: PlanDto): void {
    this.act(this.plansApi.runWhatIf(plan.id), 'The what-if is up to date.');
  }

  protected submit(plan: PlanDto): void {
    const plants = plan.plants.join(', ');
    this.confirm({
      title: 'Submit the plan for approval?',
      message: `The plant managers of ${plants} each decide; you cannot edit it meanwhile.`,
      confirmLabel: 'Submit',
    }, () => this.act(this.plansApi.submit(plan.id), 'Submitted: the plant managers are told.'));
  }

  protected withdraw(plan: PlanDto): void {
    this.confirm({
      title: 'Withdraw the plan?',
      message: 'A withdrawn plan stays in the history but cannot be submitted again.',
      confirmLabel: 'Withdraw',
    }, () => this.act(this.plansApi.withdraw(plan.id), 'The plan is withdrawn.'));
  }

  protected decide(plan: PlanDto, plantCode: string, decision: 'approved' | 'rejected'): void {
    this.dialog
      .open<DecisionDialog, DecisionDialogData, boolean>(DecisionDialog, {
        data: { plan, plantCode, decision },
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((isDone) => {
        if (isDone) {
          this.notify(decision === 'approved'
            ? `Approved for ${plantCode}.`
            : `Rejected for ${plantCode}: the plan goes back to its author.`);
          this.load(plan.id);
        }
      });
  }

  protected changeTask(task: PlanTaskDto, status: TaskStatus): void {
    this.act(this.plansApi.updateTask(task.id, { status }),
      `"${task.title}" is now ${TASK_STATUS_LABELS[status].toLowerCase()}.`);
  }

  private confirm(data: ConfirmDialogData, then: () => void): void {
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data })
      .afterClosed()
      .subscribe((isConfirmed) => {
        if (isConfirmed) then();
      });
  }

  // Every action reads the plan again afterwards: the server's answer to an action may be
  // smaller than the page, and `can` changes with the status.
  private act(call: Observable<unknown>, success: string): void {
    const plan = this.plan();
    if (this.isBusy() || plan === null) {
      return;
    }
    this.isBusy.set(true);
    this.actionError.set(null);
    call.subscribe({
      next: () => {
        this.isBusy.set(false);
        this.notify(success);
        this.load(plan.id);
      },
      error: (error: unknown) => {
        this.isBusy.set(false);
        this.actionError.set(actionErrorMessage(error));
      },
    });
  }

  private load(id: number): void {
    this.isLoading.set(true);
    this.plansApi.get(id).subscribe({
      next: (plan) => {
        this.plan.set(plan);
        this.loadCount.update((count) => count + 1);
        this.loadError.set(null);
        this.isLoading.set(false);
      },
      error: (error: unknown) => {
        this.loadError.set(apiErrorMessage(error));
        this.isLoading.set(false);
      },
    });
  }

  private notify(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 5000 });
  }
}

import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import { PLAN_STRATEGY_LABELS, type PlanDto } from '@keelson/contracts';
import { Session } from '../auth/session';
import { apiErrorMessage } from '../shared/api-error-message';
import { type DecisionDialogData, DecisionDialog } from './decision-dialog';
import { PlanStatusChip } from './plan-status-chip';
import { PlansApi } from './plans-api';
import { WhatIfTable } from './what-if-table';

/** How many waiting plans the page shows at most (each is read in full for its what-if). */
export const APPROVALS_LIMIT = 50;

/**
 * Approvals. A plant manager sees the plans waiting for their decision, each with its what-if
 * numbers, the register entry and the supplier's risk page a click away, and approves or
 * rejects it for each of their plants. Risk managers and administrators see every plan waiting
 * for approval and who is still to decide, read-only.
 */
@Component({
  selector: 'kl-approvals-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButton, MatIcon, MatProgressBar, PlanStatusChip, RouterLink, WhatIfTable],
  templateUrl: './approvals-page.html',
  styleUrl: './approvals-page.scss',
})
export class ApprovalsPage {
  private readonly plansApi = inject(PlansApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(Session);

  protected readonly strategyLabels = PLAN_STRATEGY_LABELS;
  protected readonly isDecider = computed(() => this.session.hasRole('plant_manager'));
  protected readonly plans = signal<PlanDto[]>([]);
  protected readonly total = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly errorMessage = signal<string | null>(null);

  constructor() {
    this.load();
  }

  protected supplierRiskLink(plan: PlanDto): unknown[] | null {
    return plan.entry.runId === null
      ? null
      : ['/risk', plan.entry.runId, 'suppliers', plan.entry.supplierCode];
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
          this.snackBar.open(decision === 'approved'
            ? `Approved for ${plantCode}. The author and the entry's owner are told.`
            : `Rejected for ${plantCode}: the plan goes back to its author.`,
          'Close', { duration: 5000 });
          this.load();
        }
      });
  }

  protected load(): void {
    this.isLoading.set(true);
    const query = this.isDecider()
      ? { awaitingMe: true, limit: APPROVALS_LIMIT }
      : { status: 'submitted' as const, limit: APPROVALS_LIMIT };
    // Whole plans in one request: the cards show both what-if sides and the decisions.
    this.plansApi
      .listFull(query)
      .subscribe({
        next: ({ total, items }) => {
          this.plans.set(items);
          this.total.set(total);
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

import { DatePipe } from '@angular/common';
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
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import { MatDialog } from '@angular/material/dialog';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import {
  PLAN_STRATEGY_LABELS,
  type PlanSummaryDto,
  type RegisterEntryDetailDto,
  type RegisterStatus,
  type UpdateRegisterEntryInput,
} from '@keelson/contracts';
import { catchError, of } from 'rxjs';
import { Session } from '../auth/session';
import { NetworkVersionsApi } from '../network/network-versions-api';
import { PlanStatusChip } from '../plans/plan-status-chip';
import { PlansApi } from '../plans/plans-api';
import { apiErrorMessage } from '../shared/api-error-message';
import { HistoryPanel } from '../shared/history-panel/history-panel';
import { OverrideDialog } from './override-dialog';
import { ownerOptions } from './owner-options';
import { RatingChip } from './rating-chip';
import { RegisterApi } from './register-api';
import {
  FLAG_EXPLANATIONS,
  FLAG_LABELS,
  REGISTER_WRITERS,
  STATUSES,
  STATUS_LABELS,
} from './register-labels';
import { ScoreNote } from './score-note';
import { StatusChip } from './status-chip';

/**
 * One register entry: supplier, plants, owner, status and notes (editable by risk managers and
 * admins), its score with the computed likelihood and any override, "Override likelihood", and
 * the history of overrides, and its mitigation plans ("Draft a plan" for risk managers and
 * admins). Everyone else sees it read-only.
 */
@Component({
  selector: 'kl-register-entry-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    HistoryPanel,
    MatButton,
    MatError,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatOption,
    MatProgressBar,
    MatSelect,
    MatTableModule,
    PlanStatusChip,
    RatingChip,
    ReactiveFormsModule,
    RouterLink,
    ScoreNote,
    StatusChip,
  ],
  templateUrl: './register-entry-page.html',
  styleUrl: './register-entry-page.scss',
})
export class RegisterEntryPage {
  /** The `:id` route parameter. */
  readonly id = input.required<string>();

  private readonly registerApi = inject(RegisterApi);
  private readonly plansApi = inject(PlansApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(Session);

  protected readonly entry = signal<RegisterEntryDetailDto | null>(null);
  protected readonly isLoading = signal(true);
  // Counts the reads of the page, so the history panel reads again after every action (not all
  // of them change \`updatedAt\`).
  protected readonly loadCount = signal(0);
  protected readonly isSaving = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly saveError = signal<string | null>(null);
  protected readonly plans = signal<PlanSummaryDto[] | null>(null);
  protected readonly plansError = signal<string | null>(null);
  protected readonly strategyLabels = PLAN_STRATEGY_LABELS;
  protected readonly canWrite = computed(() => this.session.hasRole(...REGISTER_WRITERS));
  protected readonly owners = ownerOptions();
  protected readonly statuses = STATUSES;
  protected readonly statusLabels = STATUS_LABELS;
  protected readonly flagLabels = FLAG_LABELS;
  protected readonly flagExplanations = FLAG_EXPLANATIONS;
  protected readonly historyColumns = ['createdAt', 'user', 'previous', 'likelihood', 'reason'];
  protected readonly latestVersion = toSignal(
    inject(NetworkVersionsApi)
      .latest()
      .pipe(catchError(() => of(null))),
    { initialValue: null },
  );
  protected readonly form = inject(NonNullableFormBuilder).group({
    title: ['', [Validators.required, Validators.maxLength(200)]],
    status: ['open' as RegisterStatus],
    ownerId: [null as number | null],
    notes: ['', [Validators.maxLength(10_000)]],
  });

  constructor() {
    effect(() => {
      const id = Number(this.id());
      untracked(() => {
        this.load(id);
        this.loadPlans(id);
      });
    });
  }

  protected supplierLink(entry: RegisterEntryDetailDto): unknown[] | null {
    const version = this.latestVersion();
    return version ? ['/network', version.id, 'suppliers', entry.supplierCode] : null;
  }

  protected overrideLikelihood(entry: RegisterEntryDetailDto): void {
    this.dialog
      .open<OverrideDialog, RegisterEntryDetailDto, boolean>(OverrideDialog, {
        data: entry,
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((isSaved) => {
        if (isSaved) {
          this.notify('Likelihood saved; the rating is up to date.');
          this.load(entry.id);
        }
      });
  }

  protected save(entry: RegisterEntryDetailDto): void {
    if (this.isSaving()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const change = this.changes(entry);
    if (Object.keys(change).length === 0) {
      this.notify('Nothing has changed.');
      return;
    }
    this.isSaving.set(true);
    this.saveError.set(null);
    this.registerApi.update(entry.id, change).subscribe({
      next: () => {
        this.isSaving.set(false);
        this.notify('Entry saved.');
        this.load(entry.id);
      },
      error: (error: unknown) => {
        this.isSaving.set(false);
        this.saveError.set(apiErrorMessage(error));
      },
    });
  }

  protected reset(entry: RegisterEntryDetailDto): void {
    this.form.reset({
      title: entry.title,
      status: entry.status,
      ownerId: entry.owner?.id ?? null,
      notes: entry.notes,
    });
  }

  // Only what was changed goes to the server, so two people editing different fields of one
  // entry do not overwrite each other.
  private changes(entry: RegisterEntryDetailDto): UpdateRegisterEntryInput {
    const value = this.form.getRawValue();
    const change: UpdateRegisterEntryInput = {};
    if (value.title.trim() !== entry.title) change.title = value.title.trim();
    if (value.status !== entry.status) change.status = value.status;
    if (value.notes !== entry.notes) change.notes = value.notes;
    if (this.owners() !== null && value.ownerId !== (entry.owner?.id ?? null)) {
      change.ownerId = value.ownerId;
    }
    return change;
  }

  private loadPlans(id: number): void {
    this.plansApi.listForEntry(id).subscribe({
      next: (page) => {
        this.plans.set(page.items);
        this.plansError.set(null);
      },
      error: (error: unknown) => {
        this.plans.set(null);
        this.plansError.set(apiErrorMessage(error));
      },
    });
  }

  private load(id: number): void {
    this.isLoading.set(true);
    this.registerApi.get(id).subscribe({
      next: (entry) => {
        this.entry.set(entry);
        this.loadCount.update((count) => count + 1);
        this.reset(entry);
        this.errorMessage.set(null);
        this.isLoading.set(false);
      },
      error: (error: unknown) => {
        this.errorMessage.set(apiErrorMessage(error));
        this.isLoading.set(false);
      },
    });
  }

  private notify(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 5000 });
  }
}

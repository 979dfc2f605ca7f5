import { Location } from '@angular/common';
import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatAutocomplete, MatAutocompleteTrigger } from '@angular/material/autocomplete';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatOption, provideNativeDateAdapter } from '@angular/material/core';
import {
  MatDatepicker,
  MatDatepickerInput,
  MatDatepickerToggle,
} from '@angular/material/datepicker';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import {
  PLAN_STRATEGIES,
  PLAN_STRATEGY_LABELS,
  type PlanChangeKind,
  type PlanDto,
  type PlanEntrySummaryDto,
  type SourcingLinkDto,
} from '@keelson/contracts';
import { type Observable, catchError, concat, map, of, switchMap, toArray } from 'rxjs';
import { NetworkBrowseApi } from '../network/network-browse-api';
import { NetworkVersionsApi } from '../network/network-versions-api';
import { RegisterApi } from '../register/register-api';
import { apiErrorMessage } from '../shared/api-error-message';
import {
  type PlanForm,
  applyServerErrors,
  changeForm,
  changeValue,
  createPlanValue,
  fieldIssues,
  planForm,
  taskForm,
  taskValue,
} from './plan-form';
import { PLAN_CHANGE_KINDS, PLAN_CHANGE_KIND_LABELS } from './plan-labels';
import { PlansApi } from './plans-api';

/**
 * The plan editor: a new draft for a register entry (`/plans/new?entry=<id>`) or a draft or
 * returned plan (`/plans/:id/edit`). Strategy, description, cost, target date, the proposed
 * network changes for the what-if, and the tasks, edited inline. "Save draft" sends it; the
 * server's field errors land under the field they name.
 */
@Component({
  selector: 'kl-plan-editor-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [provideNativeDateAdapter()],
  imports: [
    MatAutocomplete,
    MatAutocompleteTrigger,
    MatButton,
    MatCheckbox,
    MatDatepicker,
    MatDatepickerInput,
    MatDatepickerToggle,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatIconButton,
    MatInput,
    MatLabel,
    MatMenu,
    MatMenuItem,
    MatMenuTrigger,
    MatOption,
    MatProgressBar,
    MatSelect,
    MatSuffix,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './plan-editor-page.html',
  styleUrl: './plan-editor-page.scss',
})
export class PlanEditorPage {
  /** The `:id` route parameter when editing; absent for a new plan. */
  readonly id = input<string | undefined>(undefined);
  /** The `?entry=` query parameter for a new plan. */
  readonly entry = input<string | undefined>(undefined);

  private readonly plansApi = inject(PlansApi);
  private readonly registerApi = inject(RegisterApi);
  private readonly versionsApi = inject(NetworkVersionsApi);
  private readonly browseApi = inject(NetworkBrowseApi);
  private readonly router = inject(Router);
  private readonly location = inject(Location);
  private readonly injector = inject(Injector);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly strategies = PLAN_STRATEGIES;
  protected readonly strategyLabels = PLAN_STRATEGY_LABELS;
  protected readonly changeKinds = PLAN_CHANGE_KINDS;
  protected readonly changeKindLabels = PLAN_CHANGE_KIND_LABELS;
  protected readonly plan = signal<PlanDto | null>(null);
  protected readonly entrySummary = signal<PlanEntrySummaryDto | null>(null);
  protected readonly isLoading = signal(true);
  protected readonly isSaving = signal(false);
  protected readonly loadError = signal<string | null>(null);
  protected readonly saveError = signal<string | null>(null);
  protected readonly isNew = computed(() => this.id() === undefined);
  protected readonly form = signal<PlanForm>(planForm());
  /** What the entry's supplier sells in the newest network version (a hint for the changes). */
  protected readonly supplierSells = signal<readonly SourcingLinkDto[]>([]);
  protected readonly soldItems = computed(() => [...new Set(this.supplierSells()
    .map((link) => link.itemCode))].sort());
  protected readonly itemHint = 'The item code, as in the Items sheet.';
  protected readonly soldItemsHint = computed(() => {
    const entry = this.entrySummary();
    const items = this.soldItems();
    if (!entry || items.length === 0) return null;
    const buyers = (item: string) => this.supplierSells()
      .filter((link) => link.itemCode === item).length;
    const list = items.map((item) => `${item} to ${buyers(item)} buyer${buyers(item) === 1
      ? '' : 's'}`);
    return `${entry.supplierCode} supplies ${list.join(', ')}.`;
  });
  protected readonly owners = toSignal(
    this.plansApi.owners().pipe(
      map((answer) => answer.items),
      catchError(() => of([])),
    ),
    { initialValue: [] },
  );

  constructor() {
    effect(() => {
      const id = this.id();
      const entry = this.entry();
      untracked(() => {
        if (id === undefined) this.startNew(Number(entry));
        else this.loadPlan(Number(id));
      });
    });
  }

  protected addChange(kind: PlanChangeKind): void {
    const row = changeForm(kind);
    const entry = this.entrySummary();
    const items = this.soldItems();
    // A second source is for what the entry's supplier sells; with one item there is no choice.
    if (kind === 'add_source' && items.length === 1) row.controls.itemCode.setValue(items[0]!);
    // The what-if is about the entry's supplier; its time to recover is the usual change.
    if (kind === 'set_recovery' && entry) row.controls.supplierCode.setValue(entry.supplierCode);
    this.form().controls.changes.push(row);
  }

  protected removeChange(index: number): void {
    this.form().controls.changes.removeAt(index);
  }

  protected addTask(): void {
    this.form().controls.tasks.push(taskForm());
  }

  protected removeTask(index: number): void {
    this.form().controls.tasks.removeAt(index);
  }

  /**
   * Saves the draft and opens the plan; with `thenWhatIf`, runs the what-if first, and when it
   * refuses a change, stays here with the saved draft and the message under that change's field.
   */
  protected save(thenWhatIf = false): void {
    const form = this.form();
    if (this.isSaving()) {
      return;
    }
    if (form.invalid) {
      form.markAllAsTouched();
      this.saveError.set('Some fields need a look: see the messages under them.');
      return;
    }
    this.isSaving.set(true);
    this.saveError.set(null);
    const plan = this.plan();
    const saved: Observable<number> = plan === null
      ? this.plansApi.create(Number(this.entry()), createPlanValue(form)).pipe(map((p) => p.id))
      : this.saveExisting(plan, form);
    let savedId: number | null = null;
    saved.pipe(
      switchMap((id) => {
        savedId = id;
        return thenWhatIf ? this.plansApi.runWhatIf(id).pipe(map(() => id)) : of(id);
      }),
    ).subscribe({
      next: (id) => {
        this.isSaving.set(false);
        this.snackBar.open(thenWhatIf ? 'Draft saved; the what-if is up to date.' : 'Draft saved.',
          'Close', { duration: 5000 });
        void this.router.navigate(['/plans', id]);
      },
      error: (error: unknown) => {
        if (savedId === null) {
          this.isSaving.set(false);
          this.showSaveError(error);
        } else {
          this.reopenSaved(savedId, error);
        }
      },
    });
  }

  // The draft is saved but its what-if failed: carry on editing the saved plan (so the next save
  // is a PATCH with the tasks' new ids), with the refusal under the field it names.
  private reopenSaved(id: number, error: unknown): void {
    this.plansApi.get(id).subscribe({
      next: (plan) => {
        this.isSaving.set(false);
        this.plan.set(plan);
        this.form.set(planForm(plan));
        this.location.replaceState(`/plans/${id}/edit`);
        // After the new form is bound: binding a control validates it again, which would drop
        // an error put on it before.
        afterNextRender(() => {
          const issues = fieldIssues(error instanceof HttpErrorResponse ? error.error : null);
          const unmatched = applyServerErrors(this.form(), issues);
          this.saveError.set(unmatched.length === 0 && issues.length > 0
            ? 'The draft is saved, but the what-if refused a change: see the message under it.'
            : `The draft is saved, but the what-if failed: ${apiErrorMessage(error)}`);
        }, { injector: this.injector });
      },
      error: () => void this.router.navigate(['/plans', id]),
    });
  }

  protected cancelLink(): unknown[] {
    const plan = this.plan();
    if (plan) return ['/plans', plan.id];
    const entry = this.entry();
    return entry ? ['/register', entry] : ['/register'];
  }

  // A plan's own fields go in one PATCH; its tasks are separate resources, so each changed row
  // is sent on its own, one after the other (removed, changed, then new ones).
  private saveExisting(plan: PlanDto, form: PlanForm): Observable<number> {
    const value = createPlanValue(form);
    const rows = form.controls.tasks.controls;
    const kept = new Set(rows.map((row) => row.controls.id.value).filter((id) => id !== null));
    const calls: Observable<unknown>[] = [
      this.plansApi.update(plan.id, {
        strategy: value.strategy,
        description: value.description,
        estimatedCost: value.estimatedCost,
        targetDate: value.targetDate,
        changes: form.controls.changes.controls.map(changeValue),
      }),
      ...plan.tasks.filter((task) => !kept.has(task.id))
        .map((task) => this.plansApi.deleteTask(task.id)),
    ];
    for (const row of rows) {
      const id = row.controls.id.value;
      const task = taskValue(row);
      const before = plan.tasks.find((candidate) => candidate.id === id);
      if (id === null) {
        calls.push(this.plansApi.addTask(plan.id, task));
      } else if (before && (before.title !== task.title || (before.owner?.id ?? null)
        !== task.ownerId || before.dueDate !== task.dueDate)) {
        calls.push(this.plansApi.updateTask(id, task));
      }
    }
    return concat(...calls).pipe(toArray(), map(() => plan.id));
  }

  private showSaveError(error: unknown): void {
    const body = error instanceof HttpErrorResponse ? error.error : null;
    const issues = fieldIssues(body);
    const unmatched = applyServerErrors(this.form(), issues);
    if (issues.length > 0 && unmatched.length === 0) {
      this.saveError.set('The server did not accept some fields: see the messages under them.');
    } else {
      this.saveError.set(apiErrorMessage(error));
    }
  }

  private startNew(entryId: number): void {
    this.plan.set(null);
    this.form.set(planForm());
    if (!Number.isInteger(entryId) || entryId <= 0) {
      this.loadError.set('A new plan starts from a register entry: open the entry first.');
      this.isLoading.set(false);
      return;
    }
    this.registerApi.get(entryId).subscribe({
      next: (entry) => {
        this.entrySummary.set({
          id: entry.id,
          title: entry.title,
          supplierCode: entry.supplierCode,
          supplierName: entry.supplierName,
          status: entry.status,
          rating: entry.rating,
          ratingBand: entry.ratingBand,
          runId: entry.runId,
        });
        this.loadSupplierSells(entry.supplierCode);
        this.isLoading.set(false);
      },
      error: (error: unknown) => {
        this.loadError.set(apiErrorMessage(error));
        this.isLoading.set(false);
      },
    });
  }

  // Only a hint: without a version or the supplier in it, the fields are typed by hand.
  private loadSupplierSells(supplierCode: string): void {
    this.versionsApi.latest().pipe(
      switchMap((version) => (version === null
        ? of([])
        : this.browseApi.supplier(version.id, supplierCode).pipe(map((s) => s.sells)))),
      catchError(() => of([])),
    ).subscribe((sells) => this.supplierSells.set(sells));
  }

  private loadPlan(id: number): void {
    this.plansApi.get(id).subscribe({
      next: (plan) => {
        this.plan.set(plan);
        this.entrySummary.set(plan.entry);
        this.loadSupplierSells(plan.entry.supplierCode);
        this.form.set(planForm(plan));
        if (!plan.can.edit) this.form().disable();
        this.isLoading.set(false);
      },
      error: (error: unknown) => {
        this.loadError.set(apiErrorMessage(error));
        this.isLoading.set(false);
      },
    });
  }
}

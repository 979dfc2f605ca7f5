import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  type ValidationErrors,
  Validators,
} from '@angular/forms';
import { MatButton } from '@angular/material/button';
import {
  MAT_DIALOG_DATA,
  MatDialogActions,
  MatDialogClose,
  MatDialogContent,
  MatDialogRef,
  MatDialogTitle,
} from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { PLAN_STRATEGY_LABELS, type PlanSummaryDto } from '@keelson/contracts';
import { apiErrorMessage } from '../shared/api-error-message';
import { PlansApi } from './plans-api';

/** The shortest rejection comment the server accepts (contracts: decidePlanSchema). */
export const MIN_REJECTION_LENGTH = 5;

/** What the decision dialog decides. */
export interface DecisionDialogData {
  readonly plan: PlanSummaryDto;
  readonly plantCode: string;
  readonly decision: 'approved' | 'rejected';
}

function rejectionComment(control: AbstractControl<string>): ValidationErrors | null {
  const length = control.value.trim().length;
  if (length === 0) return { required: true };
  return length < MIN_REJECTION_LENGTH ? { tooShort: true } : null;
}

/**
 * A plant manager's decision on a plan for one plant: approve (a comment is optional) or reject
 * (a comment is required: it goes back to the author with the draft). Posts itself and closes
 * with `true` once the server has recorded it.
 */
@Component({
  selector: 'kl-decision-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButton,
    MatDialogActions,
    MatDialogClose,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
  ],
  template: `
    <h2 mat-dialog-title>
      {{ isReject ? 'Reject' : 'Approve' }} the plan for {{ data.plantCode }}
    </h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="decision__content">
        @if (isBusy()) {
          <mat-progress-bar mode="indeterminate" aria-label="Saving" />
        }
        @if (errorMessage(); as message) {
          <div class="kl-error-banner" role="alert">
            <mat-icon aria-hidden="true">error</mat-icon>
            <span>{{ message }}</span>
          </div>
        }
        <p>
          {{ strategyLabels[data.plan.strategy] }} for {{ data.plan.entry.supplierCode }}
          ({{ data.plan.entry.title }}).
        </p>
        <p class="kl-muted">
          @if (isReject) {
            The plan goes back to its author as a draft, with your comment.
          } @else {
            Your approval is recorded for {{ data.plantCode }} only; the plan starts once every
            plant it touches has approved.
          }
        </p>
        <mat-form-field appearance="outline">
          <mat-label>{{ isReject ? 'Why it is rejected' : 'Comment (optional)' }}</mat-label>
          <textarea matInput formControlName="comment" rows="4"
            [required]="isReject"></textarea>
          <mat-hint>Kept with the decision and sent to the author.</mat-hint>
          @if (form.controls.comment.hasError('required')) {
            <mat-error>Say why you reject the plan.</mat-error>
          } @else if (form.controls.comment.hasError('tooShort')) {
            <mat-error>Say why in at least {{ minLength }} characters.</mat-error>
          } @else if (form.controls.comment.hasError('maxlength')) {
            <mat-error>A comment has at most 5000 characters.</mat-error>
          }
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button matButton type="button" mat-dialog-close>Cancel</button>
        <button matButton="filled" type="submit" [disabled]="isBusy()">
          {{ isReject ? 'Reject' : 'Approve' }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .decision__content {
      display: flex;
      flex-direction: column;
      gap: 4px;
      min-width: min(460px, 80vw);
    }
  `,
})
export class DecisionDialog {
  private readonly plansApi = inject(PlansApi);
  private readonly dialogRef = inject<MatDialogRef<DecisionDialog, boolean>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly data = inject<DecisionDialogData>(MAT_DIALOG_DATA);
  protected readonly isReject = this.data.decision === 'rejected';
  protected readonly strategyLabels = PLAN_STRATEGY_LABELS;
  protected readonly minLength = MIN_REJECTION_LENGTH;
  protected readonly isBusy = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    comment: ['', this.isReject
      ? [rejectionComment, Validators.maxLength(5000)]
      : [Validators.maxLength(5000)]],
  });

  protected submit(): void {
    if (this.isBusy()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isBusy.set(true);
    this.errorMessage.set(null);
    this.plansApi
      .decide(this.data.plan.id, {
        plantCode: this.data.plantCode,
        decision: this.data.decision,
        comment: this.form.getRawValue().comment.trim(),
      })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: () => this.dialogRef.close(true),
        error: (error: unknown) => {
          this.isBusy.set(false);
          this.errorMessage.set(apiErrorMessage(error));
        },
      });
  }
}

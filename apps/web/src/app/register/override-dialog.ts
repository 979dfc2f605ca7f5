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
import { MatOption } from '@angular/material/core';
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
import { MatSelect } from '@angular/material/select';
import type { RegisterEntryDto } from '@keelson/contracts';
import { apiErrorMessage } from '../shared/api-error-message';
import { RegisterApi } from './register-api';

/** The shortest reason the server accepts (contracts: overrideLikelihoodSchema). */
export const MIN_REASON_LENGTH = 5;

/** What a likelihood means, for the dialog's options. */
export const LIKELIHOOD_LABELS: Readonly<Record<number, string>> = {
  1: '1 · rare',
  2: '2 · unlikely',
  3: '3 · possible',
  4: '4 · likely',
  5: '5 · almost certain',
};

/** The value that means "remove the override and use the computed likelihood again". */
const COMPUTED = 0;

function minTrimmedLength(control: AbstractControl<string>): ValidationErrors | null {
  const length = control.value.trim().length;
  return length > 0 && length < MIN_REASON_LENGTH ? { tooShort: true } : null;
}

function requiredTrimmed(control: AbstractControl<string>): ValidationErrors | null {
  return control.value.trim().length === 0 ? { required: true } : null;
}

/**
 * "Override likelihood": a new likelihood 1-5, or back to the computed one, with a reason that
 * is kept in the entry's history. It posts itself and closes with `true` once saved.
 */
@Component({
  selector: 'kl-override-dialog',
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
    MatOption,
    MatProgressBar,
    MatSelect,
  ],
  templateUrl: './override-dialog.html',
  styles: `
    .override__content {
      display: flex;
      flex-direction: column;
      gap: 4px;
      min-width: min(460px, 80vw);
    }
  `,
})
export class OverrideDialog {
  private readonly registerApi = inject(RegisterApi);
  private readonly dialogRef = inject<MatDialogRef<OverrideDialog, boolean>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly entry = inject<RegisterEntryDto>(MAT_DIALOG_DATA);
  protected readonly levels = [1, 2, 3, 4, 5] as const;
  protected readonly labels = LIKELIHOOD_LABELS;
  protected readonly computedValue = COMPUTED;
  protected readonly minReason = MIN_REASON_LENGTH;
  protected readonly isBusy = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    likelihood: [this.entry.likelihoodOverride ?? (null as number | null), [Validators.required]],
    reason: ['', [requiredTrimmed, minTrimmedLength, Validators.maxLength(2000)]],
  });

  protected submit(): void {
    if (this.isBusy()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { likelihood, reason } = this.form.getRawValue();
    this.isBusy.set(true);
    this.errorMessage.set(null);
    this.registerApi
      .overrideLikelihood(this.entry.id, {
        likelihood: likelihood === COMPUTED ? null : likelihood,
        reason: reason.trim(),
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

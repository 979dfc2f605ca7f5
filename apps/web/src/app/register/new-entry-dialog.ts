import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import {
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
import type { CreateRegisterEntryInput, RegisterEntryDto } from '@keelson/contracts';
import { Session } from '../auth/session';
import { apiErrorMessage } from '../shared/api-error-message';
import { ownerOptions } from './owner-options';
import { RegisterApi } from './register-api';

/**
 * "New entry": a register entry made by hand for a supplier (supplier code, title, owner,
 * notes). An admin picks the owner; a risk manager owns the entries they make. It calls the API
 * itself, so a refusal (unknown supplier) shows inside the dialog, and closes with the entry.
 */
@Component({
  selector: 'kl-new-entry-dialog',
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
  template: `
    <h2 mat-dialog-title>New register entry</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="new-entry__content">
        @if (isBusy()) {
          <mat-progress-bar mode="indeterminate" aria-label="Saving" />
        }
        @if (errorMessage(); as message) {
          <div class="kl-error-banner" role="alert">
            <mat-icon aria-hidden="true">error</mat-icon>
            <span>{{ message }}</span>
          </div>
        }
        <p class="kl-muted">
          The entry is scored from the latest analysis run that includes the supplier.
        </p>
        <mat-form-field appearance="outline">
          <mat-label>Supplier code</mat-label>
          <input matInput formControlName="supplierCode" autocomplete="off" required />
          <mat-hint>As in the imported network, for example S-2-SHARED-A.</mat-hint>
          @if (form.controls.supplierCode.hasError('required')) {
            <mat-error>Enter the supplier's code.</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Title</mat-label>
          <input matInput formControlName="title" autocomplete="off" required />
          @if (form.controls.title.hasError('required')) {
            <mat-error>Say in a few words what the risk is.</mat-error>
          } @else if (form.controls.title.hasError('maxlength')) {
            <mat-error>A title has at most 200 characters.</mat-error>
          }
        </mat-form-field>
        @if (owners(); as people) {
          <mat-form-field appearance="outline">
            <mat-label>Owner</mat-label>
            <mat-select formControlName="ownerId">
              <mat-option [value]="null">Nobody yet</mat-option>
              @for (person of people; track person.id) {
                <mat-option [value]="person.id">{{ person.name }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
        } @else {
          <p class="new-entry__owner">
            Owner: <strong>{{ selfName }}</strong>
            <span class="kl-muted">(an administrator can hand it to someone else)</span>
          </p>
        }
        <mat-form-field appearance="outline">
          <mat-label>Notes</mat-label>
          <textarea matInput formControlName="notes" rows="4"></textarea>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button matButton type="button" mat-dialog-close>Cancel</button>
        <button matButton="filled" type="submit" [disabled]="isBusy()">Create entry</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .new-entry__content {
      display: flex;
      flex-direction: column;
      gap: 4px;
      min-width: min(460px, 80vw);
    }
    .new-entry__owner {
      margin: 0 0 16px;
    }
  `,
})
export class NewEntryDialog {
  private readonly registerApi = inject(RegisterApi);
  private readonly dialogRef = inject<MatDialogRef<NewEntryDialog, RegisterEntryDto>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  private readonly self = inject(Session).user();

  protected readonly owners = ownerOptions();
  protected readonly selfName = this.self?.name ?? 'you';
  protected readonly isBusy = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    supplierCode: ['', [Validators.required, Validators.maxLength(60)]],
    title: ['', [Validators.required, Validators.maxLength(200)]],
    ownerId: [(this.self?.id ?? null) as number | null],
    notes: ['', [Validators.maxLength(10_000)]],
  });

  protected submit(): void {
    if (this.isBusy()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    const input: CreateRegisterEntryInput = {
      supplierCode: value.supplierCode.trim(),
      title: value.title.trim(),
      ownerId: value.ownerId,
      notes: value.notes,
    };
    this.isBusy.set(true);
    this.errorMessage.set(null);
    this.registerApi
      .create(input)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (entry) => this.dialogRef.close(entry),
        error: (error: unknown) => {
          this.isBusy.set(false);
          this.errorMessage.set(apiErrorMessage(error));
        },
      });
  }
}

import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
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
import { MatInput } from '@angular/material/input';
import { MatSelect } from '@angular/material/select';
import type { NetworkVersionDto } from '@keelson/contracts';
import { NetworkVersionsApi } from '../network/network-versions-api';
import { versionLabel } from '../network/version-label';
import { apiErrorMessage } from '../shared/api-error-message';
import { defaultRunLabel } from './run-labels';
import { RunsApi } from './runs-api';

/** Versions the picker offers (the newest first). */
export const VERSION_PICKER_LIMIT = 100;

/**
 * Starts an analysis run: which network version (the latest is preselected) and a label. Posts
 * the run and closes with its id, or shows the API's message and stays open.
 */
@Component({
  selector: 'kl-start-run-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButton,
    MatDialogActions,
    MatDialogClose,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatHint,
    MatInput,
    MatLabel,
    MatOption,
    MatSelect,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>Start a run</h2>
    <form [formGroup]="form" (ngSubmit)="submit()">
      <mat-dialog-content>
        <p class="kl-muted">
          The engine fails each supplier in turn on the chosen network version and scores what
          would be lost. It runs on the server; you can leave this page meanwhile.
        </p>
        <mat-form-field appearance="outline">
          <mat-label>Network version</mat-label>
          <mat-select formControlName="networkVersionId">
            @for (version of versions(); track version.id) {
              <mat-option [value]="version.id">{{ label(version) }}</mat-option>
            }
          </mat-select>
          @if (versions().length === 0 && !isLoading()) {
            <mat-hint>No network version yet: import a workbook first.</mat-hint>
          }
          <mat-error>Choose a network version.</mat-error>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Label</mat-label>
          <input matInput formControlName="label" maxlength="120" />
          <mat-error>Give the run a label (up to 120 characters).</mat-error>
        </mat-form-field>
        @if (error(); as message) {
          <div class="kl-error-banner" role="alert">{{ message }}</div>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button matButton type="button" [mat-dialog-close]="undefined">Cancel</button>
        <button matButton="filled" type="submit" [disabled]="isSaving()">Start</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    mat-form-field {
      display: block;
      width: min(520px, 100%);
    }
  `,
})
export class StartRunDialog {
  private readonly runsApi = inject(RunsApi);
  private readonly dialogRef = inject<MatDialogRef<StartRunDialog, number>>(MatDialogRef);

  protected readonly versions = signal<NetworkVersionDto[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly isSaving = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly form = new FormGroup({
    networkVersionId: new FormControl<number | null>(null, Validators.required),
    label: new FormControl(defaultRunLabel(), {
      nonNullable: true,
      validators: [Validators.required, Validators.maxLength(120), Validators.pattern(/\S/)],
    }),
  });

  constructor() {
    inject(NetworkVersionsApi)
      .list(VERSION_PICKER_LIMIT)
      .pipe(takeUntilDestroyed())
      .subscribe({
        next: (page) => {
          this.isLoading.set(false);
          this.versions.set(page.items);
          const latest = page.items.find((version) => version.isLatest) ?? page.items[0];
          if (latest && this.form.controls.networkVersionId.value === null) {
            this.form.controls.networkVersionId.setValue(latest.id);
          }
        },
        error: (failure: unknown) => {
          this.isLoading.set(false);
          this.error.set(apiErrorMessage(failure));
        },
      });
  }

  protected label(version: NetworkVersionDto): string {
    return versionLabel(version);
  }

  protected submit(): void {
    const { networkVersionId, label } = this.form.getRawValue();
    if (this.form.invalid || networkVersionId === null) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSaving.set(true);
    this.error.set(null);
    this.runsApi.start({ networkVersionId, label: label.trim() }).subscribe({
      next: ({ id }) => this.dialogRef.close(id),
      error: (failure: unknown) => {
        this.isSaving.set(false);
        this.error.set(apiErrorMessage(failure));
      },
    });
  }
}

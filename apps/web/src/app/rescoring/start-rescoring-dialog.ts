import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
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
import { MatInput } from '@angular/material/input';
import { MatSelect } from '@angular/material/select';
import type { NetworkVersionDto, RescoringRunDto } from '@keelson/contracts';
import { NetworkVersionsApi } from '../network/network-versions-api';
import { versionLabel } from '../network/version-label';
import { apiErrorCode, apiErrorMessage } from '../shared/api-error-message';
import { quarterOf } from './rescoring-labels';
import { RescoringApi } from './rescoring-api';

/** Versions the picker offers (the newest first). */
export const RESCORING_VERSION_LIMIT = 100;

/** What the page tells the dialog. */
export interface StartRescoringData {
  /** Admins may force another re-scoring of a quarter that has one. */
  isAdmin: boolean;
  /** The schedule's time zone, in which "this quarter" is read. */
  timeZone: string;
}

/** How the dialog ends: the new re-scoring, or the existing one the person chose to see. */
export type StartRescoringResult = { started: RescoringRunDto } | { showExisting: number };

/** The id of the existing re-scoring in a 409 `quarter_taken` answer, when it names one. */
export function takenRescoringId(failure: unknown): number | null {
  if (!(failure instanceof HttpErrorResponse) || apiErrorCode(failure) !== 'quarter_taken') {
    return null;
  }
  const details = (failure.error as { error?: { details?: Record<string, unknown> } }).error
    ?.details;
  const id = details?.['rescoringId'] ?? details?.['existingId'] ?? details?.['id'];
  return typeof id === 'number' ? id : null;
}

/**
 * Starts a re-scoring: which network version (the latest unless chosen) and which quarter
 * (this one by default). Admins may force a second one for a quarter; otherwise a quarter that
 * has one already is refused, and the dialog says so with a link to it.
 */
@Component({
  selector: 'kl-start-rescoring-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButton, MatCheckbox, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle,
    MatError, MatFormField, MatHint, MatInput, MatLabel, MatOption, MatSelect,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>Start re-scoring</h2>
    <form [formGroup]="form" (ngSubmit)="submit()">
      <mat-dialog-content>
        <p class="kl-muted">
          Runs the full analysis on the chosen network version, then re-scores every register
          entry, adds entries for new single points of failure and flags entries whose supplier
          is gone or no longer matters. It runs on the server; you can leave this page.
        </p>
        <mat-form-field appearance="outline">
          <mat-label>Network version</mat-label>
          <mat-select formControlName="networkVersionId">
            <mat-option value="latest">
              The latest version, whichever it is when it starts
            </mat-option>
            @for (version of versions(); track version.id) {
              <mat-option [value]="version.id">{{ label(version) }}</mat-option>
            }
          </mat-select>
          @if (versions().length === 0 && !isLoading()) {
            <mat-hint>No network version yet: import a workbook first.</mat-hint>
          }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Quarter</mat-label>
          <input matInput formControlName="quarterLabel" maxlength="7" />
          <mat-hint>As 2027-Q1; read in the schedule's time zone ({{ data.timeZone }}).</mat-hint>
          <mat-error>Write the quarter as 2027-Q1.</mat-error>
        </mat-form-field>
        @if (data.isAdmin) {
          <mat-checkbox formControlName="force">Force another for this quarter</mat-checkbox>
          <p class="kl-muted start-rescoring__explain">
            A quarter normally has one re-scoring, so two clicks or a click during the scheduled
            run never make two. Tick this only to re-score the quarter again on purpose (after
            a corrected import, say); the earlier one stays in the list.
          </p>
        }
        @if (error(); as message) {
          <div class="kl-error-banner start-rescoring__error" role="alert">
            <span>{{ message }}</span>
            @if (takenId(); as id) {
              <button matButton type="button" [mat-dialog-close]="{ showExisting: id }">
                See the existing re-scoring
              </button>
            }
          </div>
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
    .start-rescoring__error {
      flex-direction: column;
      align-items: flex-start;
      max-width: 520px;
    }
    .start-rescoring__explain {
      max-width: 520px;
      margin: 0 0 12px 40px;
      font: var(--mat-sys-body-small);
    }
  `,
})
export class StartRescoringDialog {
  private readonly api = inject(RescoringApi);
  private readonly dialogRef =
    inject<MatDialogRef<StartRescoringDialog, StartRescoringResult>>(MatDialogRef);
  protected readonly data = inject<StartRescoringData>(MAT_DIALOG_DATA);

  protected readonly versions = signal<NetworkVersionDto[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly isSaving = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly takenId = signal<number | null>(null);
  protected readonly form = new FormGroup({
    networkVersionId: new FormControl<number | 'latest'>('latest', { nonNullable: true }),
    quarterLabel: new FormControl(quarterOf(new Date(), this.data.timeZone), {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(/^\s*\d{4}-Q[1-4]\s*$/)],
    }),
    force: new FormControl(false, { nonNullable: true }),
  });

  constructor() {
    inject(NetworkVersionsApi)
      .list(RESCORING_VERSION_LIMIT)
      .pipe(takeUntilDestroyed())
      .subscribe({
        next: (page) => {
          this.isLoading.set(false);
          this.versions.set(page.items);
        },
        error: (failure: unknown) => {
          this.isLoading.set(false);
          this.error.set(apiErrorMessage(failure));
        },
      });
  }

  protected label(version: NetworkVersionDto): string {
    return versionLabel(version) + (version.isLatest ? ' (latest)' : '');
  }

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { networkVersionId, quarterLabel, force } = this.form.getRawValue();
    this.isSaving.set(true);
    this.error.set(null);
    this.takenId.set(null);
    this.api.start({
      ...(networkVersionId === 'latest' ? {} : { networkVersionId }),
      quarterLabel: quarterLabel.trim(),
      force: this.data.isAdmin && force,
    }).subscribe({
      next: (started) => this.dialogRef.close({ started }),
      error: (failure: unknown) => {
        this.isSaving.set(false);
        this.error.set(apiErrorMessage(failure));
        this.takenId.set(takenRescoringId(failure));
      },
    });
  }
}

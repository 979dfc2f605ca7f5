import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy, Component, computed, inject, input, output, signal,
} from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import type { RescoringScheduleDto } from '@keelson/contracts';
import { apiErrorMessage } from '../shared/api-error-message';
import { cronInWords } from './rescoring-labels';
import { RescoringApi } from './rescoring-api';

/** A moment as the schedule's zone reads it: "Monday 4 January 2027, 06:00". */
export function formatInZone(iso: string, timeZone: string): string {
  const options: Intl.DateTimeFormatOptions = { weekday: 'long', day: 'numeric',
    month: 'long', year: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' };
  try {
    return new Intl.DateTimeFormat('en-GB', { ...options, timeZone }).format(new Date(iso));
  } catch {
    return new Intl.DateTimeFormat('en-GB', { ...options, timeZone: 'UTC' })
      .format(new Date(iso)) + ' UTC';
  }
}

/**
 * When the re-scoring runs by itself: the cron expression in words, its time zone and the next
 * run. Admins change it in a small form; a refused expression shows the server's message under
 * the field.
 */
@Component({
  selector: 'kl-rescoring-schedule',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButton, MatCheckbox, MatError, MatFormField, MatHint, MatInput, MatLabel,
    ReactiveFormsModule,
  ],
  template: `
    @let s = schedule();
    <p class="schedule__summary">
      @if (!s.isEnabled) {
        The schedule is off: re-scorings start only from the button.
      } @else {
        Runs by itself at <strong>{{ words() }}</strong> ({{ s.timeZone }} time).
        @if (s.nextRunAt) {
          Next run: <strong>{{ nextRun() }}</strong>.
        }
      }
    </p>
    @if (canEdit() && !isEditing()) {
      <button matButton type="button" (click)="edit()">Change the schedule</button>
    }
    @if (isEditing()) {
      <form class="schedule__form" [formGroup]="form" (ngSubmit)="save()"
            aria-label="Re-scoring schedule">
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Cron expression</mat-label>
          <input matInput formControlName="cron" maxlength="100" />
          <mat-hint>minute hour day-of-month month day-of-week; {{ preview() }}</mat-hint>
          @if (form.controls.cron.hasError('server')) {
            <mat-error>{{ form.controls.cron.getError('server') }}</mat-error>
          } @else {
            <mat-error>Five fields, as 0 6 * 1,4,7,10 1#1.</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Time zone</mat-label>
          <input matInput formControlName="timeZone" maxlength="64" />
          <mat-hint>An IANA name, as Europe/Berlin or UTC.</mat-hint>
          @if (form.controls.timeZone.hasError('server')) {
            <mat-error>{{ form.controls.timeZone.getError('server') }}</mat-error>
          } @else {
            <mat-error>Write a time zone, as Europe/Berlin.</mat-error>
          }
        </mat-form-field>
        <mat-checkbox formControlName="isEnabled">Run by itself on this schedule</mat-checkbox>
        @if (error(); as message) {
          <div class="kl-error-banner" role="alert">{{ message }}</div>
        }
        <div class="schedule__actions">
          <button matButton type="button" (click)="isEditing.set(false)">Cancel</button>
          <button matButton="filled" type="submit" [disabled]="isSaving()">Save schedule</button>
        </div>
      </form>
    }
  `,
  styles: `
    .schedule__summary {
      margin: 0 0 8px;
    }
    .schedule__form {
      display: grid;
      gap: 8px;
      max-width: 520px;
      margin-top: 8px;
    }
    .schedule__actions {
      display: flex;
      gap: 8px;
      justify-content: flex-end;
    }
  `,
})
export class RescoringSchedule {
  private readonly api = inject(RescoringApi);

  /** The schedule in force. */
  readonly schedule = input.required<RescoringScheduleDto>();
  /** Admins edit it. */
  readonly canEdit = input(false);
  /** The saved schedule, after a successful save. */
  readonly saved = output<RescoringScheduleDto>();

  protected readonly isEditing = signal(false);
  protected readonly isSaving = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly draftCron = signal('');
  protected readonly words = computed(() =>
    cronInWords(this.schedule().cron) ?? `the times of "${this.schedule().cron}"`);
  protected readonly preview = computed(() =>
    cronInWords(this.draftCron()) ?? 'not one of the patterns read out in words');
  protected readonly nextRun = computed(() => {
    const { nextRunAt, timeZone } = this.schedule();
    return nextRunAt ? formatInZone(nextRunAt, timeZone) : null;
  });
  protected readonly form = new FormGroup({
    cron: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(/^\s*\S+(\s+\S+){4,5}\s*$/)],
    }),
    timeZone: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    isEnabled: new FormControl(true, { nonNullable: true }),
  });

  constructor() {
    this.form.controls.cron.valueChanges.subscribe((value) => this.draftCron.set(value));
  }

  protected edit(): void {
    const { cron, timeZone, isEnabled } = this.schedule();
    this.form.setValue({ cron, timeZone, isEnabled });
    this.error.set(null);
    this.isEditing.set(true);
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { cron, timeZone, isEnabled } = this.form.getRawValue();
    this.isSaving.set(true);
    this.error.set(null);
    this.api.saveSchedule({ cron: cron.trim(), timeZone: timeZone.trim(), isEnabled })
      .subscribe({
        next: (schedule) => {
          this.isSaving.set(false);
          this.isEditing.set(false);
          this.saved.emit(schedule);
        },
        error: (failure: unknown) => {
          this.isSaving.set(false);
          const message = apiErrorMessage(failure);
          if (!(failure instanceof HttpErrorResponse) || failure.status !== 400) {
            this.error.set(message);
            return;
          }
          // The server names the field it refused; a refused zone or expression goes under it.
          const field = /time ?zone/i.test(message) ? 'timeZone' : 'cron';
          const control = this.form.controls[field];
          control.setErrors({ ...control.errors, server: message });
          control.markAsTouched();
        },
      });
  }
}

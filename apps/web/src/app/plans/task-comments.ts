import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import type { TaskCommentDto } from '@keelson/contracts';
import { apiErrorMessage } from '../shared/api-error-message';
import { requiredTrimmed } from './plan-form';
import { PlansApi } from './plans-api';

/**
 * The comments of one task, oldest first, and a field to add one (for those who may: the server
 * decides, and its refusal is shown). Emits `commented` after a comment is saved.
 */
@Component({
  selector: 'kl-task-comments',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatButton,
    MatError,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
    ReactiveFormsModule,
  ],
  template: `
    @if (isLoading()) {
      <mat-progress-bar mode="indeterminate" aria-label="Loading the comments" />
    }
    @if (errorMessage(); as message) {
      <div class="kl-error-banner" role="alert">
        <mat-icon aria-hidden="true">error</mat-icon>
        <span>{{ message }}</span>
      </div>
    }
    @if (!isLoading() && comments().length === 0) {
      <p class="kl-muted">No comments yet.</p>
    }
    <ol class="comments__list" [attr.aria-label]="'Comments on ' + taskTitle()">
      @for (comment of comments(); track comment.id) {
        <li>
          <span class="comments__meta">
            {{ comment.user?.name ?? 'Unknown' }} · {{ comment.createdAt | date: 'medium' }}
          </span>
          <p>{{ comment.text }}</p>
        </li>
      }
    </ol>
    <form [formGroup]="form" (ngSubmit)="send()" class="comments__form" novalidate>
      <mat-form-field appearance="outline" subscriptSizing="dynamic">
        <mat-label>Add a comment</mat-label>
        <textarea matInput formControlName="text" rows="2"></textarea>
        @if (form.controls.text.hasError('required')) {
          <mat-error>Write a comment first.</mat-error>
        } @else if (form.controls.text.hasError('maxlength')) {
          <mat-error>A comment has at most 5000 characters.</mat-error>
        }
      </mat-form-field>
      <button matButton="outlined" type="submit" [disabled]="isSending()">Comment</button>
    </form>
  `,
  styles: `
    :host {
      display: block;
      padding: 8px 0;
    }
    .comments__list {
      margin: 0 0 8px;
      padding: 0;
      list-style: none;
      li {
        padding: 4px 0;
      }
      p {
        margin: 2px 0 0;
        white-space: pre-wrap;
      }
    }
    .comments__meta {
      font: var(--mat-sys-label-small);
      color: var(--mat-sys-on-surface-variant);
    }
    .comments__form {
      display: flex;
      align-items: flex-start;
      gap: 8px;
      mat-form-field {
        flex: 1 1 auto;
      }
      button {
        margin-top: 8px;
      }
    }
  `,
})
export class TaskComments {
  /** The task whose comments these are. */
  readonly taskId = input.required<number>();
  /** The task's title, for accessible names. */
  readonly taskTitle = input.required<string>();
  /** After a comment was saved. */
  readonly commented = output<TaskCommentDto>();

  private readonly plansApi = inject(PlansApi);

  protected readonly comments = signal<TaskCommentDto[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly isSending = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    text: ['', [requiredTrimmed, Validators.maxLength(5000)]],
  });

  constructor() {
    effect(() => {
      const id = this.taskId();
      untracked(() => this.load(id));
    });
  }

  protected send(): void {
    if (this.isSending()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSending.set(true);
    this.errorMessage.set(null);
    this.plansApi.comment(this.taskId(), { text: this.form.getRawValue().text.trim() }).subscribe({
      next: (comment) => {
        this.isSending.set(false);
        this.comments.update((list) => [...list, comment]);
        this.form.reset();
        this.commented.emit(comment);
      },
      error: (error: unknown) => {
        this.isSending.set(false);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }

  private load(id: number): void {
    this.isLoading.set(true);
    this.plansApi.task(id).subscribe({
      next: (task) => {
        this.comments.set(task.comments);
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

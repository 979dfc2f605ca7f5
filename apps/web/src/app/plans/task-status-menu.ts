import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { TASK_STATUSES, TASK_STATUS_LABELS, type TaskStatus } from '@keelson/contracts';

/** A task's status as a button; its menu offers the other statuses. */
@Component({
  selector: 'kl-task-status-menu',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButton, MatIcon, MatMenu, MatMenuItem, MatMenuTrigger],
  template: `
    <button matButton type="button" [matMenuTriggerFor]="menu" [disabled]="disabled()"
      [attr.aria-label]="'Status of ' + taskTitle() + ': ' + labels[status()] + '. Change it'">
      {{ labels[status()] }}
      <mat-icon iconPositionEnd>arrow_drop_down</mat-icon>
    </button>
    <mat-menu #menu="matMenu">
      @for (option of statuses; track option) {
        @if (option !== status()) {
          <button mat-menu-item type="button" (click)="changed.emit(option)">
            {{ labels[option] }}
          </button>
        }
      }
    </mat-menu>
  `,
})
export class TaskStatusMenu {
  /** The task's status now. */
  readonly status = input.required<TaskStatus>();
  /** The task's title, for the button's accessible name. */
  readonly taskTitle = input.required<string>();
  /** True while a change is being saved. */
  readonly disabled = input(false);
  /** The status chosen from the menu. */
  readonly changed = output<TaskStatus>();

  protected readonly statuses = TASK_STATUSES;
  protected readonly labels = TASK_STATUS_LABELS;
}

import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { PLAN_STATUS_LABELS, type PlanStatus } from '@keelson/contracts';

/** Where a mitigation plan stands (draft, waiting for approval, approved ...), as a chip. */
@Component({
  selector: 'kl-plan-status-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[attr.data-status]': 'status()', class: 'kl-plan-status-chip' },
  template: `{{ label() }}`,
  styles: `
    :host {
      display: inline-block;
      padding: 2px 10px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-full);
      font: var(--mat-sys-label-medium);
      white-space: nowrap;
      background: var(--mat-sys-surface-container-highest);
      color: var(--mat-sys-on-surface);
    }
    :host([data-status='submitted']) {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    :host([data-status='approved']),
    :host([data-status='in_progress']) {
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
    }
    :host([data-status='rejected']) {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    :host([data-status='done']),
    :host([data-status='withdrawn']) {
      color: var(--mat-sys-on-surface-variant);
      border-style: dashed;
    }
  `,
})
export class PlanStatusChip {
  /** The plan's status. */
  readonly status = input.required<PlanStatus>();

  protected readonly label = computed(() => PLAN_STATUS_LABELS[this.status()]);
}

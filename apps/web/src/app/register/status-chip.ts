import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { RegisterStatus } from '@keelson/contracts';
import { STATUS_LABELS } from './register-labels';

/** Where a register entry stands (open, mitigating, accepted, closed), as a chip. */
@Component({
  selector: 'kl-status-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[attr.data-status]': 'status()' },
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
    :host([data-status='open']) {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    :host([data-status='mitigating']) {
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
    }
    :host([data-status='closed']) {
      color: var(--mat-sys-on-surface-variant);
      border-style: dashed;
    }
  `,
})
export class StatusChip {
  /** The entry's status. */
  readonly status = input.required<RegisterStatus>();

  protected readonly label = computed(() => STATUS_LABELS[this.status()]);
}

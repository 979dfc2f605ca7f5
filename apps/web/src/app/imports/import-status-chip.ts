import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ImportStatus } from '@keelson/contracts';
import { IMPORT_STATUS_LABELS } from './import-status';

/** A batch status as a small coloured chip with its label. */
@Component({
  selector: 'kl-import-status-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<span class="chip chip--{{ modifier() }}">{{ label() }}</span>`,
  styles: `
    .chip {
      display: inline-block;
      padding: 2px 10px;
      border-radius: var(--mat-sys-corner-full);
      font: var(--mat-sys-label-medium);
      white-space: nowrap;
    }
    .chip--ready {
      background: var(--kl-rating-low-container);
      color: var(--kl-rating-on-low-container);
    }
    .chip--needs-mapping {
      background: var(--kl-rating-medium-container);
      color: var(--kl-rating-on-medium-container);
    }
    .chip--rejected {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .chip--committed {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
  `,
})
export class ImportStatusChip {
  /** The status shown. */
  readonly status = input.required<ImportStatus>();

  protected readonly label = computed(() => IMPORT_STATUS_LABELS[this.status()]);
  protected readonly modifier = computed(() => this.status().replace('_', '-'));
}

import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { type ImportBatchDto, SHEET_NAMES } from '@keelson/contracts';
import { REQUIRED_SHEETS } from '@keelson/workbook/fields';
import { IMPORT_STATUS_HINTS, UNREADABLE_FILE_HINT } from './import-status';
import { ImportsApi } from './imports-api';
import { ProblemsTable } from './problems-table';

/** One line of the counts table: a template sheet and the data rows read from it. */
interface SheetCountLine {
  sheet: string;
  rows: number | null;
  isRequired: boolean;
}

/**
 * The check step: what the server read of the file (rows per template sheet, errors and
 * warnings), the problems table, the error report, and the ways on: a corrected file, another
 * mapping, or the commit.
 */
@Component({
  selector: 'kl-check-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButton, MatIcon, ProblemsTable],
  templateUrl: './check-step.html',
  styleUrl: './check-step.scss',
})
export class CheckStep {
  private readonly importsApi = inject(ImportsApi);

  /** The checked batch. */
  readonly batch = input.required<ImportBatchDto>();
  /** "Upload a corrected file". */
  readonly uploadAgain = output<void>();
  /** "Change the mapping". */
  readonly changeMapping = output<void>();
  /** "Continue to commit". */
  readonly proceed = output<void>();

  /** False when the file could not be read at all, so there is nothing to map. */
  protected readonly isReadable = computed(() => this.batch().format !== null);
  protected readonly hint = computed(() =>
    this.isReadable() ? IMPORT_STATUS_HINTS[this.batch().status] : UNREADABLE_FILE_HINT,
  );
  protected readonly errorReportUrl = computed(() =>
    this.importsApi.errorReportUrl(this.batch().id),
  );
  protected readonly counts = computed<SheetCountLine[]>(() => {
    const counts = this.batch().counts;
    return SHEET_NAMES.map((sheet) => ({
      sheet,
      rows: counts[sheet] ?? null,
      isRequired: REQUIRED_SHEETS.includes(sheet),
    }));
  });
  protected readonly problemCount = computed(
    () => this.batch().errorCount + this.batch().warningCount,
  );
}

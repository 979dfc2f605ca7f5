import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import {
  INVALID_WORKBOOK,
  type ImportBatchDto,
  type ImportCommitDto,
  type NetworkChangesDto,
} from '@keelson/contracts';
import { apiErrorCode, apiErrorMessage } from '../shared/api-error-message';
import { ImportsApi } from './imports-api';

/** One line of the changes list: what changed, how many, and (for named rows) which. */
export interface ChangeLine {
  label: string;
  count: number;
  /** The codes, when the change names them (sourcing rows are counted only). */
  codes: string[];
}

/** How many codes a change line names before it says "and N more". */
export const NAMED_CODE_LIMIT = 12;

/** The changes of a commit as lines for the result, in a fixed order. */
export function changeLines(changes: NetworkChangesDto): ChangeLine[] {
  const named = (label: string, codes: string[]): ChangeLine => ({
    label,
    count: codes.length,
    codes,
  });
  const counted = (label: string, count: number): ChangeLine => ({ label, count, codes: [] });
  return [
    named('Suppliers added', changes.suppliersAdded),
    named('Suppliers removed', changes.suppliersRemoved),
    named('Suppliers changed', changes.suppliersChanged),
    counted('Sourcing rows added', changes.sourcingAdded),
    counted('Sourcing rows removed', changes.sourcingRemoved),
    counted('Sourcing rows changed', changes.sourcingChanged),
    named('Products added', changes.productsAdded),
    named('Products removed', changes.productsRemoved),
    named('Products changed', changes.productsChanged),
  ];
}

/** The message for a refused commit, in the buyer's terms. */
export function commitErrorMessage(error: unknown): string {
  if (apiErrorCode(error) === INVALID_WORKBOOK) {
    return (
      'The file has errors, so nothing was written. ' +
      `${apiErrorMessage(error)} Correct the file and upload it again.`
    );
  }
  return apiErrorMessage(error);
}

/**
 * The commit step: one button that turns a ready batch into a new network version, and then
 * what changed against the previous version, with the way to the network browser.
 */
@Component({
  selector: 'kl-commit-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButton, MatIcon, MatProgressBar, RouterLink],
  templateUrl: './commit-step.html',
  styleUrl: './commit-step.scss',
})
export class CommitStep {
  private readonly importsApi = inject(ImportsApi);

  /** The batch to commit (or already committed). */
  readonly batch = input.required<ImportBatchDto>();
  /** The commit's answer, after it succeeded. */
  readonly committed = output<ImportCommitDto>();

  protected readonly namedCodeLimit = NAMED_CODE_LIMIT;
  protected readonly result = signal<ImportCommitDto | null>(null);
  protected readonly isCommitting = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly canCommit = computed(
    () => this.batch().status === 'ready' && !this.isCommitting() && this.result() === null,
  );
  protected readonly lines = computed(() => {
    const result = this.result();
    return result ? changeLines(result.changes) : [];
  });
  protected readonly hasChanges = computed(() => this.lines().some((line) => line.count > 0));

  protected commit(): void {
    if (!this.canCommit()) {
      return;
    }
    this.isCommitting.set(true);
    this.errorMessage.set(null);
    this.importsApi.commit(this.batch().id).subscribe({
      next: (result) => {
        this.isCommitting.set(false);
        this.result.set(result);
        this.committed.emit(result);
      },
      error: (error: unknown) => {
        this.isCommitting.set(false);
        this.errorMessage.set(commitErrorMessage(error));
      },
    });
  }
}

import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { ImportBatchDto, ImportCommitDto } from '@keelson/contracts';
import { type Subscription, catchError, map, of } from 'rxjs';
import { toSignal } from '@angular/core/rxjs-interop';
import { apiErrorMessage } from '../shared/api-error-message';
import { CheckStep } from './check-step';
import { CommitStep } from './commit-step';
import { DEFAULT_UPLOAD_LIMIT_BYTES, formatFileSize } from './file-size';
import { ImportStatusChip } from './import-status-chip';
import { ImportsApi } from './imports-api';
import { MappingStep } from './mapping-step';
import { UploadStep } from './upload-step';

/** The steps of an import, in order. */
export const IMPORT_STEPS = [
  { key: 'upload', label: 'Upload' },
  { key: 'mapping', label: 'Map columns' },
  { key: 'check', label: 'Check' },
  { key: 'commit', label: 'Commit' },
] as const;

/** One of the import's steps. */
export type ImportStepKey = (typeof IMPORT_STEPS)[number]['key'];

/**
 * The buyer's import: upload a file, map its sheets and columns when they are not the
 * template's, check it, and commit it as a new network version, one step at a time. Opened
 * with a batch id (`/imports/:batchId`), it starts at that batch's check step.
 */
@Component({
  selector: 'kl-import-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CheckStep,
    CommitStep,
    ImportStatusChip,
    MappingStep,
    MatButton,
    MatIcon,
    MatProgressBar,
    RouterLink,
    UploadStep,
  ],
  templateUrl: './import-page.html',
  styleUrl: './import-page.scss',
})
export class ImportPage {
  private readonly importsApi = inject(ImportsApi);
  private readonly injector = inject(Injector);
  private readonly router = inject(Router);
  private readonly stepHeading = viewChild<ElementRef<HTMLElement>>('stepHeading');
  private loading: Subscription | null = null;

  /** The batch to open, from the route parameter (absent for a new import). */
  readonly batchId = input<string>();

  protected readonly steps = IMPORT_STEPS;
  protected readonly step = signal<ImportStepKey>('upload');
  protected readonly batch = signal<ImportBatchDto | null>(null);
  protected readonly isLoading = signal(false);
  protected readonly isApplyingMapping = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly isOfferDismissed = signal(false);
  protected readonly stepIndex = computed(() =>
    IMPORT_STEPS.findIndex((candidate) => candidate.key === this.step()),
  );
  protected readonly stepLabel = computed(() => IMPORT_STEPS[this.stepIndex()]!.label);
  protected readonly mappingOffer = computed(() => {
    const batch = this.batch();
    if (!batch?.suggestedMapping || batch.mapping !== null || this.isOfferDismissed()) {
      return null;
    }
    return batch.status === 'committed' ? null : batch.suggestedMapping;
  });
  protected readonly formatFileSize = formatFileSize;
  /** The server's upload limit; the usual default until (or unless) the server says. */
  protected readonly uploadLimitBytes = toSignal(
    this.importsApi.limits().pipe(
      map((limits) => limits.uploadMaxBytes),
      catchError(() => of(DEFAULT_UPLOAD_LIMIT_BYTES)),
    ),
    { initialValue: DEFAULT_UPLOAD_LIMIT_BYTES },
  );

  constructor() {
    effect(() => {
      const id = Number(this.batchId());
      if (Number.isInteger(id) && id > 0) {
        untracked(() => this.open(id));
      }
    });
  }

  /** True when the step header lets the buyer go to `key` now. */
  protected isReachable(key: ImportStepKey): boolean {
    const batch = this.batch();
    if (key === 'upload') {
      return true;
    }
    if (!batch) {
      return false;
    }
    // Nothing to map in a committed batch, or in a file that is not a spreadsheet at all.
    return key !== 'mapping' || (batch.status !== 'committed' && batch.format !== null);
  }

  protected goTo(key: ImportStepKey): void {
    if (!this.isReachable(key)) {
      return;
    }
    this.step.set(key);
    this.errorMessage.set(null);
    // Keyboard and screen-reader users land on the new step, not at the top of the page.
    afterNextRender(() => this.stepHeading()?.nativeElement.focus(), {
      injector: this.injector,
    });
  }

  protected onBatch(batch: ImportBatchDto): void {
    this.batch.set(batch);
    this.isOfferDismissed.set(false);
    this.goTo(batch.status === 'needs_mapping' ? 'mapping' : 'check');
  }

  protected onCommitted(result: ImportCommitDto): void {
    const batch = this.batch();
    if (batch && batch.id === result.id) {
      this.batch.set({
        ...batch,
        status: 'committed',
        networkVersionId: result.networkVersionId,
        committedAt: new Date().toISOString(),
      });
    }
  }

  protected startOver(): void {
    if (this.batchId()) {
      // Opened from the history: a new import lives at /imports, not at this batch's address.
      void this.router.navigateByUrl('/imports');
      return;
    }
    this.batch.set(null);
    this.goTo('upload');
  }

  protected useSuggestedMapping(): void {
    const batch = this.batch();
    const offer = this.mappingOffer();
    if (!batch || !offer || this.isApplyingMapping()) {
      return;
    }
    this.isApplyingMapping.set(true);
    this.errorMessage.set(null);
    this.importsApi.check(batch.id, { mappingId: offer.id }).subscribe({
      next: (checked) => {
        this.isApplyingMapping.set(false);
        this.onBatch(checked);
      },
      error: (error: unknown) => {
        this.isApplyingMapping.set(false);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }

  private open(id: number): void {
    this.loading?.unsubscribe();
    this.isLoading.set(true);
    this.errorMessage.set(null);
    this.loading = this.importsApi.get(id).subscribe({
      next: (batch) => {
        this.isLoading.set(false);
        this.batch.set(batch);
        this.goTo(batch.status === 'committed' ? 'commit' : 'check');
      },
      error: (error: unknown) => {
        this.isLoading.set(false);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }
}

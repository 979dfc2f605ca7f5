import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  computed,
  inject,
  input,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { FILE_TOO_LARGE, type ImportBatchDto } from '@keelson/contracts';
import type { Subscription } from 'rxjs';
import { apiErrorCode, apiErrorMessage, isApiErrorBody } from '../shared/api-error-message';
import {
  ACCEPTED_EXTENSIONS,
  DEFAULT_UPLOAD_LIMIT_BYTES,
  formatFileSize,
  isAcceptedFileName,
} from './file-size';
import { ImportsApi } from './imports-api';

/** Shown when an upload never reaches the server (offline, connection dropped). */
export const UPLOAD_UNREACHABLE_MESSAGE =
  'The upload did not reach the server. Check your connection and try again.';

/** The limit a 413 answer names in `details.limitBytes`, if it names one. */
function answeredLimit(error: HttpErrorResponse): number | null {
  if (!isApiErrorBody(error.error)) {
    return null;
  }
  const details = error.error.error.details as { limitBytes?: unknown } | undefined;
  return typeof details?.limitBytes === 'number' ? details.limitBytes : null;
}

/**
 * The message for a failed upload of `file`, in the buyer's terms. A 413 names the server's
 * limit when the answer carries it, otherwise the limit this screen states.
 */
export function uploadErrorMessage(error: unknown, file: File, limitBytes: number): string {
  if (
    error instanceof HttpErrorResponse &&
    (error.status === 413 || apiErrorCode(error) === FILE_TOO_LARGE)
  ) {
    const limit = answeredLimit(error);
    const limitText =
      limit === null
        ? `${formatFileSize(limitBytes)} unless your administrator set another limit`
        : formatFileSize(limit);
    return (
      `${file.name} (${formatFileSize(file.size)}) is larger than the server accepts ` +
      `(${limitText}). Remove sheets or rows Keelson does not need, or send a zip of ` +
      'CSV files, and try again.'
    );
  }
  if (error instanceof HttpErrorResponse && error.status === 0) {
    return UPLOAD_UNREACHABLE_MESSAGE;
  }
  return apiErrorMessage(error);
}

/**
 * The upload step: a drop zone that is also a keyboard-operable button opening the file
 * picker, a progress bar while the file travels, and the link to the empty template. Emits the
 * batch the server made of the file.
 */
@Component({
  selector: 'kl-upload-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButton, MatIcon, MatProgressBar],
  templateUrl: './upload-step.html',
  styleUrl: './upload-step.scss',
})
export class UploadStep {
  private readonly importsApi = inject(ImportsApi);
  private readonly picker = viewChild.required<ElementRef<HTMLInputElement>>('picker');
  private upload: Subscription | null = null;

  /** The server's upload limit as this screen states it. */
  readonly limitBytes = input(DEFAULT_UPLOAD_LIMIT_BYTES);
  /** The batch the server made of an uploaded file. */
  readonly uploaded = output<ImportBatchDto>();

  protected readonly accept = ACCEPTED_EXTENSIONS.join(',');
  protected readonly templateUrl = this.importsApi.templateUrl();
  protected readonly limitLabel = computed(() => formatFileSize(this.limitBytes()));
  protected readonly file = signal<File | null>(null);
  protected readonly isDragging = signal(false);
  protected readonly isUploading = signal(false);
  protected readonly sentBytes = signal(0);
  protected readonly totalBytes = signal<number | null>(null);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly percent = computed(() => {
    const total = this.totalBytes();
    return total ? Math.min(100, Math.round((this.sentBytes() / total) * 100)) : 0;
  });

  constructor() {
    inject(DestroyRef).onDestroy(() => this.upload?.unsubscribe());
  }

  protected openPicker(event?: Event): void {
    event?.preventDefault();
    if (!this.isUploading()) {
      this.picker().nativeElement.click();
    }
  }

  protected onPicked(event: Event): void {
    const picker = event.target as HTMLInputElement;
    const file = picker.files?.item(0);
    // Cleared so that picking the same (corrected) file again fires a change.
    picker.value = '';
    if (file) {
      this.start(file);
    }
  }

  protected onDragOver(event: DragEvent): void {
    event.preventDefault();
    if (event.dataTransfer) {
      event.dataTransfer.dropEffect = 'copy';
    }
    this.isDragging.set(true);
  }

  protected onDragLeave(): void {
    this.isDragging.set(false);
  }

  protected onDrop(event: DragEvent): void {
    event.preventDefault();
    this.isDragging.set(false);
    const file = event.dataTransfer?.files.item(0);
    if (file && !this.isUploading()) {
      this.start(file);
    }
  }

  protected cancel(): void {
    this.upload?.unsubscribe();
    this.upload = null;
    this.isUploading.set(false);
    this.errorMessage.set('Upload cancelled. Nothing was kept of the file.');
  }

  /** Sends `file` to the server (public so the page can hand over a dropped file). */
  start(file: File): void {
    this.file.set(file);
    this.errorMessage.set(null);
    if (!isAcceptedFileName(file.name)) {
      this.errorMessage.set(
        `${file.name} is not a file Keelson reads. Choose an Excel workbook (.xlsx), ` +
          'a CSV file (.csv) or a zip of CSV files (.zip).',
      );
      return;
    }
    this.upload?.unsubscribe();
    this.isUploading.set(true);
    this.sentBytes.set(0);
    this.totalBytes.set(file.size || null);
    this.upload = this.importsApi.upload(file).subscribe({
      next: (state) => {
        if (state.kind === 'progress') {
          this.sentBytes.set(state.loaded);
          this.totalBytes.set(state.total ?? (file.size || null));
          return;
        }
        this.isUploading.set(false);
        this.uploaded.emit(state.batch);
      },
      error: (error: unknown) => {
        this.isUploading.set(false);
        this.errorMessage.set(uploadErrorMessage(error, file, this.limitBytes()));
      },
    });
  }

  protected readonly formatFileSize = formatFileSize;
}

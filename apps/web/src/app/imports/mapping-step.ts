import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import {
  type ImportBatchDto,
  type ImportMappingDto,
  SHEET_NAMES,
  type SheetName,
  type WorkbookInspection,
} from '@keelson/contracts';
import { type Subscription, catchError, of } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { ImportMappingsApi } from './import-mappings-api';
import { ImportsApi } from './imports-api';
import {
  type MappingDraft,
  draftFromInspection,
  missingFields,
  toWorkbookMapping,
  withColumn,
  withFileSheet,
  withSheet,
} from './mapping-draft';
import { type ColumnChoice, SheetMappingCard } from './sheet-mapping-card';

/**
 * The mapping step: one card per template sheet, filled from the inspection's suggestions (or a
 * saved mapping), "Check with this mapping" and "Save mapping as...". Emits the batch as the
 * check with the mapping left it.
 */
@Component({
  selector: 'kl-mapping-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButton, MatFormField, MatIcon, MatInput, MatLabel, MatProgressBar, SheetMappingCard],
  templateUrl: './mapping-step.html',
  styleUrl: './mapping-step.scss',
})
export class MappingStep {
  private readonly importsApi = inject(ImportsApi);
  private readonly mappingsApi = inject(ImportMappingsApi);
  private loading: Subscription | null = null;

  /** The batch whose file is mapped. */
  readonly batch = input.required<ImportBatchDto>();
  /** The batch after "Check with this mapping". */
  readonly checked = output<ImportBatchDto>();

  protected readonly sheets = SHEET_NAMES;
  protected readonly inspection = signal<WorkbookInspection | null>(null);
  protected readonly draft = signal<MappingDraft | null>(null);
  protected readonly savedMappings = signal<ImportMappingDto[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly isChecking = signal(false);
  protected readonly isSaving = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly savedMessage = signal<string | null>(null);
  protected readonly mappingName = signal('');
  protected readonly chosenSaved = signal<ImportMappingDto | null>(null);
  protected readonly missingCount = computed(() => {
    const draft = this.draft();
    if (!draft) {
      return 0;
    }
    return SHEET_NAMES.reduce((sum, sheet) => {
      const hasSheet = draft[sheet].sheetName !== null;
      return sum + (hasSheet ? missingFields(draft, sheet).length : 0);
    }, 0);
  });

  constructor() {
    effect(() => {
      const batch = this.batch();
      untracked(() => this.load(batch, undefined));
    });
    this.mappingsApi
      .list()
      .pipe(catchError(() => of([] as ImportMappingDto[])))
      .subscribe((mappings) => this.savedMappings.set(mappings));
    inject(DestroyRef).onDestroy(() => this.loading?.unsubscribe());
  }

  protected onSavedMapping(event: Event): void {
    const id = Number((event.target as HTMLSelectElement).value);
    const saved = this.savedMappings().find((mapping) => mapping.id === id) ?? null;
    this.chosenSaved.set(saved);
    this.load(this.batch(), saved?.id);
  }

  protected removeSaved(): void {
    const saved = this.chosenSaved();
    if (!saved) {
      return;
    }
    this.errorMessage.set(null);
    this.mappingsApi.remove(saved.id).subscribe({
      next: () => {
        this.savedMappings.update((list) => list.filter((mapping) => mapping.id !== saved.id));
        this.chosenSaved.set(null);
        this.savedMessage.set(`Deleted the saved mapping "${saved.name}".`);
        this.load(this.batch(), undefined);
      },
      error: (error: unknown) => this.errorMessage.set(apiErrorMessage(error)),
    });
  }

  protected onFileSheet(sheet: SheetName, sheetName: string | null): void {
    const inspection = this.inspection();
    this.draft.update((draft) =>
      draft && inspection ? withFileSheet(draft, sheet, sheetName, inspection) : draft,
    );
  }

  protected onHeaderRow(sheet: SheetName, headerRow: number | null): void {
    this.draft.update((draft) => (draft ? withSheet(draft, sheet, { headerRow }) : draft));
  }

  protected onColumn(sheet: SheetName, choice: ColumnChoice): void {
    this.draft.update((draft) =>
      draft ? withColumn(draft, sheet, choice.field, choice.header) : draft,
    );
  }

  protected onNameInput(event: Event): void {
    this.mappingName.set((event.target as HTMLInputElement).value);
  }

  protected check(): void {
    const draft = this.draft();
    if (!draft || this.isChecking()) {
      return;
    }
    this.isChecking.set(true);
    this.errorMessage.set(null);
    this.importsApi.check(this.batch().id, { mapping: toWorkbookMapping(draft) }).subscribe({
      next: (batch) => {
        this.isChecking.set(false);
        this.checked.emit(batch);
      },
      error: (error: unknown) => {
        this.isChecking.set(false);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }

  protected save(event: Event): void {
    event.preventDefault();
    const draft = this.draft();
    const name = this.mappingName().trim();
    if (!draft || this.isSaving()) {
      return;
    }
    if (!name) {
      this.errorMessage.set('Give the mapping a name before saving it.');
      return;
    }
    this.isSaving.set(true);
    this.errorMessage.set(null);
    this.savedMessage.set(null);
    const input = { name, batchId: this.batch().id, mapping: toWorkbookMapping(draft) };
    this.mappingsApi.save(input).subscribe({
      next: (saved) => {
        this.isSaving.set(false);
        this.savedMappings.update((list) => [saved, ...list.filter((m) => m.id !== saved.id)]);
        this.savedMessage.set(
          `Saved as "${saved.name}". Files with the same sheets and headers will offer it.`,
        );
      },
      error: (error: unknown) => {
        this.isSaving.set(false);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }

  private load(batch: ImportBatchDto, mappingId: number | undefined): void {
    this.loading?.unsubscribe();
    this.isLoading.set(true);
    this.errorMessage.set(null);
    this.loading = this.importsApi.inspection(batch.id, mappingId).subscribe({
      next: (inspection) => {
        this.isLoading.set(false);
        this.inspection.set(inspection);
        // A saved mapping is already laid into the suggestions by the server.
        this.draft.set(
          draftFromInspection(inspection, mappingId === undefined ? batch.mapping : null),
        );
      },
      error: (error: unknown) => {
        this.isLoading.set(false);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }
}

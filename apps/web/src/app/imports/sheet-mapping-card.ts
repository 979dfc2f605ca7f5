import {
  ChangeDetectionStrategy,
  Component,
  computed,
  input,
  output,
  signal,
} from '@angular/core';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import type { InspectedSheet, SheetName, WorkbookInspection } from '@keelson/contracts';
import { REQUIRED_SHEETS, SHEET_HELP, TEMPLATE_FIELDS } from '@keelson/workbook/fields';
import type { SheetMappingDraft } from './mapping-draft';

/** A change of one field's header on a sheet card. */
export interface ColumnChoice {
  field: string;
  /** The file's header, or '' for "not mapped". */
  header: string;
}

/** How many sample rows the preview shows (the inspection sends at most this many). */
export const SAMPLE_ROW_LIMIT = 5;

/**
 * One template sheet on the mapping step: which sheet of the file holds it, its header row,
 * and a header for every field (required ones marked, missing ones flagged), beside a preview
 * of the chosen sheet's headers and first rows.
 */
@Component({
  selector: 'kl-sheet-mapping-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButton, MatFormField, MatHint, MatIcon, MatInput, MatLabel],
  templateUrl: './sheet-mapping-card.html',
  styleUrl: './sheet-mapping-card.scss',
})
export class SheetMappingCard {
  /** The template sheet this card maps. */
  readonly sheet = input.required<SheetName>();
  /** The choices so far for this sheet. */
  readonly entry = input.required<SheetMappingDraft>();
  /** What the file holds. */
  readonly inspection = input.required<WorkbookInspection>();

  /** The buyer chose another sheet of the file (null: none). */
  readonly fileSheetChange = output<string | null>();
  /** The buyer typed another header row (null: left blank). */
  readonly headerRowChange = output<number | null>();
  /** The buyer chose a header for a field. */
  readonly columnChange = output<ColumnChoice>();

  protected readonly isRequired = computed(() => REQUIRED_SHEETS.includes(this.sheet()));
  protected readonly help = computed(() => SHEET_HELP[this.sheet()]);
  protected readonly fields = computed(() => TEMPLATE_FIELDS[this.sheet()]);
  protected readonly fileSheet = computed<InspectedSheet | null>(
    () => this.inspection().sheets.find((sheet) => sheet.name === this.entry().sheetName) ?? null,
  );
  /** The preview of the header row chosen now (the file's guess, or the one the buyer typed). */
  protected readonly preview = computed(() => previewOf(this.fileSheet(), this.entry().headerRow));
  protected readonly headers = computed(() =>
    (this.preview()?.headers ?? []).filter((header) => header.trim() !== ''),
  );
  protected readonly sampleRows = computed(() =>
    (this.preview()?.sampleRows ?? []).slice(0, SAMPLE_ROW_LIMIT),
  );
  protected readonly missing = computed(() => {
    const columns = this.entry().columns;
    return new Set(
      this.fields()
        .filter((field) => field.required && !columns[field.field])
        .map((field) => field.field),
    );
  });
  protected readonly isSheetMissing = computed(
    () => this.isRequired() && this.entry().sheetName === null,
  );
  protected readonly idPrefix = computed(() => `map-${this.sheet().toLowerCase()}`);
  /**
   * Whether the file's suggestion for this sheet needs a look: another sheet name, headers
   * under other names, or required fields missing. Such cards open; the rest start closed.
   */
  protected readonly needsLook = computed(() => {
    const suggestion = this.inspection().suggestions[this.sheet()];
    if (!suggestion || suggestion.sheetName === null) {
      return this.isRequired();
    }
    const renamed = Object.entries(suggestion.columns).some(
      ([field, header]) => field !== header,
    );
    return suggestion.sheetName !== this.sheet() || renamed || suggestion.missingColumns.length > 0;
  });
  private readonly openChoice = signal<boolean | null>(null);
  protected readonly isOpen = computed(() => this.openChoice() ?? this.needsLook());
  protected readonly mappedCount = computed(() => Object.keys(this.entry().columns).length);

  protected toggle(): void {
    this.openChoice.set(!this.isOpen());
  }

  protected onFileSheet(event: Event): void {
    const value = (event.target as HTMLSelectElement).value;
    this.fileSheetChange.emit(value === '' ? null : value);
  }

  protected onHeaderRow(event: Event): void {
    const text = (event.target as HTMLInputElement).value.trim();
    const row = Number(text);
    this.headerRowChange.emit(text !== '' && Number.isInteger(row) && row >= 1 ? row : null);
  }

  protected onColumn(field: string, event: Event): void {
    this.columnChange.emit({ field, header: (event.target as HTMLSelectElement).value });
  }

  protected cellText(value: string | number | boolean | null): string {
    if (value === null) {
      return '';
    }
    if (typeof value === 'boolean') {
      return value ? 'yes' : 'no';
    }
    return String(value);
  }
}

/** What the card previews of a file sheet for a header row. */
export interface SheetPreview {
  name: string;
  headerRow: number | null;
  headers: string[];
  sampleRows: (string | number | boolean | null)[][];
  /** True when the header row lies below the rows the inspection sent (the check still reads it). */
  isBeyondPreview: boolean;
}

/**
 * The preview of `sheet` with its headers in `headerRow`: the inspection's own headers and
 * samples for the row it guessed, else the row and the rows below it from the sheet's first
 * rows. A row past those gives no headers and says so.
 */
export function previewOf(sheet: InspectedSheet | null, headerRow: number | null):
  SheetPreview | null {
  if (!sheet) {
    return null;
  }
  const base = { name: sheet.name, isBeyondPreview: false };
  if (headerRow === null || headerRow === sheet.headerRow) {
    return { ...base, headerRow: sheet.headerRow, headers: sheet.headers,
      sampleRows: sheet.sampleRows };
  }
  const index = sheet.topRows.findIndex((row) => row.row >= headerRow);
  const chosen = index === -1 ? undefined : sheet.topRows[index];
  if (!chosen) {
    // Past the rows sent: the sheet goes on below them, or it ends before this row.
    const isBeyondPreview = sheet.rowCount > sheet.topRows.length;
    return { ...base, headerRow, headers: [], sampleRows: [], isBeyondPreview };
  }
  if (chosen.row !== headerRow) {
    // A blank row: no headers there.
    return { ...base, headerRow, headers: [], sampleRows: [] };
  }
  const below = sheet.topRows.slice(index + 1, index + 1 + SAMPLE_ROW_LIMIT);
  return { ...base, headerRow, headers: chosen.headers, sampleRows: below.map((row) => row.cells) };
}

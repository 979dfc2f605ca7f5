import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatOption } from '@angular/material/core';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatSelect } from '@angular/material/select';

/** One choice of a {@link FilterSelect}: the value it filters by and its words. */
export interface FilterOption {
  readonly value: string;
  readonly label: string;
}

/** Choices from codes and names: `P-NORTH · North works`. */
export function codeNameOptions(rows: readonly { code: string; name: string }[]):
  FilterOption[] {
  return rows.map((row) => ({ value: row.code, label: `${row.code} · ${row.name}` }));
}

/** Choices from values and a way to say each (the value itself unless given). */
export function valueOptions<T extends string | number>(values: readonly T[],
  label: (value: T) => string = String): FilterOption[] {
  return values.map((value) => ({ value: String(value), label: label(value) }));
}

/**
 * A table's filter as a select: `allLabel` (the empty value) first, then `options`; `value` is
 * the filter as it stands (undefined for none) and `changed` gives the chosen value, `''` for
 * "all". Renders the same form field every table's filters use, so labels find it.
 */
@Component({
  selector: 'kl-filter-select',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatFormField, MatLabel, MatOption, MatSelect],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>{{ label() }}</mat-label>
      <mat-select [value]="value() ?? ''" (selectionChange)="changed.emit($event.value)">
        <mat-option value="">{{ allLabel() }}</mat-option>
        @for (option of options(); track option.value) {
          <mat-option [value]="option.value">{{ option.label }}</mat-option>
        }
      </mat-select>
    </mat-form-field>
  `,
  // The form field stays a direct item of the filters' flex row.
  styles: `
    :host {
      display: contents;
    }
  `,
})
export class FilterSelect {
  readonly label = input.required<string>();
  readonly allLabel = input.required<string>();
  readonly options = input.required<readonly FilterOption[]>();
  readonly value = input<string | null | undefined>(undefined);
  readonly changed = output<string>();
}

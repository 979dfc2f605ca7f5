import { formatDate } from '@angular/common';
import type { NetworkChangesDto, NetworkVersionDto } from '@keelson/contracts';

/**
 * How a version is named in the picker: "Version 3 · Import 3: file.xlsx · 2 Dec 2026, 10:15",
 * the middle part being the label the import gave the version.
 */
export function versionLabel(version: NetworkVersionDto, locale = 'en-GB'): string {
  const date = formatDate(version.createdAt, 'd MMM y, HH:mm', locale);
  return `Version ${version.id} · ${version.label} · ${date}`;
}

/** One cell of "what changed": how many, and the first few codes where the API names them. */
export interface ChangeCell {
  readonly count: number;
  /** Up to {@link CHANGE_EXAMPLES} codes; empty for sourcing rows, which are only counted. */
  readonly codes: readonly string[];
  /** How many codes were left out of `codes`. */
  readonly more: number;
}

/** One line of "what changed" against the previous version. */
export interface ChangeLine {
  readonly label: string;
  readonly added: ChangeCell;
  readonly removed: ChangeCell;
  readonly changed: ChangeCell;
}

/** Codes shown in a change cell before "and N more". */
export const CHANGE_EXAMPLES = 5;

function named(codes: string[]): ChangeCell {
  return {
    count: codes.length,
    codes: codes.slice(0, CHANGE_EXAMPLES),
    more: Math.max(0, codes.length - CHANGE_EXAMPLES),
  };
}

function counted(count: number): ChangeCell {
  return { count, codes: [], more: 0 };
}

/** The changes of a version as lines for suppliers, sourcing rows and products. */
export function changeLines(changes: NetworkChangesDto): ChangeLine[] {
  return [
    {
      label: 'Suppliers',
      added: named(changes.suppliersAdded),
      removed: named(changes.suppliersRemoved),
      changed: named(changes.suppliersChanged),
    },
    {
      label: 'Sourcing rows',
      added: counted(changes.sourcingAdded),
      removed: counted(changes.sourcingRemoved),
      changed: counted(changes.sourcingChanged),
    },
    {
      label: 'Products',
      added: named(changes.productsAdded),
      removed: named(changes.productsRemoved),
      changed: named(changes.productsChanged),
    },
  ];
}

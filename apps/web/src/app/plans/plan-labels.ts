import type { PlanChange, PlanChangeKind, PlanStatus } from '@keelson/contracts';

/** What each kind of proposed network change is called on screen. */
export const PLAN_CHANGE_KIND_LABELS: Readonly<Record<PlanChangeKind, string>> = {
  add_source: 'Add a qualified source',
  raise_cover: 'Raise weeks of cover',
  set_recovery: 'Change time to recover',
};

/** The kinds of change in the order the editor offers them. */
export const PLAN_CHANGE_KINDS: readonly PlanChangeKind[] = [
  'add_source',
  'raise_cover',
  'set_recovery',
];

/** The roles that draft, edit and submit plans. */
export const PLAN_WRITERS = ['risk_manager', 'admin'] as const;

/** Statuses in which a plan's tasks are being worked on. */
export const ACTIVE_PLAN_STATUSES: readonly PlanStatus[] = ['approved', 'in_progress'];

/** One proposed change in a sentence ("S-2-ALT-B becomes a source of I-CAST for every buyer"). */
export function describeChange(change: PlanChange): string {
  switch (change.kind) {
    case 'add_source': {
      const buyer = change.buyerCode ?? 'every buyer it supplies today';
      return `${change.supplierCode} becomes a qualified source of ${change.itemCode} for ${buyer}`;
    }
    case 'raise_cover':
      return `${change.itemCode} at ${change.plantCode}: ${change.weeksOfCover} weeks of cover`;
    case 'set_recovery':
      return `${change.supplierCode} recovers in ${change.recoveryWeeks} weeks`;
  }
}

/** A date picker's value as YYYY-MM-DD in local time (what the API stores), or null. */
export function toIsoDate(value: Date | null | undefined): string | null {
  if (!value || Number.isNaN(value.getTime())) {
    return null;
  }
  const month = String(value.getMonth() + 1).padStart(2, '0');
  const day = String(value.getDate()).padStart(2, '0');
  return `${value.getFullYear()}-${month}-${day}`;
}

/** YYYY-MM-DD from the API as a local date for a date picker, or null. */
export function fromIsoDate(value: string | null | undefined): Date | null {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value ?? '');
  if (!match) {
    return null;
  }
  return new Date(Number(match[1]), Number(match[2]) - 1, Number(match[3]));
}

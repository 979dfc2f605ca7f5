import {
  RATING_BANDS,
  REGISTER_STATUSES,
  type RatingBand,
  type RegisterFlag,
  type RegisterStatus,
} from '@keelson/contracts';

/** What each status is called on screen. */
export const STATUS_LABELS: Readonly<Record<RegisterStatus, string>> = {
  open: 'Open',
  mitigating: 'Mitigating',
  accepted: 'Accepted',
  closed: 'Closed',
};

/** What each rating band is called on screen. */
export const BAND_LABELS: Readonly<Record<RatingBand, string>> = {
  low: 'Low',
  medium: 'Medium',
  high: 'High',
  critical: 'Critical',
};

/**
 * A shape per band, so a band reads without colour (a black-and-white print, colour blindness):
 * empty circle, half circle, full circle, triangle.
 */
export const BAND_MARKERS: Readonly<Record<RatingBand, string>> = {
  low: '○',
  medium: '◐',
  high: '●',
  critical: '▲',
};

/** The statuses in display order. */
export const STATUSES = REGISTER_STATUSES;
/** The bands in display order, lowest first. */
export const BANDS = RATING_BANDS;

/** True when `value` is one of the register statuses. */
export function isRegisterStatus(value: string | undefined): value is RegisterStatus {
  return (REGISTER_STATUSES as readonly string[]).includes(value ?? '');
}

/** The register's flag filter: one flag, or `flagged` for either. */
export type FlagFilter = RegisterFlag | 'flagged';

/** The flag filter's choices in words, in the order the filter offers them. */
export const FLAG_FILTER_LABELS: Readonly<Record<FlagFilter, string>> = {
  flagged: 'Any flag',
  supplier_removed: 'Supplier removed',
  no_longer_matters: 'No longer matters',
};

/** True when `value` is one of the flag filter's choices. */
export function isFlagFilter(value: string | undefined): value is FlagFilter {
  return Object.keys(FLAG_FILTER_LABELS).includes(value ?? '');
}

/** True when `value` is one of the rating bands. */
export function isRatingBand(value: string | undefined): value is RatingBand {
  return (RATING_BANDS as readonly string[]).includes(value ?? '');
}

/** The roles that create and edit register entries and override likelihoods. */
export const REGISTER_WRITERS = ['risk_manager', 'admin'] as const;

/** What each re-scoring flag is called on screen (a short chip). */
export const FLAG_LABELS: Readonly<Record<RegisterFlag, string>> = {
  supplier_removed: 'Supplier removed',
  no_longer_matters: 'No longer matters',
};

/**
 * What each flag means, for a tooltip or a banner: the re-scoring raised it, a person decides
 * what happens to the entry.
 */
export const FLAG_EXPLANATIONS: Readonly<Record<RegisterFlag, string>> = {
  supplier_removed:
    'The last quarterly re-scoring did not find this supplier in the network any more. ' +
    'Check whether it was replaced, then close the entry or keep it with a note.',
  no_longer_matters:
    'At the last quarterly re-scoring this supplier was no longer a single point of failure ' +
    'and rated low. Decide whether to close the entry; nothing is closed automatically.',
};

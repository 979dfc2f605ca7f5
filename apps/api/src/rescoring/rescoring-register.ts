/**
 * The register's side of a re-scoring, inside the analysis run's one transaction:
 *
 * 1. before the register sync, {@link snapshotEntries} keeps every entry's rating and flag as
 *    they stood before this run (the sync overwrites them);
 * 2. after the sync (which re-scored every entry whose supplier is in the run, override kept,
 *    and created entries for new single points of failure), {@link applyRescoring} writes one
 *    `register_entry_scores` row per entry, sets or clears each entry's flag and counts what
 *    changed.
 *
 * Flags: `supplier_removed` when the entry's supplier is not in the run's network version;
 * `no_longer_matters` when it is, is not a single point of failure and the entry is rated low
 * (with its override, as the register shows it); otherwise none. A flag only marks an entry
 * for people to look at: nothing is closed or deleted.
 */
import { eq } from 'drizzle-orm';
import {
  connectionOf,
  registerEntries,
  runSuppliers,
  type KeelsonDatabase,
} from '@keelson/db';
import type { RatingBand, RegisterFlag } from '@keelson/contracts';
import { recordAudit } from '../audit/audit-trail';

/** An entry's score before the run. */
export interface EntrySnapshot {
  rating: number;
  ratingBand: RatingBand;
  flag: RegisterFlag | null;
}

/** One entry whose rating or flag the re-scoring changed, or that it created. */
export interface EntryChange {
  entryId: number;
  title: string;
  supplierCode: string;
  ownerId: number | null;
  /** Null for an entry this run created. */
  previousRating: number | null;
  previousRatingBand: RatingBand | null;
  rating: number;
  ratingBand: RatingBand;
  previousFlag: RegisterFlag | null;
  flag: RegisterFlag | null;
  isCreated: boolean;
}

/** What {@link applyRescoring} did. */
export interface RescoringOutcome {
  rescored: number;
  created: number;
  ratingChanged: number;
  supplierRemoved: number;
  noLongerMatters: number;
  /** Entries created, or whose rating or flag changed, by id. */
  changes: EntryChange[];
}

/** Every entry's rating and flag now, by entry id (call it before the register sync). */
export function snapshotEntries(tx: KeelsonDatabase): Map<number, EntrySnapshot> {
  const rows = tx.select({ id: registerEntries.id, rating: registerEntries.rating,
    ratingBand: registerEntries.ratingBand, flag: registerEntries.flag })
    .from(registerEntries).all();
  return new Map(rows.map(({ id, ...snapshot }) => [id, snapshot]));
}

/**
 * Writes the scores of re-scoring `rescoringId` from analysis run `runId` (already synced into
 * the register in `tx`), with `before` from {@link snapshotEntries}.
 */
export function applyRescoring(tx: KeelsonDatabase, input: {
  rescoringId: number;
  runId: number;
  before: ReadonlyMap<number, EntrySnapshot>;
  userId: number | null;
  now: Date;
}): RescoringOutcome {
  const results = tx.select({ code: runSuppliers.code,
    singlePointOfFailure: runSuppliers.singlePointOfFailure,
    revenueImpact: runSuppliers.revenueImpact })
    .from(runSuppliers).where(eq(runSuppliers.runId, input.runId)).all();
  const bySupplier = new Map(results.map((row) => [row.code, row]));
  const entries = tx.select({ id: registerEntries.id, title: registerEntries.title,
    supplierCode: registerEntries.supplierCode, ownerId: registerEntries.ownerId,
    computedLikelihood: registerEntries.computedLikelihood,
    likelihoodOverride: registerEntries.likelihoodOverride,
    impactBand: registerEntries.impactBand, rating: registerEntries.rating,
    ratingBand: registerEntries.ratingBand, flag: registerEntries.flag })
    .from(registerEntries).orderBy(registerEntries.id).all();
  const stamp = input.now.toISOString();
  // Prepared statements on the transaction's connection: a large register has thousands.
  const connection = connectionOf(tx);
  const insertScore = connection.prepare(`INSERT INTO register_entry_scores (entry_id,
    rescoring_run_id, likelihood, impact_band, rating, rating_band, previous_rating,
    previous_rating_band, revenue_impact, flag, created_at)
    VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  const setFlag = connection.prepare(
    'UPDATE register_entries SET flag = ?, updated_at = ? WHERE id = ?');
  const outcome: RescoringOutcome = { rescored: 0, created: 0, ratingChanged: 0,
    supplierRemoved: 0, noLongerMatters: 0, changes: [] };
  for (const entry of entries) {
    const result = bySupplier.get(entry.supplierCode);
    const before = input.before.get(entry.id);
    const flag: RegisterFlag | null = !result ? 'supplier_removed'
      : !result.singlePointOfFailure && entry.ratingBand === 'low' ? 'no_longer_matters'
        : null;
    insertScore.run(entry.id, input.rescoringId,
      entry.likelihoodOverride ?? entry.computedLikelihood, entry.impactBand, entry.rating,
      entry.ratingBand, before?.rating ?? null, before?.ratingBand ?? null,
      result?.revenueImpact ?? null, flag, stamp);
    if (flag !== entry.flag) {
      setFlag.run(flag, stamp, entry.id);
      recordAudit(tx, { action: 'register.flag_changed', subjectType: 'register_entry',
        subjectId: entry.id, userId: input.userId, before: { flag: entry.flag },
        after: { flag, rescoringId: input.rescoringId } }, input.now);
    }
    if (!before) outcome.created++;
    else if (result) outcome.rescored++;
    const isRatingChanged = before !== undefined && before.rating !== entry.rating;
    if (isRatingChanged) outcome.ratingChanged++;
    if (flag === 'supplier_removed') outcome.supplierRemoved++;
    if (flag === 'no_longer_matters') outcome.noLongerMatters++;
    if (!before || isRatingChanged || flag !== entry.flag) {
      outcome.changes.push({ entryId: entry.id, title: entry.title,
        supplierCode: entry.supplierCode, ownerId: entry.ownerId,
        previousRating: before?.rating ?? null, previousRatingBand: before?.ratingBand ?? null,
        rating: entry.rating, ratingBand: entry.ratingBand, previousFlag: entry.flag, flag,
        isCreated: !before });
    }
  }
  return outcome;
}

/**
 * Keeps the register in step with a succeeded run: every single point of failure and every
 * supplier rated medium or above gets an automatic entry if it has none; every entry whose
 * supplier is in the run takes the run's computed likelihood, impact band and plants, and its
 * rating is recomputed with the entry's own override when it has one. Entries are never deleted
 * or closed by a run: people decide that.
 */
import { eq } from 'drizzle-orm';
import {
  connectionOf,
  registerEntries,
  runSuppliers,
  type KeelsonDatabase,
} from '@keelson/db';
import { registerScore, type ScoringSettings } from '@keelson/scoring';

/** What a sync did. */
export interface RegisterSyncOutcome {
  created: number;
  updated: number;
}

/** Title of an automatic entry. */
export function automaticTitle(name: string, isSinglePoint: boolean, band: string): string {
  return isSinglePoint
    ? `Single point of failure: ${name}`
    : `${band[0]!.toUpperCase()}${band.slice(1)}-rated supplier: ${name}`;
}

/**
 * Syncs the register with run `runId` (call it inside the transaction that stores the run's
 * results, so both land together).
 */
export function syncRegisterFromRun(
  db: KeelsonDatabase,
  runId: number,
  settings: ScoringSettings,
  now: Date,
): RegisterSyncOutcome {
  // Only the columns the register needs: a row's per-product JSON can be large.
  const results = db.select({
    code: runSuppliers.code, name: runSuppliers.name, likelihood: runSuppliers.likelihood,
    impactBand: runSuppliers.impactBand, rating: runSuppliers.rating,
    ratingBand: runSuppliers.ratingBand, singlePointOfFailure: runSuppliers.singlePointOfFailure,
    plants: runSuppliers.plants,
  }).from(runSuppliers).where(eq(runSuppliers.runId, runId)).all();
  const entries = db.select({ id: registerEntries.id, supplierCode: registerEntries.supplierCode,
    likelihoodOverride: registerEntries.likelihoodOverride }).from(registerEntries).all();
  const bySupplier = new Map<string, (typeof entries)[number][]>();
  for (const entry of entries) {
    const list = bySupplier.get(entry.supplierCode) ?? [];
    list.push(entry);
    bySupplier.set(entry.supplierCode, list);
  }
  const stamp = now.toISOString();
  let created = 0;
  let updated = 0;
  // Prepared statements on the caller's connection (inside its transaction): a large run
  // creates thousands of entries, and one statement per row is several times faster than the
  // query builder.
  const connection = connectionOf(db);
  const updateEntry = connection.prepare(`UPDATE register_entries SET run_id = ?,
    computed_likelihood = ?, impact_band = ?, rating = ?, rating_band = ?, updated_at = ?
    WHERE id = ?`);
  const insertEntry = connection.prepare(`INSERT INTO register_entries (supplier_code, title,
    origin, status, run_id, computed_likelihood, impact_band, rating, rating_band, notes,
    created_at, updated_at) VALUES (?, ?, 'automatic', 'open', ?, ?, ?, ?, ?, '', ?, ?)`);
  const deletePlants = connection.prepare('DELETE FROM register_entry_plants WHERE entry_id = ?');
  const insertPlant = connection.prepare(
    'INSERT INTO register_entry_plants (entry_id, plant_code) VALUES (?, ?)');
  const setPlants = (entryId: number, plants: readonly string[]) => {
    deletePlants.run(entryId);
    for (const plantCode of new Set(plants)) insertPlant.run(entryId, plantCode);
  };
  for (const result of results) {
    const existing = bySupplier.get(result.code) ?? [];
    for (const entry of existing) {
      const likelihood = entry.likelihoodOverride ?? result.likelihood;
      const score = registerScore(result.impactBand, likelihood, settings);
      updateEntry.run(runId, result.likelihood, result.impactBand, score.rating,
        score.ratingBand, stamp, entry.id);
      setPlants(entry.id, result.plants);
      updated++;
    }
    const isFlagged = result.singlePointOfFailure || result.ratingBand !== 'low';
    if (existing.length === 0 && isFlagged) {
      const title = automaticTitle(result.name, result.singlePointOfFailure, result.ratingBand);
      const { lastInsertRowid } = insertEntry.run(result.code, title, runId, result.likelihood,
        result.impactBand, result.rating, result.ratingBand, stamp, stamp);
      setPlants(Number(lastInsertRowid), result.plants);
      created++;
    }
  }
  return { created, updated };
}

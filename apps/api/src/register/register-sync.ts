/**
 * Keeps the register in step with a succeeded run: every single point of failure and every
 * supplier rated medium or above gets an automatic entry if it has none; every entry whose
 * supplier is in the run takes the run's computed likelihood, impact band and plants, and its
 * rating is recomputed with the entry's own override when it has one. Entries are never deleted
 * or closed by a run: people decide that.
 */
import { eq } from 'drizzle-orm';
import {
  registerEntries,
  registerEntryPlants,
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
  const results = db.select().from(runSuppliers).where(eq(runSuppliers.runId, runId)).all();
  const entries = db.select().from(registerEntries).all();
  const bySupplier = new Map<string, (typeof entries)[number][]>();
  for (const entry of entries) {
    const list = bySupplier.get(entry.supplierCode) ?? [];
    list.push(entry);
    bySupplier.set(entry.supplierCode, list);
  }
  const stamp = now.toISOString();
  let created = 0;
  let updated = 0;
  const setPlants = (entryId: number, plants: readonly string[]) => {
    db.delete(registerEntryPlants).where(eq(registerEntryPlants.entryId, entryId)).run();
    // One multi-row insert per entry; a lost product's plant appears once in `plants`.
    const unique = [...new Set(plants)];
    if (unique.length > 0) {
      db.insert(registerEntryPlants).values(unique.map((plantCode) => ({ entryId, plantCode })))
        .run();
    }
  };
  for (const result of results) {
    const existing = bySupplier.get(result.code) ?? [];
    for (const entry of existing) {
      const likelihood = entry.likelihoodOverride ?? result.likelihood;
      const score = registerScore(result.impactBand, likelihood, settings);
      db.update(registerEntries)
        .set({ runId, computedLikelihood: result.likelihood, impactBand: result.impactBand,
          rating: score.rating, ratingBand: score.ratingBand, updatedAt: stamp })
        .where(eq(registerEntries.id, entry.id))
        .run();
      setPlants(entry.id, result.plants);
      updated++;
    }
    const isFlagged = result.singlePointOfFailure || result.ratingBand !== 'low';
    if (existing.length === 0 && isFlagged) {
      const entry = db.insert(registerEntries).values({
        supplierCode: result.code,
        title: automaticTitle(result.name, result.singlePointOfFailure, result.ratingBand),
        origin: 'automatic',
        status: 'open',
        runId,
        computedLikelihood: result.likelihood,
        impactBand: result.impactBand,
        rating: result.rating,
        ratingBand: result.ratingBand,
        createdAt: stamp,
        updatedAt: stamp,
      }).returning({ id: registerEntries.id }).get();
      setPlants(entry.id, result.plants);
      created++;
    }
  }
  return { created, updated };
}

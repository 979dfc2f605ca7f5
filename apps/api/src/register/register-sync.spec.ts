import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { registerEntries, registerEntryPlants } from '@keelson/db';
import { SCORING_DEFAULTS } from '@keelson/scoring';
import { createTestApp, type TestApp } from '../testing/test-app';
import { automaticTitle, syncRegisterFromRun } from './register-sync';
import { seedRun } from './register-test-runs';

// Ratings below are impact band x likelihood, banded with the spec's defaults (section 7:
// low 1-4, medium 5-9, high 10-16, critical 20-25), worked out by hand in each comment.
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
});
afterAll(() => t.close());

const at = new Date('2026-03-03T08:00:00.000Z');
const entriesOf = (code: string) =>
  t.database.db.select().from(registerEntries).where(eq(registerEntries.supplierCode, code)).all();
const plantsOf = (entryId: number) =>
  t.database.db.select().from(registerEntryPlants)
    .where(eq(registerEntryPlants.entryId, entryId)).all().map((row) => row.plantCode).sort();

describe('syncRegisterFromRun', () => {
  it('creates entries for single points of failure and medium+ ratings, none for low ones', () => {
    const runId = seedRun(t.database.db, [
      // A single point of failure rated low (1 x 2 = 2) still gets an entry.
      { code: 'SYNC-A', name: 'Alder Castings', singlePointOfFailure: true, likelihood: 2,
        impactBand: 1, rating: 2, ratingBand: 'low', plants: ['P-NORTH'] },
      // Not a single point, 3 x 2 = 6: medium.
      { code: 'SYNC-B', name: 'Birch Plastics', likelihood: 2, impactBand: 3, rating: 6,
        ratingBand: 'medium', plants: ['P-SOUTH', 'P-EAST'] },
      // Not a single point, 1 x 3 = 3: low, so no entry.
      { code: 'SYNC-C', name: 'Cedar Springs', likelihood: 3, impactBand: 1, rating: 3,
        ratingBand: 'low' },
    ]);
    const outcome = syncRegisterFromRun(t.database.db, runId, SCORING_DEFAULTS, at);
    expect(outcome).toEqual({ created: 2, updated: 0 });
    const [a] = entriesOf('SYNC-A');
    expect(a).toMatchObject({ title: 'Single point of failure: Alder Castings',
      origin: 'automatic', status: 'open', runId, computedLikelihood: 2, impactBand: 1,
      rating: 2, ratingBand: 'low', createdAt: at.toISOString() });
    expect(plantsOf(a!.id)).toEqual(['P-NORTH']);
    const [b] = entriesOf('SYNC-B');
    expect(b!.title).toBe('Medium-rated supplier: Birch Plastics');
    expect(plantsOf(b!.id)).toEqual(['P-EAST', 'P-SOUTH']);
    expect(entriesOf('SYNC-C')).toEqual([]);
  });

  it('updates scores and plants, keeps overrides, never deletes or closes', () => {
    const db = t.database.db;
    const [a] = entriesOf('SYNC-A');
    const [b] = entriesOf('SYNC-B');
    db.update(registerEntries).set({ likelihoodOverride: 5, status: 'mitigating' })
      .where(eq(registerEntries.id, a!.id)).run();
    const runId = seedRun(db, [
      // The run scores A 4 x 2 = 8 (medium); the entry's override 5 gives 4 x 5 = 20: critical.
      { code: 'SYNC-A', name: 'Alder Castings', singlePointOfFailure: true, likelihood: 2,
        impactBand: 4, rating: 8, ratingBand: 'medium', plants: ['P-EAST', 'P-SOUTH'] },
      // C is now 3 x 3 = 9: medium, so it gets its entry. B is not in this run.
      { code: 'SYNC-C', name: 'Cedar Springs', likelihood: 3, impactBand: 3, rating: 9,
        ratingBand: 'medium', plants: ['P-EAST'] },
    ], { finishedAt: '2026-03-03T08:00:00.000Z' });
    const outcome = syncRegisterFromRun(db, runId, SCORING_DEFAULTS, at);
    expect(outcome).toEqual({ created: 1, updated: 1 });
    const [updated] = entriesOf('SYNC-A');
    expect(updated).toMatchObject({ runId, computedLikelihood: 2, likelihoodOverride: 5,
      impactBand: 4, rating: 20, ratingBand: 'critical', status: 'mitigating',
      title: a!.title });
    expect(plantsOf(a!.id)).toEqual(['P-EAST', 'P-SOUTH']);
    // B, absent from the run, is left exactly as it was.
    expect(entriesOf('SYNC-B')).toEqual([b]);
    expect(plantsOf(b!.id)).toEqual(['P-EAST', 'P-SOUTH']);
    expect(entriesOf('SYNC-C')).toHaveLength(1);
  });

  it('rates overridden entries with the settings it is given, not the run\'s band', () => {
    const db = t.database.db;
    const runId = seedRun(db, [{ code: 'SYNC-A', name: 'Alder Castings',
      singlePointOfFailure: true, likelihood: 2, impactBand: 4, rating: 8, ratingBand: 'medium',
      plants: [] }]);
    // With the critical floor moved to 21, the override's 4 x 5 = 20 is high.
    const settings = { ...SCORING_DEFAULTS,
      ratingBandFloors: { medium: 5, high: 10, critical: 21 } };
    syncRegisterFromRun(db, runId, settings, at);
    const [entry] = entriesOf('SYNC-A');
    expect(entry).toMatchObject({ rating: 20, ratingBand: 'high', runId });
    expect(plantsOf(entry!.id)).toEqual([]);
  });

  it('updates a manual entry of the supplier instead of adding an automatic one', () => {
    const db = t.database.db;
    const manual = db.insert(registerEntries).values({ supplierCode: 'SYNC-D',
      title: 'Watch: Dune Metals', origin: 'manual', computedLikelihood: 1, impactBand: 1,
      rating: 1, ratingBand: 'low', createdAt: at.toISOString(), updatedAt: at.toISOString(),
    }).returning().get();
    const runId = seedRun(db, [{ code: 'SYNC-D', name: 'Dune Metals',
      singlePointOfFailure: true, likelihood: 4, impactBand: 5, rating: 20,
      ratingBand: 'critical', plants: ['P-NORTH'] }]);
    expect(syncRegisterFromRun(db, runId, SCORING_DEFAULTS, at)).toEqual({ created: 0,
      updated: 1 });
    const entries = entriesOf('SYNC-D');
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({ id: manual.id, origin: 'manual',
      title: 'Watch: Dune Metals', computedLikelihood: 4, impactBand: 5, rating: 20,
      ratingBand: 'critical' });
  });

  it('titles automatic entries by why they were made', () => {
    expect(automaticTitle('Kestrel Forgings', true, 'low'))
      .toBe('Single point of failure: Kestrel Forgings');
    expect(automaticTitle('Kestrel Forgings', false, 'high'))
      .toBe('High-rated supplier: Kestrel Forgings');
  });
});

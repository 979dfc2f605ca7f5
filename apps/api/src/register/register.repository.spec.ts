import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IN_MEMORY, openDatabase, type OpenDatabase } from '@keelson/db';
import { RegisterRepository } from './register.repository';

// More entries than one statement's slice of ids (10 000), so the reads span two slices.
const ENTRIES = 10_005;
let opened: OpenDatabase;
beforeAll(() => {
  opened = openDatabase(IN_MEMORY);
  const { sqlite } = opened;
  const entry = sqlite.prepare(`insert into register_entries (supplier_code, title, origin,
    computed_likelihood, impact_band, rating, rating_band, created_at, updated_at)
    values (?, ?, 'manual', 1, 1, 1, 'low', '2026-03-02T00:00:00Z', '2026-03-02T00:00:00Z')`);
  const plant = sqlite.prepare('insert into register_entry_plants values (?, ?)');
  const override = sqlite.prepare(`insert into likelihood_overrides
    (entry_id, likelihood, previous, reason, created_at) values (?, ?, ?, ?, ?)`);
  sqlite.transaction(() => {
    for (let i = 1; i <= ENTRIES; i++) {
      entry.run(`S-${i}`, `Entry ${i}`);
      plant.run(i, i % 2 === 0 ? 'P-NORTH' : 'P-SOUTH');
    }
    plant.run(ENTRIES, 'P-EAST');
    override.run(1, 4, null, 'First review', '2026-03-03T00:00:00Z');
    override.run(ENTRIES, 5, null, 'Audit', '2026-03-03T00:00:00Z');
    override.run(ENTRIES, null, 5, 'Audit closed', '2026-03-04T00:00:00Z');
  })();
});
afterAll(() => opened.close());

describe('RegisterRepository', () => {
  const ids = Array.from({ length: ENTRIES }, (_, i) => i + 1);

  it('reads the plants of more entries than one slice of ids', () => {
    const plants = new RegisterRepository(opened.db).plantsOf(ids);
    expect(plants.size).toBe(ENTRIES);
    expect(plants.get(1)).toEqual(['P-SOUTH']);
    expect(plants.get(10_000)).toEqual(['P-NORTH']);
    expect(plants.get(ENTRIES)).toEqual(['P-EAST', 'P-SOUTH']);
  });

  it('reads the override history across slices, oldest first per entry', () => {
    const history = new RegisterRepository(opened.db).overridesOf(ids)
      .map(({ entryId, likelihood, reason }) => [entryId, likelihood, reason]);
    expect(history).toEqual([
      [1, 4, 'First review'],
      [ENTRIES, 5, 'Audit'],
      [ENTRIES, null, 'Audit closed'],
    ]);
  });
});

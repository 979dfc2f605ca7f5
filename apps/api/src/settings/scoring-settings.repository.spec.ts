import { afterEach, describe, expect, it } from 'vitest';
import { IN_MEMORY, appSettings, openDatabase, type OpenDatabase } from '@keelson/db';
import { SCORING_DEFAULTS } from '@keelson/scoring';
import { loadScoringSettings, saveScoringSettings } from './scoring-settings.repository';

let opened: OpenDatabase | undefined;
afterEach(() => opened?.close());

describe('scoring settings', () => {
  it('gives the defaults, then what was saved, and the defaults again for a broken value', () => {
    opened = openDatabase(IN_MEMORY);
    const { db } = opened;
    expect(loadScoringSettings(db)).toEqual(SCORING_DEFAULTS);
    const changed = { ...SCORING_DEFAULTS, unknownCountryHazard: 4 };
    saveScoringSettings(db, changed, new Date('2026-12-02T00:00:00Z'));
    expect(loadScoringSettings(db).unknownCountryHazard).toBe(4);
    db.update(appSettings).set({ value: '{"impactBandLimits": "no"}' }).run();
    expect(loadScoringSettings(db)).toEqual(SCORING_DEFAULTS);
  });
});

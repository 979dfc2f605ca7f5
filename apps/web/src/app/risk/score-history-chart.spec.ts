import { describe, expect, it } from 'vitest';
import { scoreHistoryConfig, type ScoreHistory } from './score-history-chart';

const HISTORY: ScoreHistory = [
  { runId: 1, label: 'Q3 review', finishedAt: '2026-09-30T10:00:00.000Z', rating: 12,
    likelihood: 3, impactBand: 4, revenueImpact: 900_000, nexusIndex: 0.4 },
  { runId: 2, label: 'Q4 review', finishedAt: '2026-12-01T10:00:00.000Z', rating: 20,
    likelihood: 4, impactBand: 5, revenueImpact: 1_400_000, nexusIndex: 0.5 },
];

describe('scoreHistoryConfig', () => {
  it('draws each score as its own coloured line, scores left and revenue right', () => {
    const config = scoreHistoryConfig(HISTORY);
    expect(config.data.labels).toEqual(['Q3 review', 'Q4 review']);
    const sets = config.data.datasets;
    expect(sets.map((set) => set.data)).toEqual([[12, 20], [3, 4], [4, 5],
      [900_000, 1_400_000]]);
    expect(sets.map((set) => set.yAxisID)).toEqual(['score', 'score', 'score', 'impact']);
    const colours = sets.map((set) => set.borderColor);
    expect(colours.every((colour) => typeof colour === 'string')).toBe(true);
    expect(new Set(colours).size).toBe(4);
  });
});

/**
 * The in-memory ranking keys on hand-made rows: sort with ties by rank and empty tiers last,
 * each filter, and the cache loading a run once and dropping the least recently used.
 */
import { describe, expect, it } from 'vitest';
import { RunRankingCache, RunRankingIndex, type RankingKey } from './run-ranking-index';

const key = (rank: number, code: string, tier: number | null, revenueImpact: number,
  plants: string[], extra: Partial<RankingKey> = {}): RankingKey => ({
  rowId: rank * 10, rank, code, name: `Name ${code}`, country: 'DE', region: 'Europe', tier,
  productsLost: plants.length, revenueExposedPerWeek: 0, revenueImpact, timeToRecover: 4,
  singlePointOfFailure: plants.length > 0, betweenness: 0, degree: 0, closeness: 0,
  eigenvector: 0, pagerank: 0, nexusIndex: 0, likelihood: 3, impactBand: 1, rating: 3,
  ratingBand: 'low', plants, ...extra,
});

const rows = [
  key(3, 'C', null, 0, []),
  key(1, 'A', 2, 500, ['P1', 'P2'], { country: 'CZ', ratingBand: 'high', likelihood: 4 }),
  key(2, 'B', 1, 500, ['P2']),
  key(4, 'D', 1, 0, [], { name: 'Shared tooling' }),
];

describe('RunRankingIndex', () => {
  const index = new RunRankingIndex(rows);
  const codes = (keys: RankingKey[]) => keys.map((k) => k.code);
  it('sorts by a field either way, ties by rank, empty tiers last both ways', () => {
    expect(codes(index.select({}))).toEqual(['A', 'B', 'C', 'D']);
    expect(codes(index.select({}, 'tier', 'asc'))).toEqual(['B', 'D', 'A', 'C']);
    expect(codes(index.select({}, 'tier', 'desc'))).toEqual(['A', 'B', 'D', 'C']);
    expect(codes(index.select({}, 'revenueImpact', 'desc'))).toEqual(['A', 'B', 'C', 'D']);
    expect(codes(index.select({}, 'code', 'desc'))).toEqual(['D', 'C', 'B', 'A']);
  });
  it('filters on text, plants, country ignoring case, bands and single points', () => {
    expect(codes(index.select({ q: 'TOOL' }))).toEqual(['D']);
    expect(codes(index.select({ plants: ['P2'] }))).toEqual(['A', 'B']);
    expect(codes(index.select({ plants: [] }))).toEqual([]);
    expect(codes(index.select({ country: 'cz' }))).toEqual(['A']);
    expect(codes(index.select({ ratingBand: 'high', likelihood: 4 }))).toEqual(['A']);
    expect(codes(index.select({ singlePointsOnly: 'true' }))).toEqual(['A', 'B']);
    expect(codes(index.select({ tier: 1, singlePointsOnly: 'false' }))).toEqual(['B', 'D']);
  });
});

describe('RunRankingCache', () => {
  it('loads a run once and drops the least recently used beyond its size', () => {
    const loads: number[] = [];
    const cache = new RunRankingCache((runId) => {
      loads.push(runId);
      return rows;
    }, 2);
    cache.get(1);
    cache.get(1);
    cache.get(2);
    cache.get(1);
    cache.get(3);
    cache.get(1);
    cache.get(2);
    expect(loads).toEqual([1, 2, 3, 2]);
  });
});

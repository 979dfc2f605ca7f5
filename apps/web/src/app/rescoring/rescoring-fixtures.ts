import type {
  ComparisonRowDto,
  EntryScoreDto,
  QuarterTrendDto,
  RescoringRunDto,
  RescoringScheduleDto,
  RunComparisonDto,
} from '@keelson/contracts';

/**
 * Answers of the re-scoring and comparison APIs for the client's specs, shaped like the DTOs in
 * libs/contracts/src/rescoring.ts. Invented suppliers in the demo's naming pattern; nothing here
 * describes a real company.
 */

/** A finished re-scoring of 2026-Q4 on version 3 by default, every field overridable. */
export function rescoringRow(id: number, overrides: Partial<RescoringRunDto> = {}):
  RescoringRunDto {
  return {
    id,
    quarterLabel: '2026-Q4',
    networkVersionId: 3,
    analysisRunId: 100 + id,
    status: 'succeeded',
    trigger: 'manual',
    isForced: false,
    attempts: 1,
    progress: 1,
    stage: null,
    summary: { rescored: 148, created: 1, ratingChanged: 3, supplierRemoved: 1,
      noLongerMatters: 0, previousRescoringId: null, mailsSent: 4 },
    error: null,
    startedBy: { id: 3, name: 'Rania Okafor' },
    createdAt: '2026-12-01T09:00:00.000Z',
    startedAt: '2026-12-01T09:00:01.000Z',
    finishedAt: '2026-12-01T09:03:00.000Z',
    ...overrides,
  };
}

/** The default schedule: 06:00 on the first Monday of each quarter, Berlin time. */
export function scheduleDto(overrides: Partial<RescoringScheduleDto> = {}): RescoringScheduleDto {
  return {
    cron: '0 6 * 1,4,7,10 1#1',
    timeZone: 'Europe/Berlin',
    isEnabled: true,
    nextRunAt: '2027-01-04T05:00:00.000Z',
    updatedAt: null,
    ...overrides,
  };
}

/** One quarter of the trends. */
export function trendRow(quarterLabel: string, overrides: Partial<QuarterTrendDto> = {}):
  QuarterTrendDto {
  return {
    quarterLabel,
    rescoringId: 1,
    analysisRunId: 101,
    totalRevenueImpact: 2_400_000,
    singlePointsOfFailure: 2,
    highEntries: 5,
    criticalEntries: 1,
    ...overrides,
  };
}

/** A comparison row of a supplier in both runs, every field overridable. */
export function comparisonRow(code: string, overrides: Partial<ComparisonRowDto> = {}):
  ComparisonRowDto {
  return {
    code,
    name: `Supplier ${code}`,
    tier: 2,
    before: { rating: 10, ratingBand: 'medium', revenueImpact: 200_000,
      singlePointOfFailure: false },
    after: { rating: 15, ratingBand: 'high', revenueImpact: 260_000, singlePointOfFailure: true },
    ratingChange: 5,
    revenueImpactChange: 60_000,
    ...overrides,
  };
}

/** Run 101 (2026-Q3) against run 102 (2026-Q4): a new single point, a removed supplier. */
export function comparisonDto(overrides: Partial<RunComparisonDto> = {}): RunComparisonDto {
  const added = comparisonRow('S-2-NEW', { name: 'Halvard Seals', before: null,
    ratingChange: 15, revenueImpactChange: 260_000 });
  const removed = comparisonRow('S-1-0007', { name: 'Brenmoor Fittings', after: null,
    ratingChange: -8, revenueImpactChange: -90_000,
    before: { rating: 8, ratingBand: 'medium', revenueImpact: 90_000,
      singlePointOfFailure: false } });
  return {
    fromRun: { id: 101, label: 'Quarterly 2026-Q3', networkVersionId: 2,
      finishedAt: '2026-09-01T09:00:00.000Z', quarterLabel: '2026-Q3' },
    toRun: { id: 102, label: 'Quarterly 2026-Q4', networkVersionId: 3,
      finishedAt: '2026-12-01T09:00:00.000Z', quarterLabel: '2026-Q4' },
    newSinglePoints: [comparisonRow('S-2-SHARED-C', { name: 'Tarnwick Alloys' })],
    goneSinglePoints: [],
    risers: [
      comparisonRow('S-2-SHARED-C', { name: 'Tarnwick Alloys' }),
      comparisonRow('S-1-0003', { name: 'Aldren Pumps', ratingChange: 2,
        revenueImpactChange: 400_000 }),
    ],
    fallers: [removed],
    suppliersAdded: [added],
    suppliersRemoved: [removed],
    ...overrides,
  };
}

/** A register entry's score at one re-scoring. */
export function entryScore(quarterLabel: string, rating: number,
  overrides: Partial<EntryScoreDto> = {}): EntryScoreDto {
  return {
    quarterLabel,
    rescoringId: Number(quarterLabel.slice(-1)),
    rating,
    ratingBand: rating >= 20 ? 'critical' : rating >= 12 ? 'high' : rating >= 6 ? 'medium'
      : 'low',
    previousRating: null,
    revenueImpact: 540_000,
    flag: null,
    createdAt: `2026-${String(Number(quarterLabel.slice(-1)) * 3).padStart(2, '0')}-01T09:00:00Z`,
    ...overrides,
  };
}

/**
 * The comparison of two analysis runs (what changed between them, supplier by supplier code),
 * the quarterly trends and one register entry's score history. Plant managers see only the
 * suppliers whose lost products reach one of their plants in either run, the trends of their
 * plants and the entries of their plants. See docs/comparison-api.md.
 */
import type {
  ComparisonQuery, ComparisonRowDto, EntryScoreDto, RescoringTrendsDto, RunComparisonDto,
} from '@keelson/contracts';
import { AppError, conflict, invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { plantScopeOf, type PlantScope } from '../network/plant-scope';
import type {
  ComparedRunRow, ComparedSupplierRow, ComparisonRepository,
} from './comparison.repository';

/** Rows kept in each of the risers and fallers. */
export const MOVERS_LIMIT = 20;

/** What the comparison needs. */
export interface ComparisonServiceDeps {
  repository: ComparisonRepository;
}

type Side = NonNullable<ComparisonRowDto['before']>;

/** Reads comparisons, trends and entry score histories within the user's plant scope. */
export class ComparisonService {
  constructor(private readonly deps: ComparisonServiceDeps) {}

  /** GET /api/comparison: what changed between two succeeded runs (defaults: the last two). */
  compare(user: SessionUser, query: ComparisonQuery): RunComparisonDto {
    const [from, to] = this.pickRuns(query);
    const { repository } = this.deps;
    const before = repository.supplierRows(from.id);
    const after = repository.supplierRows(to.id);
    const scope = plantScopeOf(user);
    const rows: ComparisonRowDto[] = [];
    for (const code of new Set([...before.keys(), ...after.keys()])) {
      const earlier = before.get(code);
      const later = after.get(code);
      if (!touchesScope(scope, earlier, later)) continue;
      rows.push(toRow(earlier, later));
    }
    const both = rows.filter((row) => row.before !== null && row.after !== null);
    return {
      fromRun: runSummary(from),
      toRun: runSummary(to),
      newSinglePoints: rows.filter((row) => row.after?.singlePointOfFailure
        && !row.before?.singlePointOfFailure).sort(byImpact('after')),
      goneSinglePoints: rows.filter((row) => row.before?.singlePointOfFailure
        && !row.after?.singlePointOfFailure).sort(byImpact('before')),
      risers: both.filter((row) => row.ratingChange > 0
        || (row.ratingChange === 0 && row.revenueImpactChange > 0))
        .sort((a, b) => b.ratingChange - a.ratingChange
          || b.revenueImpactChange - a.revenueImpactChange || byCode(a, b))
        .slice(0, MOVERS_LIMIT),
      fallers: both.filter((row) => row.ratingChange < 0
        || (row.ratingChange === 0 && row.revenueImpactChange < 0))
        .sort((a, b) => a.ratingChange - b.ratingChange
          || a.revenueImpactChange - b.revenueImpactChange || byCode(a, b))
        .slice(0, MOVERS_LIMIT),
      suppliersAdded: rows.filter((row) => row.before === null).sort(byImpact('after')),
      suppliersRemoved: rows.filter((row) => row.after === null).sort(byImpact('before')),
    };
  }

  /** GET /api/comparison/trends: one item per succeeded re-scoring, oldest first. */
  trends(user: SessionUser): RescoringTrendsDto {
    const { repository } = this.deps;
    const scope = plantScopeOf(user);
    return {
      items: repository.succeededRescorings().map((rescoring) => {
        const totals = repository.runTotals(rescoring.analysisRunId, scope);
        const bands = repository.bandCounts(rescoring.rescoringId, scope);
        return {
          quarterLabel: rescoring.quarterLabel,
          rescoringId: rescoring.rescoringId,
          analysisRunId: rescoring.analysisRunId,
          totalRevenueImpact: totals.totalRevenueImpact,
          singlePointsOfFailure: totals.singlePointsOfFailure,
          highEntries: bands.high,
          criticalEntries: bands.critical,
        };
      }),
    };
  }

  /**
   * GET /api/comparison/entries/:entryId/scores, oldest first; 404 for an entry outside the
   * user's plants, as the register answers.
   */
  entryScores(user: SessionUser, entryId: number): EntryScoreDto[] {
    const plants = this.deps.repository.entryPlants(entryId);
    const scope = plantScopeOf(user);
    if (!plants || (scope !== null && !plants.some((plant) => scope.includes(plant)))) {
      throw notFound(`Register entry ${entryId} was not found.`);
    }
    return this.deps.repository.entryScores(entryId);
  }

  /**
   * The two runs: as asked, or by default the latest succeeded quarterly run and the one before
   * it (the last two succeeded runs of any kind when there are fewer than two quarterly ones).
   * A missing side is the nearest succeeded run before `to` / after `from`, of the same kind
   * when there is one.
   */
  private pickRuns(query: ComparisonQuery): [ComparedRunRow, ComparedRunRow] {
    const { repository } = this.deps;
    if (query.from !== undefined && query.from === query.to) {
      throw invalidRequest(`The request is not valid: query.to: run ${query.to} is also the ` +
        'earlier run; compare two different runs.', { issues: [{ path: 'query.to',
        message: 'compare two different runs' }] });
    }
    if (query.from === undefined && query.to === undefined) {
      const quarterly = repository.latestSucceeded('quarterly', 2);
      const pair = quarterly.length === 2 ? quarterly : repository.latestSucceeded(null, 2);
      if (pair.length === 0) {
        throw notFound('No analysis run has succeeded yet, so there is nothing to compare. ' +
          'Import a network, then start an analysis run or a quarterly re-scoring; compare ' +
          'once two have succeeded.');
      }
      if (pair.length === 1) {
        throw conflict('comparison_needs_two_runs', `Only one analysis run has succeeded (run ` +
          `${pair[0]!.id}). Start another analysis run or a quarterly re-scoring, then compare.`,
          { runId: pair[0]!.id });
      }
      return [pair[1]!, pair[0]!];
    }
    const from = query.from === undefined ? undefined : this.succeededRun(query.from, 'from');
    const to = query.to === undefined ? undefined : this.succeededRun(query.to, 'to');
    if (from && to) return [from, to];
    if (to) {
      const earlier = this.nearest(to, 'before');
      if (!earlier) {
        throw conflict('comparison_needs_two_runs', `No succeeded analysis run finished before ` +
          `run ${to.id}; give query.from to choose the earlier run.`, { runId: to.id });
      }
      return [earlier, to];
    }
    const later = this.nearest(from!, 'after');
    if (!later) {
      throw conflict('comparison_needs_two_runs', `No succeeded analysis run finished after run ` +
        `${from!.id}; give query.to to choose the later run.`, { runId: from!.id });
    }
    return [from!, later];
  }

  private nearest(run: ComparedRunRow, direction: 'before' | 'after'):
    ComparedRunRow | undefined {
    const { repository } = this.deps;
    return (run.kind === 'quarterly' ? repository.neighbour(run, direction, 'quarterly')
      : undefined) ?? repository.neighbour(run, direction, null);
  }

  private succeededRun(id: number, field: 'from' | 'to'): ComparedRunRow {
    const run = this.deps.repository.run(id);
    if (!run) throw notFound(`query.${field}: analysis run ${id} was not found.`);
    if (run.status !== 'succeeded') {
      throw new AppError('run_not_succeeded', 409, `query.${field}: analysis run ${id} is ` +
        `${run.status}; only a succeeded run has results to compare.`,
      { runId: id, status: run.status });
    }
    return run;
  }
}

function runSummary(run: ComparedRunRow): RunComparisonDto['fromRun'] {
  return { id: run.id, label: run.label, networkVersionId: run.networkVersionId,
    finishedAt: run.finishedAt, quarterLabel: run.quarterLabel };
}

function touchesScope(scope: PlantScope, ...rows: (ComparedSupplierRow | undefined)[]):
  boolean {
  return scope === null
    || rows.some((row) => row?.plants.some((plant) => scope.includes(plant)) ?? false);
}

function side(row: ComparedSupplierRow | undefined): Side | null {
  return row ? { rating: row.rating, ratingBand: row.ratingBand,
    revenueImpact: row.revenueImpact, singlePointOfFailure: row.singlePointOfFailure } : null;
}

// A change is the later value minus the earlier one, a missing side counting as 0; revenue to
// the cent, so floating-point noise is no change.
function toRow(before: ComparedSupplierRow | undefined, after: ComparedSupplierRow | undefined):
  ComparisonRowDto {
  const named = (after ?? before)!;
  return {
    code: named.code,
    name: named.name,
    tier: after ? after.tier : before!.tier,
    before: side(before),
    after: side(after),
    ratingChange: (after?.rating ?? 0) - (before?.rating ?? 0),
    revenueImpactChange:
      Math.round(((after?.revenueImpact ?? 0) - (before?.revenueImpact ?? 0)) * 100) / 100,
  };
}

function byCode(a: ComparisonRowDto, b: ComparisonRowDto): number {
  return a.code < b.code ? -1 : a.code > b.code ? 1 : 0;
}

function byImpact(which: 'before' | 'after') {
  return (a: ComparisonRowDto, b: ComparisonRowDto) =>
    (b[which]?.revenueImpact ?? 0) - (a[which]?.revenueImpact ?? 0) || byCode(a, b);
}

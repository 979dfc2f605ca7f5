/**
 * ComparisonService on hand-made rows (a stub repository): the order and limit of risers and
 * fallers, ties by code, a revenue-only move, unchanged rows left out, plant scoping through
 * either run, and the choice of the missing side. The rows are invented for these cases.
 */
import { describe, expect, it } from 'vitest';
import type { SessionUser } from '../http/auth-context';
import type {
  ComparedRunRow, ComparedSupplierRow, ComparisonRepository,
} from './comparison.repository';
import { ComparisonService, MOVERS_LIMIT } from './comparison.service';

const RISK: SessionUser = { id: 1, email: 'risk@x.test', name: 'Risk', role: 'risk_manager',
  plantCodes: [] };
const SOUTH: SessionUser = { id: 2, email: 'south@x.test', name: 'South', role: 'plant_manager',
  plantCodes: ['P-SOUTH'] };

function run(id: number, kind: 'manual' | 'quarterly', finishedAt: string): ComparedRunRow {
  return { id, label: `Run ${id}`, networkVersionId: 1, kind, status: 'succeeded', finishedAt,
    quarterLabel: null };
}

function supplier(code: string, rating: number, revenueImpact: number,
  extra: Partial<ComparedSupplierRow> = {}): ComparedSupplierRow {
  return { code, name: `Supplier ${code}`, tier: 1, rating, ratingBand: 'medium', revenueImpact,
    singlePointOfFailure: false, plants: ['P-NORTH'], ...extra };
}

/** A repository over fixed runs (oldest first) and their rows. */
function service(runs: ComparedRunRow[], rows: Record<number, ComparedSupplierRow[]>) {
  const ordered = [...runs].sort((a, b) => (a.finishedAt! < b.finishedAt! ? -1 : 1));
  const succeeded = (kind: 'quarterly' | null) =>
    ordered.filter((r) => r.status === 'succeeded' && (kind === null || r.kind === kind));
  const repository = {
    run: (id: number) => runs.find((r) => r.id === id),
    latestSucceeded: (kind: 'quarterly' | null, limit: number) =>
      succeeded(kind).reverse().slice(0, limit),
    neighbour: (of: ComparedRunRow, direction: 'before' | 'after', kind: 'quarterly' | null) => {
      const list = succeeded(kind);
      return direction === 'before'
        ? list.filter((r) => r.finishedAt! < of.finishedAt!).at(-1)
        : list.find((r) => r.finishedAt! > of.finishedAt!);
    },
    supplierRows: (id: number) => new Map((rows[id] ?? []).map((row) => [row.code, row])),
  } as unknown as ComparisonRepository;
  return new ComparisonService({ repository });
}

describe('ComparisonService.compare', () => {
  it('orders risers by rating change, then revenue change, then code, and keeps 20', () => {
    const before: ComparedSupplierRow[] = [];
    const after: ComparedSupplierRow[] = [];
    for (let i = 0; i < 30; i++) {
      const code = `S-${String(i).padStart(2, '0')}`;
      before.push(supplier(code, 4, 1000));
      after.push(supplier(code, 4 + (i % 3), 1000 + (i % 2) * 500));
    }
    before.push(supplier('S-SAME', 6, 2000));
    after.push(supplier('S-SAME', 6, 2000.000001));
    const result = service([run(1, 'manual', '2027-01-01'), run(2, 'manual', '2027-04-01')],
      { 1: before, 2: after }).compare(RISK, {});
    expect(result.risers).toHaveLength(MOVERS_LIMIT);
    const keys = result.risers.map((row) => [row.ratingChange, row.revenueImpactChange,
      row.code]);
    const sorted = [...keys].sort((a, b) => (b[0] as number) - (a[0] as number)
      || (b[1] as number) - (a[1] as number) || ((a[2] as string) < (b[2] as string) ? -1 : 1));
    expect(keys).toEqual(sorted);
    // Rating +2 first (i % 3 = 2), with a revenue rise (i odd) before none, then by code.
    expect(result.risers.slice(0, 3).map((row) => row.code)).toEqual(['S-05', 'S-11', 'S-17']);
    // The five revenue-only rises (i % 3 = 0, i odd) rank below all 20 rating rises, so the
    // limit leaves them out; a change below a cent is no change.
    expect(result.risers.some((row) => row.ratingChange === 0)).toBe(false);
    expect([...result.risers, ...result.fallers].map((row) => row.code)).not.toContain('S-SAME');
    expect(result.fallers).toEqual([]);
  });

  it('counts a revenue-only move as a riser or faller when the rating is equal', () => {
    const result = service([run(1, 'manual', '2027-01-01'), run(2, 'manual', '2027-04-01')], {
      1: [supplier('A', 5, 100), supplier('B', 5, 100), supplier('C', 9, 100)],
      2: [supplier('A', 5, 300), supplier('B', 5, 50), supplier('C', 3, 900)],
    }).compare(RISK, { from: 1, to: 2 });
    expect(result.risers.map((row) => [row.code, row.ratingChange, row.revenueImpactChange]))
      .toEqual([['A', 0, 200]]);
    expect(result.fallers.map((row) => [row.code, row.ratingChange])).toEqual([['C', -6],
      ['B', 0]]);
  });

  it('shows a plant manager a row whose lost products reach their plant in either run', () => {
    const result = service([run(1, 'manual', '2027-01-01'), run(2, 'manual', '2027-04-01')], {
      1: [supplier('WAS-SOUTH', 5, 100, { plants: ['P-SOUTH'], singlePointOfFailure: true }),
        supplier('NORTH', 5, 100), supplier('GONE-SOUTH', 4, 10, { plants: ['P-SOUTH'] })],
      2: [supplier('WAS-SOUTH', 5, 0, { plants: [] }), supplier('NORTH', 9, 100),
        supplier('NEW-SOUTH', 8, 10, { plants: ['P-SOUTH'], singlePointOfFailure: true })],
    }).compare(SOUTH, {});
    expect(result.goneSinglePoints.map((row) => row.code)).toEqual(['WAS-SOUTH']);
    expect(result.newSinglePoints.map((row) => row.code)).toEqual(['NEW-SOUTH']);
    expect(result.suppliersAdded.map((row) => row.code)).toEqual(['NEW-SOUTH']);
    expect(result.suppliersRemoved.map((row) => row.code)).toEqual(['GONE-SOUTH']);
    expect(result.risers).toEqual([]);
    expect(result.fallers.map((row) => row.code)).toEqual(['WAS-SOUTH']);
  });

  it('picks the missing side among runs of the same kind first', () => {
    const runs = [run(1, 'quarterly', '2027-01-01'), run(2, 'manual', '2027-02-01'),
      run(3, 'quarterly', '2027-04-01'), run(4, 'manual', '2027-05-01')];
    const compare = service(runs, {});
    const pair = (query: { from?: number; to?: number }) => {
      const result = compare.compare(RISK, query);
      return [result.fromRun.id, result.toRun.id];
    };
    expect(pair({})).toEqual([1, 3]);
    expect(pair({ to: 3 })).toEqual([1, 3]);
    expect(pair({ to: 4 })).toEqual([3, 4]);
    expect(pair({ from: 1 })).toEqual([1, 3]);
    expect(pair({ from: 2 })).toEqual([2, 3]);
    expect(() => pair({ to: 1 })).toThrow('No succeeded analysis run finished before run 1');
  });
});

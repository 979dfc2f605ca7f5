/** Failure paths on the worked example; expected chains read off its graph by hand. */
import { describe, expect, it } from 'vitest';
import { buildSupplyGraph } from './build-supply-graph';
import { UnknownSupplierError } from './errors';
import { failurePaths } from './failure-paths';
import { WORKED_EXAMPLE } from './testing/worked-example';

const graph = buildSupplyGraph(WORKED_EXAMPLE);

describe('failurePaths', () => {
  it('follows the hidden tier-2 supplier through both dual sources to each lost product', () => {
    const paths = failurePaths(graph, 'S4');
    expect(paths.map((p) => p.productCode)).toEqual(['F1', 'F2']);
    const f2 = paths[1]!.nodes.map((n) => n.id);
    expect(f2[0]).toBe('supplier:S4');
    expect(f2.slice(-2)).toEqual(['item:I2@P1', 'product:F2']);
    expect(f2).toHaveLength(5);
    expect(paths[0]!.nodes.map((n) => n.id).slice(-3)).toEqual(
      ['item:I2@P1', 'item:A1@P1', 'product:F1'],
    );
  });
  it('describes nodes with kind, code, buyer, tier and a column counted from the product', () => {
    const [path] = failurePaths(graph, 'S6');
    expect(path!.nodes).toEqual([
      { id: 'supplier:S6', kind: 'supplier', code: 'S6', buyer: null, tier: 2, column: 4 },
      { id: 'item:C2@S5', kind: 'item', code: 'C2', buyer: 'S5', tier: null, column: 3 },
      { id: 'supplier:S5', kind: 'supplier', code: 'S5', buyer: null, tier: 1, column: 2 },
      { id: 'item:I3@P1', kind: 'item', code: 'I3', buyer: 'P1', tier: null, column: 1 },
      { id: 'product:F1', kind: 'product', code: 'F1', buyer: 'P1', tier: null, column: 0 },
    ]);
  });
  it('restricts to the requested products and skips products already down at baseline', () => {
    expect(failurePaths(graph, 'S4', ['F2']).map((p) => p.productCode)).toEqual(['F2']);
    // S8 takes F3 and F4 down, but F4 is down at baseline (unsourced I6): no path for it.
    expect(failurePaths(graph, 'S8').map((p) => p.productCode)).toEqual(['F3']);
    expect(failurePaths(graph, 'S2')).toEqual([]);
  });
  it('throws UnknownSupplierError for an unknown supplier', () => {
    expect(() => failurePaths(graph, 'S99')).toThrow(UnknownSupplierError);
  });
});

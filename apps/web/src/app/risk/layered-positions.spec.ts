import { describe, expect, it } from 'vitest';
import { LAYERED_DEFAULTS, layeredPositions } from './layered-positions';

describe('layeredPositions', () => {
  it('puts each node at its column, plants at x 0 and suppliers leftwards', () => {
    const positions = layeredPositions(
      [{ id: 'plant', column: 0 }, { id: 'product', column: 1 }, { id: 'supplier', column: 3 }],
      [],
    );
    expect(positions.get('plant')?.x).toBe(0);
    expect(positions.get('product')?.x).toBe(-LAYERED_DEFAULTS.columnGap);
    // Column 2 is empty, so the supplier sits one gap further, not two.
    expect(positions.get('supplier')?.x).toBe(-2 * LAYERED_DEFAULTS.columnGap);
  });

  it('uncrosses two edges by ordering a column after its neighbours', () => {
    // Column 0: A above B. Column 1 starts as C above D with C-B and D-A: the edges cross.
    // Moving each of C, D to its neighbour's place puts D above C, and nothing crosses.
    const positions = layeredPositions(
      [{ id: 'A', column: 0 }, { id: 'B', column: 0 }, { id: 'C', column: 1 },
        { id: 'D', column: 1 }],
      [{ source: 'C', target: 'B' }, { source: 'D', target: 'A' }],
    );
    expect(positions.get('A')!.y).toBeLessThan(positions.get('B')!.y);
    expect(positions.get('D')!.y).toBeLessThan(positions.get('C')!.y);
  });

  it('deals a long column round-robin into sub-columns and shifts the next column left', () => {
    const nodes = ['a', 'b', 'c', 'd', 'e'].map((id) => ({ id, column: 0 }));
    const positions = layeredPositions([...nodes, { id: 'next', column: 1 }], [],
      { maxPerColumn: 2, subColumnGap: 10, columnGap: 100, rowGap: 5 });
    // Five nodes, at most two per sub-column: three sub-columns of two rows.
    expect(['a', 'b', 'c', 'd', 'e'].map((id) => positions.get(id))).toEqual([
      { x: 0, y: -2.5 }, { x: -10, y: -2.5 }, { x: -20, y: -2.5 }, { x: 0, y: 2.5 },
      { x: -10, y: 2.5 },
    ]);
    expect(positions.get('next')).toEqual({ x: -120, y: 0 });
  });

  it('spreads a column evenly around 0 and ignores edges to unknown nodes', () => {
    const positions = layeredPositions(
      [{ id: 'x', column: 2 }, { id: 'y', column: 2 }, { id: 'z', column: 2 }],
      [{ source: 'x', target: 'missing' }],
      { rowGap: 10 },
    );
    expect([...positions.values()].map((p) => p.y)).toEqual([-10, 0, 10]);
  });
});

/**
 * A fast layered layout for pictures too large for dagre: each node stays in the column the
 * server gave it (0 for plants, growing leftwards), and the order inside each column is
 * improved by the barycentre heuristic (K. Sugiyama, S. Tagawa and M. Toda, "Methods for
 * visual understanding of hierarchical system structures", IEEE Trans. Systems, Man, and
 * Cybernetics 11(2):109-125, 1981, doi:10.1109/TSMC.1981.4308636): sweeps alternately away from
 * and towards the plants, each node moving to the mean position of its neighbours in the
 * column just swept. O(sweeps x (n log n + m)); dagre's network-simplex ranking and crossing
 * reduction took seconds on a thousand nodes in the browser. A column longer than
 * `maxPerColumn` is dealt round-robin into side-by-side sub-columns, which keeps its vertical
 * order and the picture's proportions (the demo network has 424 nodes in one column).
 */

/** A node to place: its id and column. */
export interface LayeredNode {
  id: string;
  column: number;
}

/** Spacing and effort of {@link layeredPositions}. */
export interface LayeredOptions {
  /** Gap between two columns. */
  columnGap: number;
  /** Gap between two rows of a column. */
  rowGap: number;
  /** Ordering sweeps (alternating directions). */
  sweeps: number;
  /** Nodes above which a column is split into sub-columns. */
  maxPerColumn: number;
  /** Gap between the sub-columns of a split column. */
  subColumnGap: number;
}

/** Defaults of {@link layeredPositions}. */
export const LAYERED_DEFAULTS: LayeredOptions = {
  columnGap: 220, rowGap: 28, sweeps: 4, maxPerColumn: 60, subColumnGap: 80,
};

/**
 * Positions of every node: columns from x = 0 (column 0, the plants) leftwards, each
 * `columnGap` beyond the previous one's last sub-column; y spread evenly around 0 in the order
 * the sweeps found. Nodes keep their input order where they have no neighbour in the column
 * swept from. Inputs are not changed.
 */
export function layeredPositions(
  nodes: readonly LayeredNode[],
  edges: readonly { source: string; target: string }[],
  options: Partial<LayeredOptions> = {},
): Map<string, { x: number; y: number }> {
  const { columnGap, rowGap, sweeps, maxPerColumn, subColumnGap } = {
    ...LAYERED_DEFAULTS, ...options,
  };
  const columnOf = new Map(nodes.map((node) => [node.id, node.column]));
  const neighbours = new Map<string, string[]>(nodes.map((node) => [node.id, []]));
  for (const { source, target } of edges) {
    if (!columnOf.has(source) || !columnOf.has(target) || source === target) continue;
    neighbours.get(source)!.push(target);
    neighbours.get(target)!.push(source);
  }
  const columns = new Map<number, string[]>();
  for (const node of nodes) {
    const list = columns.get(node.column) ?? [];
    list.push(node.id);
    columns.set(node.column, list);
  }
  const order = [...columns.keys()].sort((a, b) => a - b);
  const index = new Map<string, number>();
  for (const ids of columns.values()) ids.forEach((id, i) => index.set(id, i));

  const reorder = (column: number, from: number): void => {
    const ids = columns.get(column)!;
    const keyed = ids.map((id, i) => {
      const near = neighbours.get(id)!.filter((other) => columnOf.get(other) === from);
      const mean = near.length === 0
        ? i
        : near.reduce((sum, other) => sum + index.get(other)!, 0) / near.length;
      // Scale to the column's length so nodes without neighbours keep their relative place.
      const fromLength = columns.get(from)?.length ?? 1;
      return { id, key: near.length === 0 ? mean : (mean * ids.length) / fromLength, i };
    });
    keyed.sort((a, b) => a.key - b.key || a.i - b.i);
    const sorted = keyed.map((entry) => entry.id);
    columns.set(column, sorted);
    sorted.forEach((id, i) => index.set(id, i));
  };
  for (let sweep = 0; sweep < sweeps; sweep++) {
    const isOutward = sweep % 2 === 0;
    const path = isOutward ? order : [...order].reverse();
    for (let k = 1; k < path.length; k++) reorder(path[k]!, path[k - 1]!);
  }

  const positions = new Map<string, { x: number; y: number }>();
  let right = 0;
  for (const column of order) {
    const ids = columns.get(column)!;
    const split = Math.ceil(ids.length / maxPerColumn);
    const rows = Math.ceil(ids.length / split);
    ids.forEach((id, i) => {
      const row = Math.floor(i / split);
      // "0 -" so that the first column sits at +0, not -0.
      positions.set(id, {
        x: 0 - right - (i % split) * subColumnGap,
        y: (row - (rows - 1) / 2) * rowGap,
      });
    });
    right += (split - 1) * subColumnGap + columnGap;
  }
  return positions;
}

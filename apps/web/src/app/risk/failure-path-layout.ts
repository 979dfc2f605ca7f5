import type { PathNodeDto } from '@keelson/contracts';

/** A node of the drawn failure paths, placed. */
export interface PlacedPathNode {
  id: string;
  kind: PathNodeDto['kind'];
  /** What the box says: the code, and for an item where it is held. */
  label: string;
  /** Second line: the kind in words. */
  caption: string;
  /** The supplier whose failure the paths start from. */
  isOrigin: boolean;
  x: number;
  y: number;
}

/** A drawn hop between two placed nodes. */
export interface PlacedPathEdge {
  id: string;
  x1: number;
  y1: number;
  x2: number;
  y2: number;
}

/** The failure paths laid out for the SVG. */
export interface PathLayout {
  nodes: PlacedPathNode[];
  edges: PlacedPathEdge[];
  width: number;
  height: number;
}

/** Box size and gaps of the drawing, in SVG units. */
export const PATH_BOX = { width: 140, height: 40, columnGap: 56, rowGap: 14, margin: 8 } as const;

const CAPTIONS: Record<PathNodeDto['kind'], string> = {
  supplier: 'supplier',
  item: 'part',
  product: 'product',
  plant: 'plant',
};

/** The label of a path node: items say who holds them, products at which plant. */
export function pathNodeLabel(node: PathNodeDto): string {
  if (node.kind === 'item' && node.buyer) return `${node.code} at ${node.buyer}`;
  return node.code;
}

/**
 * Lays out failure paths: each distinct node once (by id), in the column given by the path
 * (the largest when paths disagree), columns drawn right to left from the products (column 0)
 * to the supplier; inside a column in order of first appearance. One edge per distinct hop.
 */
export function layoutFailurePaths(paths: readonly { nodes: PathNodeDto[] }[]): PathLayout {
  const nodes = new Map<string, { node: PathNodeDto; column: number; order: number }>();
  const hops = new Map<string, [string, string]>();
  let order = 0;
  for (const path of paths) {
    path.nodes.forEach((node, i) => {
      const known = nodes.get(node.id);
      if (known) known.column = Math.max(known.column, node.column);
      else nodes.set(node.id, { node, column: node.column, order: order++ });
      const next = path.nodes[i + 1];
      if (next) hops.set(`${node.id}>${next.id}`, [node.id, next.id]);
    });
  }
  const maxColumn = Math.max(0, ...[...nodes.values()].map((entry) => entry.column));
  const originId = paths[0]?.nodes[0]?.id;
  const rows = new Map<number, number>();
  const { width, height, columnGap, rowGap, margin } = PATH_BOX;
  const placed = new Map<string, PlacedPathNode>();
  for (const entry of [...nodes.values()].sort((a, b) => a.order - b.order)) {
    const row = rows.get(entry.column) ?? 0;
    rows.set(entry.column, row + 1);
    placed.set(entry.node.id, {
      id: entry.node.id,
      kind: entry.node.kind,
      label: pathNodeLabel(entry.node),
      caption: entry.node.kind === 'supplier' && entry.node.tier !== null
        ? `tier ${entry.node.tier} supplier`
        : CAPTIONS[entry.node.kind],
      isOrigin: entry.node.id === originId,
      x: margin + (maxColumn - entry.column) * (width + columnGap),
      y: margin + row * (height + rowGap),
    });
  }
  const edges = [...hops.entries()].map(([id, [from, to]]) => {
    const a = placed.get(from)!;
    const b = placed.get(to)!;
    return { id, x1: a.x + width, y1: a.y + height / 2, x2: b.x, y2: b.y + height / 2 };
  });
  const tallest = Math.max(1, ...rows.values());
  return {
    nodes: [...placed.values()],
    edges,
    width: 2 * margin + (maxColumn + 1) * width + maxColumn * columnGap,
    height: 2 * margin + tallest * height + (tallest - 1) * rowGap,
  };
}

/**
 * Builds the network picture from a supply graph: the layer (column) of every node, the part a
 * plant manager may see, and either every node and edge or the grouped form (suppliers by tier
 * and country, items folded into the edges). Pure; the service caches the {@link PictureBase}
 * per network version because versions never change.
 */
import { tiers, type SupplyGraph } from '@keelson/supply-graph';
import type {
  NetworkPictureEdgeDto,
  NetworkPictureNodeDto,
} from './network-picture-dto';

/** What every request on one version shares: the graph, layers, tiers and labels. */
export interface PictureBase {
  graph: SupplyGraph;
  /** Layer per node index (see {@link nodeColumns}). */
  column: Int32Array;
  /** Tier per node index: the supplier's tier, 0 for none and for other kinds. */
  tier: Int32Array;
  /** Label per node index. */
  label: readonly string[];
}

/** What a succeeded run says about the suppliers shown. */
export interface RunMarks {
  /** Codes of single points of failure. */
  singlePoints: ReadonlySet<string>;
  /** Revenue impact by supplier code. */
  revenueImpact: ReadonlyMap<string, number>;
}

/** Nodes and edges of a picture. */
export interface PictureParts {
  nodes: NetworkPictureNodeDto[];
  edges: NetworkPictureEdgeDto[];
}

/**
 * Layer of every node: the fewest edges from it to a plant along the flow of material (plants
 * 0, products 1, their parts 2 ...), found by one breadth-first search backwards from the
 * plants, O(n + m). Nodes from which no plant is reached go one layer beyond the deepest.
 */
export function nodeColumns(graph: SupplyGraph): Int32Array {
  const column = new Int32Array(graph.n).fill(-1);
  const queue: number[] = [];
  for (const plant of graph.plantNodes) {
    column[plant] = 0;
    queue.push(plant);
  }
  let deepest = 0;
  for (let head = 0; head < queue.length; head++) {
    const v = queue[head]!;
    for (let e = graph.inOffsets[v]!; e < graph.inOffsets[v + 1]!; e++) {
      const u = graph.inSources[e]!;
      if (column[u] !== -1) continue;
      column[u] = column[v]! + 1;
      deepest = Math.max(deepest, column[u]!);
      queue.push(u);
    }
  }
  return column.map((c) => (c === -1 ? deepest + 1 : c));
}

/** The shared part of every picture of `graph`. */
export function pictureBase(graph: SupplyGraph): PictureBase {
  const tierOf = tiers(graph);
  const names = new Map<string, string>([
    ...graph.model.plants.map((p) => [`plant:${p.code}`, p.name] as const),
    ...graph.model.products.map((p) => [`product:${p.code}`, p.name] as const),
    ...graph.model.suppliers.map((s) => [`supplier:${s.code}`, s.name] as const),
  ]);
  const tier = new Int32Array(graph.n);
  const label = graph.nodes.map((node) => {
    if (node.kind === 'supplier') tier[node.index] = tierOf.get(node.code) ?? 0;
    if (node.kind === 'item') return `${node.code} at ${node.buyer}`;
    return names.get(`${node.kind}:${node.code}`) ?? node.code;
  });
  return { graph, column: nodeColumns(graph), tier, label };
}

/**
 * Which nodes a user may see: everything without a scope; for a plant manager the scoped
 * plants, what belongs to them (their products and items) and everything upstream of those,
 * that is every supplier and supplier item whose material reaches them.
 */
export function visibleNodes(base: PictureBase, scope: readonly string[] | null): Uint8Array {
  const { graph } = base;
  const visible = new Uint8Array(graph.n);
  if (scope === null) return visible.fill(1);
  const plants = new Set(scope);
  const stack: number[] = [];
  for (const node of graph.nodes) {
    const isOwn =
      (node.kind === 'plant' && plants.has(node.code)) ||
      (node.kind === 'product' && plants.has(node.buyer ?? '')) ||
      (node.kind === 'item' && node.buyerKind === 'plant' && plants.has(node.buyer ?? ''));
    if (isOwn) {
      visible[node.index] = 1;
      stack.push(node.index);
    }
  }
  while (stack.length > 0) {
    const v = stack.pop()!;
    for (let e = graph.inOffsets[v]!; e < graph.inOffsets[v + 1]!; e++) {
      const u = graph.inSources[e]!;
      if (visible[u]) continue;
      visible[u] = 1;
      stack.push(u);
    }
  }
  return visible;
}

/** Number of visible nodes and of edges between two visible nodes. */
export function visibleCounts(base: PictureBase, visible: Uint8Array): { nodes: number;
  edges: number } {
  const { graph } = base;
  let nodes = 0;
  let edges = 0;
  for (let u = 0; u < graph.n; u++) {
    if (!visible[u]) continue;
    nodes++;
    for (let e = graph.offsets[u]!; e < graph.offsets[u + 1]!; e++) {
      if (visible[graph.targets[e]!]) edges++;
    }
  }
  return { nodes, edges };
}

/** Every visible node and every edge between visible nodes, in graph order. */
export function fullPicture(base: PictureBase, visible: Uint8Array, marks: RunMarks | null):
  PictureParts {
  const { graph, column, tier, label } = base;
  const nodes: NetworkPictureNodeDto[] = [];
  const edges: NetworkPictureEdgeDto[] = [];
  for (const node of graph.nodes) {
    const u = node.index;
    if (!visible[u]) continue;
    const isSupplier = node.kind === 'supplier';
    nodes.push({
      id: node.id,
      kind: node.kind,
      code: node.code,
      label: label[u]!,
      tier: isSupplier && tier[u]! > 0 ? tier[u]! : null,
      column: column[u]!,
      isSinglePoint: isSupplier && (marks?.singlePoints.has(node.code) ?? false),
      revenueImpact: isSupplier ? (marks?.revenueImpact.get(node.code) ?? null) : null,
    });
    for (let e = graph.offsets[u]!; e < graph.offsets[u + 1]!; e++) {
      const v = graph.targets[e]!;
      if (visible[v]) edges.push({ source: node.id, target: graph.nodes[v]!.id });
    }
  }
  return { nodes, edges };
}

function groupId(tier: number, country: string): string {
  return `group:${tier > 0 ? tier : 'none'}:${country}`;
}

/**
 * The grouped picture: plants and products as themselves, one node per (tier, country) of the
 * visible suppliers with its count and single points, and one edge per pair of groups that
 * some supplier-to-buyer link joins, counting those links. A link is a supplier (or product)
 * reaching a supplier (or product, or plant) through item nodes only. Links inside one group
 * are left out (a loop says nothing at this scale). Columns: plants 0, products 1, tier k at
 * k + 1, suppliers without a tier one beyond the deepest tier.
 */
export function aggregatedPicture(
  base: PictureBase,
  visible: Uint8Array,
  marks: RunMarks | null,
): PictureParts {
  const { graph, tier, label } = base;
  let deepestTier = 0;
  for (const s of graph.supplierNodes) {
    if (visible[s]) deepestTier = Math.max(deepestTier, tier[s]!);
  }
  const groupOf = new Array<string | null>(graph.n).fill(null);
  const groups = new Map<string, NetworkPictureNodeDto>();
  const nodes: NetworkPictureNodeDto[] = [];
  for (const node of graph.nodes) {
    const u = node.index;
    if (!visible[u] || node.kind === 'item') continue;
    if (node.kind !== 'supplier') {
      groupOf[u] = node.id;
      nodes.push({ id: node.id, kind: node.kind, code: node.code, label: label[u]!, tier: null,
        column: node.kind === 'plant' ? 0 : 1, isSinglePoint: false, revenueImpact: null });
      continue;
    }
    const country = graph.supplierRecords[graph.ordinal[u]!]!.country;
    const id = groupId(tier[u]!, country);
    groupOf[u] = id;
    let group = groups.get(id);
    if (!group) {
      group = { id, kind: 'supplierGroup', code: country,
        label: `${tier[u]! > 0 ? `Tier ${tier[u]}` : 'No tier'} · ${country}`,
        tier: tier[u]! > 0 ? tier[u]! : null, column: (tier[u]! || deepestTier + 1) + 1,
        isSinglePoint: false, revenueImpact: marks ? 0 : null, count: 0, singlePoints: 0 };
      groups.set(id, group);
    }
    group.count! += 1;
    if (marks?.singlePoints.has(node.code)) {
      group.singlePoints! += 1;
      group.isSinglePoint = true;
    }
    if (marks && group.revenueImpact !== null) {
      group.revenueImpact += marks.revenueImpact.get(node.code) ?? 0;
    }
  }
  nodes.push(...[...groups.values()].sort((a, b) => a.column - b.column ||
    a.code.localeCompare(b.code)));
  return { nodes, edges: groupEdges(graph, visible, groupOf) };
}

/** Edges between groups with their link counts (see {@link aggregatedPicture}). */
function groupEdges(
  graph: SupplyGraph,
  visible: Uint8Array,
  groupOf: readonly (string | null)[],
): NetworkPictureEdgeDto[] {
  const counts = new Map<string, NetworkPictureEdgeDto>();
  const seen = new Int32Array(graph.n).fill(-1);
  for (let u = 0; u < graph.n; u++) {
    const from = groupOf[u];
    if (from === null || from === undefined) continue;
    // Depth-first through visible items; each reached non-item node is one link from u.
    const stack = [u];
    seen[u] = u;
    while (stack.length > 0) {
      const v = stack.pop()!;
      for (let e = graph.offsets[v]!; e < graph.offsets[v + 1]!; e++) {
        const w = graph.targets[e]!;
        if (!visible[w] || seen[w] === u) continue;
        seen[w] = u;
        const to = groupOf[w];
        if (to === null || to === undefined) {
          stack.push(w);
          continue;
        }
        if (to === from) continue;
        const key = `${from}\u0000${to}`;
        const edge = counts.get(key) ?? { source: from, target: to, count: 0 };
        edge.count! += 1;
        counts.set(key, edge);
      }
    }
  }
  return [...counts.values()];
}

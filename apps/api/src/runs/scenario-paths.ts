/**
 * One failure path per product a failure set loses. Where one failed supplier loses the
 * product on its own, the path is the engine's (`failurePaths`, fewest hops through nodes its
 * failure takes down). A product lost only because several suppliers fail together (say both
 * sources of a dual-sourced item) has no such path; for it we walk back from the product
 * through the nodes the whole set takes down, breadth first, to the nearest failed supplier.
 */
import type { PathNodeDto } from '@keelson/contracts';
import {
  failurePaths,
  propagateFailure,
  type FailurePath,
  type SupplyGraph,
} from '@keelson/supply-graph';

/** A lost product and the path that brings the failure to it. */
export interface ProductPath {
  product: string;
  nodes: PathNodeDto[];
}

/** The DTO of an engine path. */
export function toProductPath(path: FailurePath): ProductPath {
  return { product: path.productCode, nodes: path.nodes.map((node) => ({ ...node })) };
}

/**
 * Paths for `productsLost` under the failure of `failed` (every code a supplier of the graph),
 * in the order of `productsLost`.
 */
export function scenarioPaths(
  graph: SupplyGraph,
  tiers: ReadonlyMap<string, number | null>,
  failed: readonly string[],
  productsLost: readonly string[],
): ProductPath[] {
  const found = new Map<string, ProductPath>();
  for (const supplier of failed) {
    const remaining = productsLost.filter((code) => !found.has(code));
    if (remaining.length === 0) break;
    for (const path of failurePaths(graph, supplier, remaining)) {
      found.set(path.productCode, toProductPath(path));
    }
  }
  const missing = productsLost.filter((code) => !found.has(code));
  if (missing.length > 0) {
    const down = propagateFailure(graph, failed);
    for (const code of missing) {
      const path = jointPath(graph, tiers, down, new Set(failed), code);
      if (path) found.set(code, path);
    }
  }
  return productsLost.flatMap((code) => found.get(code) ?? []);
}

/**
 * Breadth-first search backwards from a product through newly down nodes to a failed supplier
 * (a supplier that is down only because of its own sources is passed through).
 */
function jointPath(
  graph: SupplyGraph,
  tiers: ReadonlyMap<string, number | null>,
  down: Uint8Array,
  failed: ReadonlySet<string>,
  productCode: string,
): ProductPath | null {
  const p = graph.productCodes.indexOf(productCode);
  if (p === -1) return null;
  const start = graph.productNodes[p]!;
  const isDown = (v: number) => down[v] === 1 && graph.baselineDown[v] === 0;
  const previous = new Int32Array(graph.n).fill(-1);
  previous[start] = start;
  const queue = [start];
  for (let head = 0; head < queue.length; head++) {
    const v = queue[head]!;
    const data = graph.nodes[v]!;
    if (data.kind === 'supplier' && failed.has(data.code)) {
      // Walk forward from the supplier to the product through `previous`.
      const nodes: PathNodeDto[] = [];
      for (let u = v; ; u = previous[u]!) {
        nodes.push(pathNode(graph, tiers, u));
        if (u === start) break;
      }
      const length = nodes.length;
      nodes.forEach((node, i) => (node.column = length - 1 - i));
      return { product: productCode, nodes };
    }
    for (let e = graph.inOffsets[v]!; e < graph.inOffsets[v + 1]!; e++) {
      const u = graph.inSources[e]!;
      if (previous[u] !== -1 || !isDown(u)) continue;
      previous[u] = v;
      queue.push(u);
    }
  }
  return null;
}

function pathNode(
  graph: SupplyGraph,
  tiers: ReadonlyMap<string, number | null>,
  index: number,
): PathNodeDto {
  const data = graph.nodes[index]!;
  return {
    id: data.id,
    kind: data.kind,
    code: data.code,
    buyer: data.buyer,
    tier: data.kind === 'supplier' ? (tiers.get(data.code) ?? null) : null,
    column: 0,
  };
}

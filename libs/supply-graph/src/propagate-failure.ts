/**
 * Failure propagation (spec section 3), the plain reference implementation: the least set of
 * down nodes closed under the rules, found with a work list. A node goes down only when a rule
 * forces it, so a supplier cycle that no failure reaches stays up (least fixed point).
 * O(n + m) per call. `allSingleImpacts` computes the same sets 32 at a time.
 */
import { UnknownSupplierError } from './errors';
import { NODE_RULE, type SupplyGraph } from './supply-graph';

/** The parts of the graph propagation reads. */
export type PropagationIndex = Pick<
  SupplyGraph,
  'n' | 'offsets' | 'targets' | 'inOffsets' | 'rule'
>;

/**
 * Down flags (1 = down) when the nodes in `seeds` fail: rule 1 of spec 3 for the seeds, rules
 * 2-5 through {@link NODE_RULE}. A bought item with no qualified source is down from the start.
 */
export function propagateFromNodes(index: PropagationIndex, seeds: ArrayLike<number>): Uint8Array {
  const { n, offsets, targets, inOffsets, rule } = index;
  const down = new Uint8Array(n);
  // For `all` nodes: qualified sources still up. Sources are distinct (edges are deduplicated).
  const upInputs = new Int32Array(n);
  const queue = new Int32Array(n);
  let head = 0;
  let tail = 0;
  for (let v = 0; v < n; v++) {
    if (rule[v] !== NODE_RULE.all) continue;
    upInputs[v] = inOffsets[v + 1]! - inOffsets[v]!;
    if (upInputs[v] === 0) {
      down[v] = 1;
      queue[tail++] = v;
    }
  }
  for (let i = 0; i < seeds.length; i++) {
    const s = seeds[i]!;
    if (down[s] === 0) {
      down[s] = 1;
      queue[tail++] = s;
    }
  }
  while (head < tail) {
    const u = queue[head++]!;
    for (let e = offsets[u]!; e < offsets[u + 1]!; e++) {
      const v = targets[e]!;
      if (down[v] === 1) continue;
      const r = rule[v];
      if (r === NODE_RULE.any || (r === NODE_RULE.all && --upInputs[v]! === 0)) {
        down[v] = 1;
        queue[tail++] = v;
      }
    }
  }
  return down;
}

/**
 * Supplier nodes of the given codes, in the order given, without repeats. Throws
 * {@link UnknownSupplierError} listing every code that is not a supplier.
 */
export function supplierNodesFor(graph: SupplyGraph, codes: Iterable<string>): number[] {
  const seen = new Set<string>();
  const nodes: number[] = [];
  const unknown: string[] = [];
  for (const code of codes) {
    if (seen.has(code)) continue;
    seen.add(code);
    const ordinal = graph.supplierOrdinalOf.get(code);
    if (ordinal === undefined) unknown.push(code);
    else nodes.push(graph.supplierNodes[ordinal]!);
  }
  if (unknown.length > 0) throw new UnknownSupplierError(unknown);
  return nodes;
}

/**
 * Down flags per node (index order of `graph.nodes`) when the suppliers `failedCodes` fail.
 * An empty list gives the baseline. Throws {@link UnknownSupplierError} for unknown codes.
 */
export function propagateFailure(graph: SupplyGraph, failedCodes: Iterable<string>): Uint8Array {
  return propagateFromNodes(graph, supplierNodesFor(graph, failedCodes));
}

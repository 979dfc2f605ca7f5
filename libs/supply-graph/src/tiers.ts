/**
 * Supplier tiers (spec section 2, rule 8.13): 1 for a supplier with a qualified Sourcing row
 * whose buyer is a plant; k + 1 for one that sells (qualified) to a supplier of tier k; the
 * minimum over all paths, found by breadth-first search from tier 1. A supplier no plant depends
 * on has tier `null`. O(n + m).
 */
import { NODE_KIND, type SupplyGraph } from './supply-graph';

/** Tier per supplier ordinal (0 = no tier), as a typed array for the hot paths. */
export function tierArray(graph: SupplyGraph): Int32Array {
  const { nodes, offsets, targets, inOffsets, inSources, kind, supplierNodes } = graph;
  const tier = new Int32Array(supplierNodes.length);
  const queue: number[] = [];
  supplierNodes.forEach((s, ordinal) => {
    for (let e = offsets[s]!; e < offsets[s + 1]!; e++) {
      if (nodes[targets[e]!]!.buyerKind === 'plant') {
        tier[ordinal] = 1;
        queue.push(ordinal);
        return;
      }
    }
  });
  for (let head = 0; head < queue.length; head++) {
    const ordinal = queue[head]!;
    const buyer = supplierNodes[ordinal]!;
    // Items the buyer requires, then the qualified sources of each.
    for (let e = inOffsets[buyer]!; e < inOffsets[buyer + 1]!; e++) {
      const item = inSources[e]!;
      for (let f = inOffsets[item]!; f < inOffsets[item + 1]!; f++) {
        const seller = inSources[f]!;
        if (kind[seller] !== NODE_KIND.supplier) continue;
        const sellerOrdinal = graph.ordinal[seller]!;
        if (tier[sellerOrdinal] !== 0) continue;
        tier[sellerOrdinal] = tier[ordinal]! + 1;
        queue.push(sellerOrdinal);
      }
    }
  }
  return tier;
}

/** Tier of every supplier by code (`null`: no plant depends on it), in code-point order. */
export function tiers(graph: SupplyGraph): Map<string, number | null> {
  const tier = tierArray(graph);
  return new Map(graph.supplierCodes.map((code, ordinal) => [code, tier[ordinal] || null]));
}

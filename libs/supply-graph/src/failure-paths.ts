/**
 * Failure paths: for each product a supplier's failure loses, one chain of down nodes from the
 * supplier to the product, found with ngraph.path (A* without heuristic, i.e. fewest hops) on the
 * supply graph with every node that is not newly down blocked. "Newly down" excludes baseline
 * failures, so the path shows how this supplier's failure travels.
 */
import { aStar } from 'ngraph.path';
import { compareCodePoints } from './code-order';
import { propagateFromNodes, supplierNodesFor } from './propagate-failure';
import type { SupplyGraph, SupplyNodeData, SupplyNodeKind } from './supply-graph';
import { tierArray } from './tiers';

/** One node on a failure path. */
export interface PathNode {
  /** Node id, e.g. `item:I1@P1`. */
  id: string;
  kind: SupplyNodeKind;
  code: string;
  /** The buyer of an item or the plant of a product; null otherwise. */
  buyer: string | null;
  /** Tier of a supplier node (null without one, and for other kinds). */
  tier: number | null;
  /** Column for drawing: 0 at the product, counting up towards the supplier. */
  column: number;
}

/** A lost product and the path that brings the failure to it. */
export interface FailurePath {
  productCode: string;
  /** From the failed supplier (first) to the product (last). */
  nodes: PathNode[];
}

/**
 * One failure path per product lost when `supplierCode` fails alone (optionally only for
 * `productCodes`), sorted by product code. Throws `UnknownSupplierError` for an unknown code.
 */
export function failurePaths(
  graph: SupplyGraph,
  supplierCode: string,
  productCodes?: readonly string[],
): FailurePath[] {
  const [source] = supplierNodesFor(graph, [supplierCode]);
  const down = propagateFromNodes(graph, [source!]);
  const newlyDown = (index: number) => down[index] === 1 && graph.baselineDown[index] === 0;
  const wanted = productCodes ? new Set(productCodes) : undefined;
  const finder = aStar<SupplyNodeData, unknown>(graph.network, {
    oriented: true,
    blocked: (a, b) => !newlyDown(a.data.index) || !newlyDown(b.data.index),
  });
  const tier = tierArray(graph);
  const paths: FailurePath[] = [];
  graph.productNodes.forEach((productNode, p) => {
    const code = graph.productCodes[p]!;
    if (!newlyDown(productNode) || (wanted && !wanted.has(code))) return;
    const found = finder.find(graph.nodes[source!]!.id, graph.nodes[productNode]!.id);
    // ngraph.path returns target first; a one-node answer means no path was found.
    if (found.length < 2 || found[found.length - 1]!.id !== graph.nodes[source!]!.id) {
      throw new Error(`failurePaths: no down path from ${supplierCode} to product ${code}`);
    }
    const nodes = found.map((node, column): PathNode => {
      const data = node.data;
      return {
        id: data.id,
        kind: data.kind,
        code: data.code,
        buyer: data.buyer,
        tier: data.kind === 'supplier' ? tier[graph.ordinal[data.index]!]! || null : null,
        column,
      };
    });
    paths.push({ productCode: code, nodes: nodes.reverse() });
  });
  return paths.sort((a, b) => compareCodePoints(a.productCode, b.productCode));
}

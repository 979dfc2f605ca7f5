/**
 * The supply graph of spec section 2 as data: node descriptors, node ids, and the compact index
 * (CSR arrays, kinds, rules, per-product bill-of-materials closures) that the hot loops use.
 * Built by `buildSupplyGraph`; never mutated afterwards.
 */
import type { Graph } from 'ngraph.graph';
import type { Supplier, SupplyModel } from '@keelson/contracts';
import type { CsrGraph } from './csr-graph';

/** The four kinds of node. */
export type SupplyNodeKind = 'plant' | 'product' | 'item' | 'supplier';

/** Kind codes stored in {@link SupplyGraph.kind}. */
export const NODE_KIND = { plant: 0, product: 1, item: 2, supplier: 3 } as const;

/**
 * How a node's down state follows from its inputs (spec section 3), stored in
 * {@link SupplyGraph.rule}: `never` for plants (the contract defines no plant state), `any` for
 * suppliers, made items and products (down if any input is down), `all` for bought items (down
 * if every qualified source is down; with no source at all, down from the start).
 */
export const NODE_RULE = { never: 0, any: 1, all: 2 } as const;

/** What a node stands for. Shared with the ngraph.graph node's `data`. */
export interface SupplyNodeData {
  /** Position in the compact index. */
  readonly index: number;
  /** Node id, e.g. `plant:P1`, `product:F1`, `item:I1@P1`, `supplier:S1`. */
  readonly id: string;
  readonly kind: SupplyNodeKind;
  /** The plant, product, item or supplier code. */
  readonly code: string;
  /** For items: the buyer (a plant or supplier code); for products: their plant; else null. */
  readonly buyer: string | null;
  /** For items: whether the buyer is a plant or a supplier; else null. */
  readonly buyerKind: 'plant' | 'supplier' | null;
  /** An item with BOM children at a plant: made there. */
  readonly isMade: boolean;
  /** An item bought by its buyer (every item node that is not made). */
  readonly isBought: boolean;
}

/** The supply graph: a directed {@link CsrGraph} (edges follow material) plus the index. */
export interface SupplyGraph extends CsrGraph {
  readonly directed: true;
  /** The model the graph was built from (not copied; do not mutate it). */
  readonly model: SupplyModel;
  /** Node descriptors in index order. */
  readonly nodes: readonly SupplyNodeData[];
  /** Index of each node id. */
  readonly indexOf: ReadonlyMap<string, number>;
  /** Number of directed edges (each counted once). */
  readonly edgeCount: number;
  /** In-neighbours as CSR: `inSources[inOffsets[v] .. inOffsets[v+1]-1]`. */
  readonly inOffsets: Int32Array;
  readonly inSources: Int32Array;
  /** {@link NODE_KIND} code per node. */
  readonly kind: Uint8Array;
  /** {@link NODE_RULE} code per node. */
  readonly rule: Uint8Array;
  /** Ordinal of plants, products and suppliers among their kind (code order); -1 for items. */
  readonly ordinal: Int32Array;
  /** Weeks of cover of bought (item, plant) nodes from Stock; 0 elsewhere and by default. */
  readonly coverWeeks: Float64Array;

  /** Supplier codes in code-point order; a supplier's ordinal is its position here. */
  readonly supplierCodes: readonly string[];
  /** Supplier records by ordinal. */
  readonly supplierRecords: readonly Supplier[];
  /** Node of each supplier ordinal. */
  readonly supplierNodes: Int32Array;
  /** Recovery weeks (time to recover) per supplier ordinal. */
  readonly recoveryWeeks: Float64Array;
  /** 1 for suppliers with no Sourcing row as buyer (betweenness sources, spec 8.11). */
  readonly requiresNothing: Uint8Array;
  /** Supplier ordinal of each supplier code. */
  readonly supplierOrdinalOf: ReadonlyMap<string, number>;

  /** Product codes in code-point order; a product's ordinal is its position here. */
  readonly productCodes: readonly string[];
  /** Node of each product ordinal. */
  readonly productNodes: Int32Array;
  /** Weekly revenue per product ordinal. */
  readonly weeklyRevenue: Float64Array;
  /** Plant code per product ordinal. */
  readonly productPlants: readonly string[];
  /**
   * The bought (item, plant) nodes of each product's BOM closure, sorted by weeks of cover
   * (ascending, then node index): product p's are `closureNodes[closureOffsets[p] ..]`.
   */
  readonly closureOffsets: Int32Array;
  readonly closureNodes: Int32Array;

  /** Plant codes in code-point order and their nodes. */
  readonly plantCodes: readonly string[];
  readonly plantNodes: Int32Array;

  /** Down flags with no failure at all (the baseline of spec 4: unsourced items and after). */
  readonly baselineDown: Uint8Array;

  /** The same graph as an ngraph.graph instance (node data = {@link SupplyNodeData}), built on
   * first use and cached: the analysis itself runs on the typed arrays. */
  readonly network: Graph<SupplyNodeData>;
}

/** Escapes `%` and `@` so that `item:<item>@<buyer>` ids stay unambiguous for any codes. */
function escapeCode(code: string): string {
  return code.replace(/[%@]/g, (ch) => (ch === '%' ? '%25' : '%40'));
}

/** Node id of a plant. */
export function plantId(code: string): string {
  return `plant:${escapeCode(code)}`;
}

/** Node id of a product. */
export function productId(code: string): string {
  return `product:${escapeCode(code)}`;
}

/** Node id of a supplier. */
export function supplierId(code: string): string {
  return `supplier:${escapeCode(code)}`;
}

/** Node id of item `itemCode` held by `buyerCode` (a plant or a supplier). */
export function itemId(itemCode: string, buyerCode: string): string {
  return `item:${escapeCode(itemCode)}@${escapeCode(buyerCode)}`;
}

/**
 * Builds the supply graph of spec section 2 with the node and edge rules of 8.11-8.13:
 * nodes for every plant, product and supplier, every (item, buyer) of a Sourcing row (qualified
 * or not) and every (item, plant) reached through the BOM of the plant's products; edges from
 * qualified rows only. O(n + m) plus sorting of codes and closures.
 */
import createGraph, { type Graph } from 'ngraph.graph';
import type { SupplyModel } from '@keelson/contracts';
import { compareCodePoints } from './code-order';
import { csrFromArrays, reverseCsr } from './csr-graph';
import { propagateFromNodes } from './propagate-failure';
import {
  NODE_KIND,
  NODE_RULE,
  itemId,
  plantId,
  productId,
  supplierId,
  type SupplyGraph,
  type SupplyNodeData,
  type SupplyNodeKind,
} from './supply-graph';

/**
 * The supply graph of a model. The model is assumed valid (the workbook library checks it);
 * references that would make the graph meaningless (a product of an unknown plant, a Sourcing
 * row naming an unknown buyer or supplier) throw an error naming the row.
 */
export function buildSupplyGraph(model: SupplyModel): SupplyGraph {
  const nodes: SupplyNodeData[] = [];
  const indexOf = new Map<string, number>();
  const from: number[] = [];
  const to: number[] = [];
  const addNode = (data: Omit<SupplyNodeData, 'index'>): number => {
    const index = nodes.length;
    nodes.push({ ...data, index });
    indexOf.set(data.id, index);
    return index;
  };
  const plain = (kind: SupplyNodeKind, id: string, code: string, buyer: string | null = null) =>
    addNode({ id, kind, code, buyer, buyerKind: null, isMade: false, isBought: false });

  const plantCodes = model.plants.map((p) => p.code).sort(compareCodePoints);
  const plantNodes = Int32Array.from(plantCodes, (code) => plain('plant', plantId(code), code));
  const plantSet = new Set(plantCodes);
  const plantNodeOf = new Map(plantCodes.map((code, i) => [code, plantNodes[i]!] as const));
  const products = [...model.products].sort((a, b) => compareCodePoints(a.code, b.code));
  const productNodes = Int32Array.from(products, (product) => {
    if (!plantSet.has(product.plantCode)) {
      throw new Error(
        `Products${rowText(product.row)}: product ${product.code} names unknown plant ` +
          `${product.plantCode}`,
      );
    }
    return plain('product', productId(product.code), product.code, product.plantCode);
  });
  const suppliers = [...model.suppliers].sort((a, b) => compareCodePoints(a.code, b.code));
  const supplierNodes = Int32Array.from(suppliers, (s) =>
    plain('supplier', supplierId(s.code), s.code),
  );
  const supplierOrdinalOf = new Map(suppliers.map((s, ordinal) => [s.code, ordinal] as const));
  const productSet = new Set(products.map((p) => p.code));

  const children = new Map<string, string[]>();
  for (const line of model.bom) {
    const list = children.get(line.parentCode) ?? [];
    if (!list.includes(line.childCode)) list.push(line.childCode);
    children.set(line.parentCode, list);
  }
  const hasChildren = (item: string) => children.has(item) && !productSet.has(item);

  const itemNode = (item: string, buyer: string, buyerKind: 'plant' | 'supplier'): number => {
    const id = itemId(item, buyer);
    const existing = indexOf.get(id);
    if (existing !== undefined) return existing;
    const isMade = buyerKind === 'plant' && hasChildren(item);
    const isBought = !isMade;
    const index = addNode({ id, kind: 'item', code: item, buyer, buyerKind, isMade, isBought });
    if (buyerKind === 'supplier') {
      from.push(index);
      to.push(supplierNodes[supplierOrdinalOf.get(buyer)!]!);
    }
    return index;
  };

  const requiresNothing = new Uint8Array(suppliers.length).fill(1);
  for (const row of model.sourcing) {
    const where = `Sourcing${rowText(row.row)}`;
    const supplierOrdinal = supplierOrdinalOf.get(row.supplierCode);
    if (supplierOrdinal === undefined) {
      throw new Error(`${where}: supplier_code ${row.supplierCode} is not a supplier`);
    }
    const buyerOrdinal = supplierOrdinalOf.get(row.buyerCode);
    const buyerKind = plantSet.has(row.buyerCode)
      ? 'plant'
      : buyerOrdinal !== undefined
        ? 'supplier'
        : null;
    if (buyerKind === null) {
      throw new Error(`${where}: buyer_code ${row.buyerCode} is neither a plant nor a supplier`);
    }
    if (buyerOrdinal !== undefined) requiresNothing[buyerOrdinal] = 0;
    const item = itemNode(row.itemCode, row.buyerCode, buyerKind);
    if (row.isQualified) {
      from.push(supplierNodes[supplierOrdinal]!);
      to.push(item);
    }
  }

  // BOM at each plant: (child, plant) -> (parent, plant) from the plant's products downwards.
  const expanded = new Set<number>();
  products.forEach((product, ordinal) => {
    const stack: Array<[string, number]> = [[product.code, productNodes[ordinal]!]];
    while (stack.length > 0) {
      const [parentCode, parentNode] = stack.pop()!;
      for (const child of children.get(parentCode) ?? []) {
        const childNode = itemNode(child, product.plantCode, 'plant');
        from.push(childNode);
        to.push(parentNode);
        if (nodes[childNode]!.isMade && !expanded.has(childNode)) {
          expanded.add(childNode);
          stack.push([child, childNode]);
        }
      }
    }
    from.push(productNodes[ordinal]!);
    to.push(plantNodeOf.get(product.plantCode)!);
  });

  const n = nodes.length;
  const out = csrFromArrays(n, Int32Array.from(from), Int32Array.from(to), true);
  const incoming = reverseCsr(out);
  const kind = new Uint8Array(n);
  const rule = new Uint8Array(n);
  for (const node of nodes) {
    kind[node.index] = NODE_KIND[node.kind];
    rule[node.index] =
      node.kind === 'plant' ? NODE_RULE.never : node.isBought ? NODE_RULE.all : NODE_RULE.any;
  }
  const ordinal = new Int32Array(n).fill(-1);
  plantNodes.forEach((node, i) => (ordinal[node] = i));
  productNodes.forEach((node, i) => (ordinal[node] = i));
  supplierNodes.forEach((node, i) => (ordinal[node] = i));
  const coverWeeks = new Float64Array(n);
  for (const row of model.stock) {
    const index = indexOf.get(itemId(row.itemCode, row.plantCode));
    // Stock of made items is ignored (spec 8.14); rows for items a plant does not use too.
    if (index !== undefined && nodes[index]!.isBought) coverWeeks[index] = row.weeksOfCover;
  }
  const { closureOffsets, closureNodes } = bomClosures(productNodes, incoming, nodes, coverWeeks);
  const baselineDown = propagateFromNodes(
    { n, offsets: out.offsets, targets: out.targets, inOffsets: incoming.offsets, rule },
    [],
  );

  let network: Graph<SupplyNodeData> | undefined;
  return {
    n,
    directed: true,
    offsets: out.offsets,
    targets: out.targets,
    model,
    nodes,
    indexOf,
    edgeCount: out.targets.length,
    inOffsets: incoming.offsets,
    inSources: incoming.targets,
    kind,
    rule,
    ordinal,
    coverWeeks,
    supplierCodes: suppliers.map((s) => s.code),
    supplierRecords: suppliers,
    supplierNodes,
    recoveryWeeks: Float64Array.from(suppliers, (s) => s.recoveryWeeks),
    requiresNothing,
    supplierOrdinalOf,
    productCodes: products.map((p) => p.code),
    productNodes,
    weeklyRevenue: Float64Array.from(products, (p) => p.weeklyRevenue),
    productPlants: products.map((p) => p.plantCode),
    closureOffsets,
    closureNodes,
    plantCodes,
    plantNodes,
    baselineDown,
    get network() {
      network ??= buildNetwork(nodes, out.offsets, out.targets);
      return network;
    },
  };
}

function rowText(row: number | undefined): string {
  return row === undefined ? '' : ` row ${row}`;
}

/** Bought items in each product's BOM closure (walking in-edges through items only). */
function bomClosures(
  productNodes: Int32Array,
  incoming: { offsets: Int32Array; targets: Int32Array },
  nodes: readonly SupplyNodeData[],
  coverWeeks: Float64Array,
): { closureOffsets: Int32Array; closureNodes: Int32Array } {
  const mark = new Int32Array(nodes.length).fill(-1);
  const closureOffsets = new Int32Array(productNodes.length + 1);
  const collected: number[] = [];
  productNodes.forEach((productNode, ordinal) => {
    const stack = [productNode];
    const bought: number[] = [];
    while (stack.length > 0) {
      const v = stack.pop()!;
      for (let e = incoming.offsets[v]!; e < incoming.offsets[v + 1]!; e++) {
        const u = incoming.targets[e]!;
        const node = nodes[u]!;
        if (node.kind !== 'item' || mark[u] === ordinal) continue;
        mark[u] = ordinal;
        if (node.isBought) bought.push(u);
        else stack.push(u);
      }
    }
    bought.sort((a, b) => coverWeeks[a]! - coverWeeks[b]! || a - b);
    for (const u of bought) collected.push(u);
    closureOffsets[ordinal + 1] = collected.length;
  });
  return { closureOffsets, closureNodes: Int32Array.from(collected) };
}

function buildNetwork(
  nodes: readonly SupplyNodeData[],
  offsets: Int32Array,
  targets: Int32Array,
): Graph<SupplyNodeData> {
  const graph = createGraph<SupplyNodeData>();
  for (const node of nodes) graph.addNode(node.id, node);
  for (let u = 0; u < nodes.length; u++) {
    for (let e = offsets[u]!; e < offsets[u + 1]!; e++) {
      graph.addLink(nodes[u]!.id, nodes[targets[e]!]!.id);
    }
  }
  return graph;
}

/**
 * The supply graph of spec section 2 and rules 8.11-8.13, checked on small models written out by
 * hand in each test (expected nodes and edges read off the spec).
 */
import { describe, expect, it } from 'vitest';
import { buildSupplyGraph } from './build-supply-graph';
import { NODE_RULE, itemId, type SupplyGraph } from './supply-graph';
import { tiers } from './tiers';
import { compactModel } from './testing/compact-model';

function edgesOf(graph: SupplyGraph): string[] {
  const edges: string[] = [];
  for (let u = 0; u < graph.n; u++) {
    for (let e = graph.offsets[u]!; e < graph.offsets[u + 1]!; e++) {
      edges.push(`${graph.nodes[u]!.id} -> ${graph.nodes[graph.targets[e]!]!.id}`);
    }
  }
  return edges.sort();
}

const model = compactModel({
  plants: ['P1'],
  products: [['F1', 'P1', 100]],
  bom: [['F1', 'A1'], ['A1', 'I1'], ['F1', 'I2'], ['F1', 'I9']],
  suppliers: ['S1', 'S2', 'S3', 'S4'],
  sourcing: [
    ['P1', 'I1', 'S1'],
    ['P1', 'I2', 'S2', false],
    ['S1', 'C1', 'S3'],
    ['S3', 'C2', 'S4', false],
    ['P1', 'I7', 'S4'],
  ],
  stock: [['P1', 'I1', 3], ['P1', 'A1', 9], ['P1', 'I5', 4]],
});

describe('buildSupplyGraph', () => {
  const graph = buildSupplyGraph(model);

  it('has a node per plant, product, supplier and (item, buyer), with spec-style ids', () => {
    expect(graph.nodes.map((node) => node.id).sort()).toEqual(
      [
        'plant:P1', 'product:F1', 'supplier:S1', 'supplier:S2', 'supplier:S3', 'supplier:S4',
        'item:I1@P1', 'item:I2@P1', 'item:C1@S1', 'item:C2@S3', 'item:I7@P1', 'item:A1@P1',
        'item:I9@P1',
      ].sort(),
    );
  });
  it('draws edges from qualified rows, requirements, BOM at the plant and product to plant', () => {
    expect(edgesOf(graph)).toEqual(
      [
        'supplier:S1 -> item:I1@P1',
        'supplier:S3 -> item:C1@S1',
        'item:C1@S1 -> supplier:S1',
        'item:C2@S3 -> supplier:S3',
        'supplier:S4 -> item:I7@P1',
        'item:I1@P1 -> item:A1@P1',
        'item:A1@P1 -> product:F1',
        'item:I2@P1 -> product:F1',
        'item:I9@P1 -> product:F1',
        'product:F1 -> plant:P1',
      ].sort(),
    );
  });
  it('marks made and bought items and their rules (8.12: a reached leaf is bought)', () => {
    const node = (id: string) => graph.nodes[graph.indexOf.get(id)!]!;
    expect(node('item:A1@P1').isMade).toBe(true);
    expect(graph.rule[graph.indexOf.get('item:A1@P1')!]).toBe(NODE_RULE.any);
    expect(node('item:I9@P1').isBought).toBe(true);
    expect(graph.rule[graph.indexOf.get('item:I9@P1')!]).toBe(NODE_RULE.all);
    expect(graph.rule[graph.indexOf.get('plant:P1')!]).toBe(NODE_RULE.never);
  });
  it('puts items with only unqualified rows and unsourced leaves down at baseline', () => {
    const down = (id: string) => graph.baselineDown[graph.indexOf.get(id)!];
    expect(down('item:I2@P1')).toBe(1);
    expect(down('item:I9@P1')).toBe(1);
    expect(down('item:C2@S3')).toBe(1);
    expect(down('supplier:S3')).toBe(1);
    expect(down('supplier:S1')).toBe(1);
    expect(down('product:F1')).toBe(1);
    expect(down('supplier:S4')).toBe(0);
  });
  it('takes stock of bought items only and ignores made items and unused rows (8.8, 8.14)', () => {
    expect(graph.coverWeeks[graph.indexOf.get('item:I1@P1')!]).toBe(3);
    expect(graph.coverWeeks[graph.indexOf.get('item:A1@P1')!]).toBe(0);
    expect(graph.indexOf.has('item:I5@P1')).toBe(false);
  });
  it('lists the bought items of each BOM closure sorted by cover', () => {
    const closure = graph.closureNodes.slice(graph.closureOffsets[0], graph.closureOffsets[1]);
    expect(Array.from(closure, (v) => graph.nodes[v]!.id)).toEqual(
      ['item:I2@P1', 'item:I9@P1', 'item:I1@P1'],
    );
  });
  it('takes betweenness sources as suppliers with no Sourcing row as buyer (8.11)', () => {
    const sources = graph.supplierCodes.filter((_, i) => graph.requiresNothing[i] === 1);
    expect(sources).toEqual(['S2', 'S4']);
  });
  it('escapes @ and % so that item ids stay unambiguous', () => {
    expect(itemId('A@B', 'C')).not.toBe(itemId('A', 'B@C'));
    expect(itemId('I1', 'P1')).toBe('item:I1@P1');
    expect(itemId('50%', 'P1')).toBe('item:50%25@P1');
  });
  it('builds the same graph as an ngraph.graph instance on first use', () => {
    expect(graph.network.getNodesCount()).toBe(graph.n);
    expect(graph.network.getLinksCount()).toBe(graph.edgeCount);
    expect(graph.network.getNode('item:I1@P1')?.data.code).toBe('I1');
    expect(graph.network).toBe(graph.network);
  });
  it('names the row of a Sourcing buyer that is neither a plant nor a supplier', () => {
    const bad = compactModel({
      plants: ['P1'], products: [], bom: [], suppliers: ['S1'], sourcing: [['X9', 'I1', 'S1']],
    });
    expect(() => buildSupplyGraph(bad)).toThrow(
      /Sourcing row 2: buyer_code X9 is neither a plant nor a supplier/,
    );
  });
  it('names the product whose plant is unknown', () => {
    const bad = compactModel({
      plants: [], products: [['F1', 'P9', 1]], bom: [], suppliers: [], sourcing: [],
    });
    expect(() => buildSupplyGraph(bad)).toThrow(/Products row 2: product F1 names unknown plant/);
  });
});

describe('tiers', () => {
  it('counts hops to a plant over qualified rows, minimum over paths, null when unreached', () => {
    const graph = buildSupplyGraph(
      compactModel({
        plants: ['P1'],
        products: [['F1', 'P1', 1]],
        bom: [['F1', 'I1']],
        suppliers: ['S1', 'S2', 'S3', 'S4', 'S5'],
        sourcing: [
          ['P1', 'I1', 'S1'],
          ['S1', 'C1', 'S2'],
          ['S2', 'C2', 'S3'],
          ['P1', 'I8', 'S3'],
          ['S2', 'C3', 'S4', false],
          ['S5', 'C4', 'S1'],
        ],
      }),
    );
    expect(Object.fromEntries(tiers(graph))).toEqual({ S1: 1, S2: 2, S3: 1, S4: null, S5: null });
  });
});

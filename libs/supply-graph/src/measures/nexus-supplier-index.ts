/**
 * Nexus supplier index: one score per supplier for how central its position in the supply
 * network is, whatever its tier. Yan, Choi, Kim and Yang describe the nexus supplier as a
 * critical supplier by network position and give no formula; a combined index of centralities
 * was later computed by Shao, Shi, Choi and Chae with data envelopment analysis. Ours is a
 * simpler, transparent OPERATIONALISATION (see docs/methods.md):
 *
 *   NSI(s) = sum_k w_k x norm_k(s) / sum_k w_k,   norm_k(s) = (m_k(s) - min_k) / (max_k - min_k),
 *
 * over the measures m_k = degree, closeness, eigenvector (on the undirected graph) and subset
 * betweenness (directed, sources to products), min and max taken over suppliers only; a measure
 * that is equal for every supplier contributes 0. Equal weights by default. In [0, 1].
 * O(suppliers) given the measures; computes any measure not passed in.
 *
 * References: T. Yan, T. Y. Choi, Y. Kim and Y. Yang, "A theory of the nexus supplier: a critical
 * supplier from a network perspective", Journal of Supply Chain Management 51(1):52-66, 2015,
 * doi:10.1111/jscm.12070; B. B. M. Shao, Z. Shi, T. Y. Choi and S. Chae, "A data-analytics
 * approach to identifying hidden critical suppliers in supply networks: development of nexus
 * supplier index", Decision Support Systems 114:37-48, 2018 (DOI not checked here).
 */
import type { SupplyGraph } from '../supply-graph';
import { betweennessSubset } from './betweenness-subset';
import { closenessCentrality } from './closeness';
import { degreeCentrality } from './degree';
import { eigenvectorCentrality } from './eigenvector';
import { undirectedView } from './undirected-view';

/** Per-node scores the index combines (index order of the supply graph's nodes). */
export interface NexusMeasures {
  degree: Float64Array;
  betweenness: Float64Array;
  closeness: Float64Array;
  eigenvector: Float64Array;
}

/** Options of {@link nexusSupplierIndex}. */
export interface NexusOptions {
  /** Measures already computed (saves the work); missing ones are computed. */
  measures?: Partial<NexusMeasures>;
  /** Non-negative weight per measure; default 1 each. */
  weights?: Partial<Record<keyof NexusMeasures, number>>;
}

/** Defaults of {@link nexusSupplierIndex}: equal weights. */
export const NEXUS_DEFAULTS = {
  weights: { degree: 1, betweenness: 1, closeness: 1, eigenvector: 1 },
} as const;

const MEASURE_NAMES = ['degree', 'betweenness', 'closeness', 'eigenvector'] as const;

/** The nexus supplier index of every supplier, by code, in code-point order. */
export function nexusSupplierIndex(
  graph: SupplyGraph,
  options: NexusOptions = {},
): Map<string, number> {
  const undirected = undirectedView(graph);
  const given = options.measures ?? {};
  const compute: Record<keyof NexusMeasures, () => Float64Array> = {
    degree: () => degreeCentrality(undirected),
    betweenness: () => betweennessSubset(graph),
    closeness: () => closenessCentrality(undirected, { nodes: graph.supplierNodes }),
    eigenvector: () => eigenvectorCentrality(undirected),
  };
  const count = graph.supplierNodes.length;
  const sum = new Float64Array(count);
  let weightSum = 0;
  for (const name of MEASURE_NAMES) {
    const weight = options.weights?.[name] ?? NEXUS_DEFAULTS.weights[name];
    if (!(weight >= 0)) throw new RangeError(`nexusSupplierIndex: weight of ${name} must be >= 0`);
    if (weight === 0) continue;
    weightSum += weight;
    const scores = given[name] ?? compute[name]();
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; i < count; i++) {
      const value = scores[graph.supplierNodes[i]!]!;
      min = Math.min(min, value);
      max = Math.max(max, value);
    }
    if (!(max > min)) continue;
    for (let i = 0; i < count; i++) {
      sum[i]! += (weight * (scores[graph.supplierNodes[i]!]! - min)) / (max - min);
    }
  }
  return new Map(
    graph.supplierCodes.map((code, i) => [code, weightSum > 0 ? sum[i]! / weightSum : 0]),
  );
}

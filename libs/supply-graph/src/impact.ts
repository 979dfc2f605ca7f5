/**
 * Impact of a failure set (spec section 4): products lost beyond the baseline, revenue exposed
 * per week, time to survive (TTS) per lost product, time to recover (TTR) of the set, lost weeks
 * and revenue impact. This is the time-to-survive / time-to-recover idea in its simplest form (no
 * re-allocation between sources) of D. Simchi-Levi, W. Schmidt and Y. Wei, "From superstorms to
 * factory fires: managing unpredictable supply-chain disruptions", Harvard Business Review
 * 92(1-2):96-101, 2014.
 */
import { sortedUniqueCodes } from './code-order';
import { propagateFromNodes, supplierNodesFor } from './propagate-failure';
import type { SupplyGraph } from './supply-graph';

/** One lost product of an impact. */
export interface ProductImpact {
  code: string;
  plantCode: string;
  weeklyRevenue: number;
  /** Minimum weeks of cover over the down bought (item, plant) nodes of its BOM closure. */
  timeToSurvive: number;
  /** max(0, timeToRecover - timeToSurvive). */
  lostWeeks: number;
}

/** The impact of a failure set. */
export interface Impact {
  /** The failed suppliers, sorted by code (code-point order), without repeats. */
  failed: string[];
  /** Products down under the failure but not at baseline, sorted by code. */
  productsLost: string[];
  /** Sum of the weekly revenue of the lost products. */
  revenueExposedPerWeek: number;
  /** Sum over lost products of weekly revenue x lost weeks. */
  revenueImpact: number;
  /** Largest recovery weeks among the failed suppliers; 0 for an empty set (spec 8.14). */
  timeToRecover: number;
  /** Per lost product, in the order of `productsLost`. */
  products: ProductImpact[];
}

/**
 * Builds an {@link Impact} from lost product ordinals (ascending) and their times to survive.
 * Shared by {@link impactOf} and the bit-parallel path so that sums run in the same order and
 * agree to the last bit.
 */
export function assembleImpact(
  graph: SupplyGraph,
  failed: string[],
  timeToRecover: number,
  lostOrdinals: ArrayLike<number>,
  timesToSurvive: ArrayLike<number>,
): Impact {
  const products: ProductImpact[] = [];
  let revenueExposedPerWeek = 0;
  let revenueImpact = 0;
  for (let i = 0; i < lostOrdinals.length; i++) {
    const p = lostOrdinals[i]!;
    const weeklyRevenue = graph.weeklyRevenue[p]!;
    const timeToSurvive = timesToSurvive[i]!;
    const lostWeeks = Math.max(0, timeToRecover - timeToSurvive);
    revenueExposedPerWeek += weeklyRevenue;
    revenueImpact += weeklyRevenue * lostWeeks;
    products.push({
      code: graph.productCodes[p]!,
      plantCode: graph.productPlants[p]!,
      weeklyRevenue,
      timeToSurvive,
      lostWeeks,
    });
  }
  return {
    failed,
    productsLost: products.map((product) => product.code),
    revenueExposedPerWeek,
    revenueImpact,
    timeToRecover,
    products,
  };
}

/** Largest recovery weeks among supplier nodes; 0 when there are none. */
export function timeToRecoverOf(graph: SupplyGraph, supplierNodes: readonly number[]): number {
  let weeks = 0;
  for (const node of supplierNodes) {
    weeks = Math.max(weeks, graph.recoveryWeeks[graph.ordinal[node]!]!);
  }
  return weeks;
}

/** Time to survive of product ordinal `p` given down flags: its closure is sorted by cover. */
export function timeToSurviveOf(graph: SupplyGraph, p: number, down: Uint8Array): number {
  for (let i = graph.closureOffsets[p]!; i < graph.closureOffsets[p + 1]!; i++) {
    const node = graph.closureNodes[i]!;
    if (down[node] === 1) return graph.coverWeeks[node]!;
  }
  // Unreachable for a down product: a BOM chain of down nodes ends at a down bought item.
  return 0;
}

/**
 * The impact of the suppliers `failedCodes` failing together. Throws
 * `UnknownSupplierError` when a code is not a supplier.
 */
export function impactOf(graph: SupplyGraph, failedCodes: Iterable<string>): Impact {
  const failed = sortedUniqueCodes(failedCodes);
  const seeds = supplierNodesFor(graph, failed);
  const down = propagateFromNodes(graph, seeds);
  const lost: number[] = [];
  const survive: number[] = [];
  for (let p = 0; p < graph.productNodes.length; p++) {
    const node = graph.productNodes[p]!;
    if (down[node] === 1 && graph.baselineDown[node] === 0) {
      lost.push(p);
      survive.push(timeToSurviveOf(graph, p, down));
    }
  }
  return assembleImpact(graph, failed, timeToRecoverOf(graph, seeds), lost, survive);
}

/**
 * Multi-source breadth-first search on an undirected graph with an independent set of
 * low-degree, non-source nodes contracted away: the distance sums closeness needs, exactly, with
 * a working set small enough to stay in the processor's cache.
 *
 * A supply graph is mostly bought items of degree 2 or 3 (a buyer and one or two sellers). None
 * of them is a source of the closeness search (only suppliers are), and no two of them need be
 * adjacent. Take such an independent set C of non-source nodes of degree at most
 * {@link MAX_CONTRACTED_DEGREE}; every neighbour of a node of C is kept. Then:
 *
 * - between kept nodes, a shortest path alternates kept nodes and single contracted nodes, so the
 *   kept graph with an edge of length 2 between any two kept nodes that share a contracted
 *   neighbour has exactly the original distances;
 * - a contracted node c is at distance 1 + min over its neighbours u of d(u), so from each source
 *   it is first reached one level after the first of its neighbours: with f_u the bits that
 *   reach u at level L and s_u those that reached it before, c gets the bits
 *   (OR f_u) & ~(OR s_u) at level L + 1. No state is kept for c at all.
 *
 * The search keeps the bits of up to 32 x W sources per kept node (seen, fresh at this level,
 * arrivals for the next two levels) and counts the bits reaching nodes at each level in
 * bit-sliced counters. Results are identical to one breadth-first search per source: the
 * closeness specs compare them on random graphs full of degree-2 nodes.
 *
 * Reference for the bit-parallel search: M. Then, M. Kaufmann, F. Chirigati, T.-A. Hoang-Vu,
 * K. Pham, A. Kemper, T. Neumann and H. T. Vo, "The more the merrier: efficient multi-source
 * graph traversal", Proceedings of the VLDB Endowment 8(4):449-460, 2014,
 * doi:10.14778/2735496.2735507.
 */
import type { CsrGraph } from '../csr-graph';

/** Contracted nodes have at most this many neighbours (their kept neighbours become a clique). */
export const MAX_CONTRACTED_DEGREE = 4;

/** The graph split into kept nodes (renumbered) and contracted ones. */
export interface ContractedGraph {
  /** Kept node count. */
  readonly keptCount: number;
  /** Kept index of each original node, -1 for contracted nodes. */
  readonly keptOf: Int32Array;
  /** Kept neighbours at distance 1: CSR over kept indices. */
  readonly nearOffsets: Int32Array;
  readonly nearTargets: Int32Array;
  /** Kept nodes at distance 2 through a contracted node (deduplicated, not also near). */
  readonly farOffsets: Int32Array;
  readonly farTargets: Int32Array;
  /** Contracted neighbours of each kept node (contracted indices). */
  readonly hubOffsets: Int32Array;
  readonly hubTargets: Int32Array;
  /** Kept neighbours of each contracted node. */
  readonly memberOffsets: Int32Array;
  readonly memberTargets: Int32Array;
}

/** Splits an undirected graph: the given sources are always kept. */
export function contractGraph(graph: CsrGraph, isSource: Uint8Array): ContractedGraph {
  const { n, offsets, targets } = graph;
  const degree = (v: number) => offsets[v + 1]! - offsets[v]!;
  // Greedy independent set, lowest degree first (counting sort by degree).
  const byDegree = new Int32Array(MAX_CONTRACTED_DEGREE + 2);
  for (let v = 0; v < n; v++) byDegree[Math.min(degree(v), MAX_CONTRACTED_DEGREE + 1)]!++;
  const start = new Int32Array(MAX_CONTRACTED_DEGREE + 2);
  for (let d = 1; d < start.length; d++) start[d] = start[d - 1]! + byDegree[d - 1]!;
  const order = new Int32Array(n);
  for (let v = 0; v < n; v++) order[start[Math.min(degree(v), MAX_CONTRACTED_DEGREE + 1)]!++] = v;
  const isContracted = new Uint8Array(n);
  const isBlocked = new Uint8Array(n);
  for (const v of order) {
    if (isSource[v] === 1 || isBlocked[v] === 1 || degree(v) > MAX_CONTRACTED_DEGREE) continue;
    let isEligible = true;
    for (let e = offsets[v]!; e < offsets[v + 1]!; e++) {
      if (targets[e] === v || isContracted[targets[e]!] === 1) isEligible = false;
    }
    if (!isEligible) continue;
    isContracted[v] = 1;
    for (let e = offsets[v]!; e < offsets[v + 1]!; e++) isBlocked[targets[e]!] = 1;
  }
  const keptOf = new Int32Array(n).fill(-1);
  const contractedOf = new Int32Array(n).fill(-1);
  let keptCount = 0;
  let contractedCount = 0;
  for (let v = 0; v < n; v++) {
    if (isContracted[v] === 1) contractedOf[v] = contractedCount++;
    else keptOf[v] = keptCount++;
  }
  const members = new Int32Array(contractedCount + 1);
  const memberList: number[] = [];
  for (let v = 0, c = 0; v < n; v++) {
    if (isContracted[v] !== 1) continue;
    for (let e = offsets[v]!; e < offsets[v + 1]!; e++) memberList.push(keptOf[targets[e]!]!);
    members[++c] = memberList.length;
  }
  const memberTargets = Int32Array.from(memberList);
  const near: number[] = [];
  const far: number[] = [];
  const hubs: number[] = [];
  const nearOffsets = new Int32Array(keptCount + 1);
  const farOffsets = new Int32Array(keptCount + 1);
  const hubOffsets = new Int32Array(keptCount + 1);
  const stamp = new Int32Array(keptCount).fill(-1);
  for (let v = 0; v < n; v++) {
    const u = keptOf[v]!;
    if (u < 0) continue;
    stamp[u] = u;
    for (let e = offsets[v]!; e < offsets[v + 1]!; e++) {
      const w = targets[e]!;
      if (keptOf[w]! >= 0 && stamp[keptOf[w]!] !== u) {
        stamp[keptOf[w]!] = u;
        near.push(keptOf[w]!);
      }
    }
    for (let e = offsets[v]!; e < offsets[v + 1]!; e++) {
      const c = contractedOf[targets[e]!]!;
      if (c < 0) continue;
      hubs.push(c);
      for (let f = members[c]!; f < members[c + 1]!; f++) {
        const b = memberTargets[f]!;
        if (stamp[b] !== u) {
          stamp[b] = u;
          far.push(b);
        }
      }
    }
    nearOffsets[u + 1] = near.length;
    farOffsets[u + 1] = far.length;
    hubOffsets[u + 1] = hubs.length;
  }
  return {
    keptCount,
    keptOf,
    nearOffsets,
    nearTargets: Int32Array.from(near),
    farOffsets,
    farTargets: Int32Array.from(far),
    hubOffsets,
    hubTargets: Int32Array.from(hubs),
    memberOffsets: members,
    memberTargets,
  };
}

/** Arrivals for one future level: bits per kept node, and the nodes that got any. */
class Arrivals {
  readonly bits: Int32Array;
  readonly isListed: Uint8Array;
  readonly list: Int32Array;
  size = 0;
  constructor(nodes: number, words: number) {
    this.bits = new Int32Array(nodes * words);
    this.isListed = new Uint8Array(nodes);
    this.list = new Int32Array(nodes);
  }
}

/** Breadth-first search from up to 32 x `words` sources at once on a {@link ContractedGraph}. */
export class ContractedSearch {
  /** Nodes reached per source of the last run, the source excluded. */
  readonly reached: Float64Array;
  /** Sum of hop distances per source of the last run. */
  readonly distanceSum: Float64Array;
  private readonly seen: Int32Array;
  private readonly fresh: Int32Array;
  private readonly frontier: Int32Array;
  private nextLevel: Arrivals;
  private levelAfter: Arrivals;
  private readonly touched: Int32Array;
  private readonly touchStamp: Int32Array;
  private readonly counter: Int32Array;
  private readonly slices: number;

  constructor(
    private readonly graph: ContractedGraph,
    private readonly words: number,
    totalNodes: number,
  ) {
    const kept = graph.keptCount;
    this.reached = new Float64Array(32 * words);
    this.distanceSum = new Float64Array(32 * words);
    this.seen = new Int32Array(kept * words);
    this.fresh = new Int32Array(kept * words);
    this.frontier = new Int32Array(kept);
    this.nextLevel = new Arrivals(kept, words);
    this.levelAfter = new Arrivals(kept, words);
    const contracted = graph.memberOffsets.length - 1;
    this.touched = new Int32Array(contracted);
    this.touchStamp = new Int32Array(contracted).fill(-1);
    // Bit-sliced counters per word: slice k holds bit k of 32 per-source counts.
    this.slices = Math.max(1, 32 - Math.clz32(totalNodes));
    this.counter = new Int32Array(this.slices * words);
  }

  /**
   * Runs from `count` sources given as kept indices (`sources[i]` gets bit i). With `perNode`,
   * also adds to each tracked kept node the sum (and sum of squares) of its distances from the
   * sources, which the pivot estimate of closeness needs.
   */
  run(sources: Int32Array, count: number, perNode?: PerNodeSums): void {
    const { words, seen, fresh, frontier, touched, touchStamp, counter, slices } = this;
    const { nearOffsets, nearTargets, farOffsets, farTargets, hubOffsets, hubTargets } = this.graph;
    const { memberOffsets, memberTargets } = this.graph;
    seen.fill(0);
    this.reached.fill(0);
    this.distanceSum.fill(0);
    touchStamp.fill(-1);
    let frontierSize = 0;
    for (let i = 0; i < count; i++) {
      const s = sources[i]!;
      const slot = s * words + (i >>> 5);
      if (isEmpty(seen, s * words, words)) frontier[frontierSize++] = s;
      seen[slot]! |= 1 << (i & 31);
      fresh[slot]! |= 1 << (i & 31);
    }
    for (let level = 0; frontierSize > 0 || this.nextLevel.size > 0; level++) {
      const near = this.nextLevel;
      const far = this.levelAfter;
      let touchedSize = 0;
      for (let i = 0; i < frontierSize; i++) {
        const u = frontier[i]!;
        const uBase = u * words;
        for (let e = nearOffsets[u]!, end = nearOffsets[u + 1]!; e < end; e++) {
          spread(fresh, uBase, seen, near, nearTargets[e]!, words);
        }
        for (let e = farOffsets[u]!, end = farOffsets[u + 1]!; e < end; e++) {
          spread(fresh, uBase, seen, far, farTargets[e]!, words);
        }
        for (let e = hubOffsets[u]!, end = hubOffsets[u + 1]!; e < end; e++) {
          const c = hubTargets[e]!;
          if (touchStamp[c] !== level) {
            touchStamp[c] = level;
            touched[touchedSize++] = c;
          }
        }
      }
      counter.fill(0);
      // Contracted nodes first reached at level + 1 (fresh still holds this level's bits).
      for (let t = 0; t < touchedSize; t++) {
        const c = touched[t]!;
        const first = memberOffsets[c]!;
        const last = memberOffsets[c + 1]!;
        for (let j = 0; j < words; j++) {
          let arriving = 0;
          let before = 0;
          for (let f = first; f < last; f++) {
            const slot = memberTargets[f]! * words + j;
            const bits = fresh[slot]!;
            arriving |= bits;
            before |= seen[slot]! & ~bits;
          }
          // Add one to the count of every newly reached bit (ripple carry over the slices).
          let carry = arriving & ~before;
          for (let k = j * slices; carry !== 0; k++) {
            const overflow = counter[k]! & carry;
            counter[k]! ^= carry;
            carry = overflow;
          }
        }
      }
      for (let i = 0; i < frontierSize; i++) {
        const uBase = frontier[i]! * words;
        fresh.fill(0, uBase, uBase + words);
      }
      // Kept nodes reached at level + 1: this level's near arrivals and the last level's far ones.
      frontierSize = 0;
      const arrived = near.bits;
      for (let i = 0; i < near.size; i++) {
        const w = near.list[i]!;
        near.isListed[w] = 0;
        let any = 0;
        let reachedHere = 0;
        for (let j = 0, slot = w * words; j < words; j++, slot++) {
          const bits = arrived[slot]! & ~seen[slot]!;
          arrived[slot] = 0;
          if (bits === 0) continue;
          any = 1;
          reachedHere += bitCount(bits);
          seen[slot]! |= bits;
          fresh[slot] = bits;
          let carry = bits;
          for (let k = j * slices; carry !== 0; k++) {
            const overflow = counter[k]! & carry;
            counter[k]! ^= carry;
            carry = overflow;
          }
        }
        if (any === 1) frontier[frontierSize++] = w;
        if (perNode !== undefined && perNode.isTracked[w] === 1) {
          perNode.sum[w]! += reachedHere * (level + 1);
          perNode.sumOfSquares[w]! += reachedHere * (level + 1) * (level + 1);
        }
      }
      near.size = 0;
      this.addLevel(level + 1, count);
      this.nextLevel = far;
      this.levelAfter = near;
    }
  }

  private addLevel(level: number, count: number): void {
    const { counter, slices } = this;
    for (let i = 0; i < count; i++) {
      const base = (i >>> 5) * slices;
      const bit = i & 31;
      let reachedAtLevel = 0;
      for (let k = 0; k < slices; k++) {
        reachedAtLevel += ((counter[base + k]! >>> bit) & 1) * 2 ** k;
      }
      this.reached[i]! += reachedAtLevel;
      this.distanceSum[i]! += reachedAtLevel * level;
    }
  }
}

/** Distance sums per kept node, filled by {@link ContractedSearch.run}. */
export interface PerNodeSums {
  /** 1 for the kept nodes whose sums are wanted. */
  isTracked: Uint8Array;
  sum: Float64Array;
  sumOfSquares: Float64Array;
}

/** Number of set bits of a 32-bit word. */
function bitCount(word: number): number {
  let v = word - ((word >>> 1) & 0x55555555);
  v = (v & 0x33333333) + ((v >>> 2) & 0x33333333);
  return (Math.imul((v + (v >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24);
}

function isEmpty(bits: Int32Array, base: number, words: number): boolean {
  for (let j = 0; j < words; j++) if (bits[base + j] !== 0) return false;
  return true;
}

/** Offers u's fresh bits to kept node w for a later level (only bits w has not seen). */
function spread(
  fresh: Int32Array,
  uBase: number,
  seen: Int32Array,
  arrivals: Arrivals,
  w: number,
  words: number,
): void {
  const wBase = w * words;
  let any = 0;
  for (let j = 0; j < words; j++) {
    const bits = fresh[uBase + j]! & ~seen[wBase + j]!;
    if (bits !== 0) {
      arrivals.bits[wBase + j]! |= bits;
      any = 1;
    }
  }
  if (any === 1 && arrivals.isListed[w] === 0) {
    arrivals.isListed[w] = 1;
    arrivals.list[arrivals.size++] = w;
  }
}

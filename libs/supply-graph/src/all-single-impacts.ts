/**
 * Every supplier's own removal at once, bit-parallel: 32 suppliers per pass, one bit each in a
 * Uint32Array word per node. Nodes are visited in topological order of the condensation (Tarjan's
 * SCCs, iterative); a node's word is the OR (suppliers, made items, products) or AND (bought
 * items) of its inputs' words, plus the seed bit of a failed supplier. Inside a supplier cycle
 * (an SCC of more than one node) the words are iterated from zero until they stop changing,
 * which gives the least fixed point of spec 3 for each bit at once.
 *
 * Only nodes downstream of a pass's seeds are visited (an active set scanned in topological
 * position), and baseline-down nodes are constant all-ones words. Seeds are grouped by position,
 * so the 32 cones of one pass overlap. Cost: at most (suppliers / 32) x (nodes + edges), usually
 * far less. The result equals `impactOf(graph, [s])` for every supplier s (property-tested).
 */
import { condense, type Condensation } from './condensation';
import { throwIfCancelled, type ProgressOptions } from './errors';
import { assembleImpact, type Impact } from './impact';
import { NODE_KIND, NODE_RULE, type SupplyGraph } from './supply-graph';

/** The impact of one supplier failing alone. */
export interface SingleImpact extends Impact {
  /** The supplier removed. */
  supplierCode: string;
}

/** Options of {@link allSingleImpacts}. */
export type SingleImpactOptions = ProgressOptions;

const WORD_BITS = 32;
const ALL_ONES = 0xffffffff;
const condensations = new WeakMap<SupplyGraph, Condensation>();

/** The condensation of the supply graph, computed once per graph. */
export function condensationOf(graph: SupplyGraph): Condensation {
  let condensation = condensations.get(graph);
  if (!condensation) {
    condensation = condense(graph);
    condensations.set(graph, condensation);
  }
  return condensation;
}

/**
 * The impact of each supplier failing alone, in supplier code order. Reports progress per pass
 * and throws `AnalysisCancelledError` between passes when the signal is aborted.
 */
export function allSingleImpacts(
  graph: SupplyGraph,
  options: SingleImpactOptions = {},
): SingleImpact[] {
  const { n, offsets, targets, inOffsets, inSources, rule, baselineDown, supplierNodes } = graph;
  const { order, positionOf, componentOf, componentStart } = condensationOf(graph);
  const words = new Uint32Array(n);
  for (let v = 0; v < n; v++) if (baselineDown[v] === 1) words[v] = ALL_ONES;
  const seedBits = new Uint32Array(n);
  const active = new Uint32Array((n + WORD_BITS - 1) >>> 5);
  const touched = new Int32Array(n);
  let touchedCount = 0;
  let lastActive = -1;

  const activate = (position: number) => {
    active[position >>> 5]! |= 1 << (position & 31);
    if (position > lastActive) lastActive = position;
  };
  const activateSuccessors = (u: number) => {
    for (let e = offsets[u]!; e < offsets[u + 1]!; e++) {
      const t = targets[e]!;
      if (baselineDown[t] === 0 && rule[t] !== NODE_RULE.never) activate(positionOf[t]!);
    }
  };
  const evaluate = (u: number): number => {
    let x: number;
    if (rule[u] === NODE_RULE.all) {
      x = ALL_ONES;
      for (let e = inOffsets[u]!; e < inOffsets[u + 1]!; e++) x &= words[inSources[e]!]!;
    } else {
      x = seedBits[u]!;
      for (let e = inOffsets[u]!; e < inOffsets[u + 1]!; e++) x |= words[inSources[e]!]!;
    }
    return x >>> 0;
  };
  const store = (u: number, x: number) => {
    if (words[u] === 0) touched[touchedCount++] = u;
    words[u] = x;
  };
  const processComponent = (component: number) => {
    const start = componentStart[component]!;
    const end = componentStart[component + 1]!;
    if (end - start === 1) {
      const u = order[start]!;
      const x = evaluate(u);
      if (x !== 0) {
        store(u, x);
        activateSuccessors(u);
      }
      return;
    }
    let changed = true;
    while (changed) {
      changed = false;
      for (let p = start; p < end; p++) {
        const u = order[p]!;
        if (baselineDown[u] === 1 || rule[u] === NODE_RULE.never) continue;
        const x = evaluate(u);
        if (x !== words[u]) {
          store(u, x);
          changed = true;
        }
      }
    }
    for (let p = start; p < end; p++) {
      const u = order[p]!;
      if (baselineDown[u] === 0 && words[u] !== 0) activateSuccessors(u);
    }
    for (let p = start; p < end; p++) active[p >>> 5]! &= ~(1 << (p & 31));
  };

  const supplierCount = supplierNodes.length;
  const byPosition = Array.from({ length: supplierCount }, (_, ordinal) => ordinal).sort(
    (a, b) => positionOf[supplierNodes[a]!]! - positionOf[supplierNodes[b]!]!,
  );
  const results = new Array<SingleImpact>(supplierCount);
  const passes = Math.ceil(supplierCount / WORD_BITS);
  for (let pass = 0; pass < passes; pass++) {
    throwIfCancelled(options.signal, 'single removals');
    const group = byPosition.slice(pass * WORD_BITS, (pass + 1) * WORD_BITS);
    let firstActive = n;
    group.forEach((ordinal, bit) => {
      const node = supplierNodes[ordinal]!;
      if (baselineDown[node] === 1) return;
      seedBits[node]! |= 1 << bit;
      activate(positionOf[node]!);
      firstActive = Math.min(firstActive, positionOf[node]!);
    });
    for (let w = firstActive >>> 5; w <= lastActive >> 5; w++) {
      while (active[w] !== 0) {
        const lowest = active[w]! & -active[w]!;
        active[w]! ^= lowest;
        processComponent(componentOf[order[(w << 5) + 31 - Math.clz32(lowest)]!]!);
      }
    }
    collectPass(graph, group, words, touched, touchedCount, results);
    for (let i = 0; i < touchedCount; i++) words[touched[i]!] = 0;
    for (const ordinal of group) seedBits[supplierNodes[ordinal]!] = 0;
    touchedCount = 0;
    lastActive = -1;
    options.onProgress?.((pass + 1) / passes);
  }
  return results;
}

/** Turns the product words of one pass into per-supplier impacts. */
function collectPass(
  graph: SupplyGraph,
  group: readonly number[],
  words: Uint32Array,
  touched: Int32Array,
  touchedCount: number,
  results: SingleImpact[],
): void {
  const { kind, ordinal, closureOffsets, closureNodes, coverWeeks } = graph;
  const lostProducts: number[] = [];
  for (let i = 0; i < touchedCount; i++) {
    const node = touched[i]!;
    if (kind[node] === NODE_KIND.product) lostProducts.push(ordinal[node]!);
  }
  lostProducts.sort((a, b) => a - b);
  const lost = group.map((): number[] => []);
  const survive = group.map((): number[] => []);
  const timeToSurvive = new Float64Array(WORD_BITS);
  for (const p of lostProducts) {
    const word = words[graph.productNodes[p]!]!;
    // Closure sorted by cover: the first down node per bit gives that bit's time to survive.
    let remaining = word;
    for (let i = closureOffsets[p]!; i < closureOffsets[p + 1]! && remaining !== 0; i++) {
      const node = closureNodes[i]!;
      let hit = (remaining & words[node]!) >>> 0;
      remaining = (remaining & ~hit) >>> 0;
      while (hit !== 0) {
        const lowest = hit & -hit;
        hit = (hit ^ lowest) >>> 0;
        timeToSurvive[31 - Math.clz32(lowest)] = coverWeeks[node]!;
      }
    }
    for (let bits = word; bits !== 0; ) {
      const lowest = bits & -bits;
      bits = (bits ^ lowest) >>> 0;
      const bit = 31 - Math.clz32(lowest);
      lost[bit]!.push(p);
      survive[bit]!.push(timeToSurvive[bit]!);
    }
  }
  group.forEach((supplierOrdinal, bit) => {
    const code = graph.supplierCodes[supplierOrdinal]!;
    const impact = assembleImpact(
      graph,
      [code],
      graph.recoveryWeeks[supplierOrdinal]!,
      lost[bit]!,
      survive[bit]!,
    );
    results[supplierOrdinal] = { supplierCode: code, ...impact };
  });
}

/** Tarjan's SCCs checked against reachability by brute force, and on a million-node graph. */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { condense } from './condensation';
import { csrFromArrays } from './csr-graph';

function reach(n: number, from: number[], to: number[]): boolean[][] {
  const r = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => i === j));
  from.forEach((u, e) => (r[u]![to[e]!] = true));
  for (let k = 0; k < n; k++) for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    if (r[i]![k] && r[k]![j]) r[i]![j] = true;
  }
  return r;
}

describe('condense', () => {
  it('groups mutually reachable nodes and orders components topologically', () => {
    const edges = fc.array(fc.tuple(fc.nat(11), fc.nat(11)), { maxLength: 40 });
    fc.assert(
      fc.property(edges, (pairs) => {
        const from = pairs.map(([u]) => u);
        const to = pairs.map(([, v]) => v);
        const graph = csrFromArrays(12, Int32Array.from(from), Int32Array.from(to), true);
        const { componentOf, order, positionOf } = condense(graph);
        const r = reach(12, from, to);
        for (let u = 0; u < 12; u++) {
          expect(order[positionOf[u]!]).toBe(u);
          for (let v = 0; v < 12; v++) {
            expect(componentOf[u] === componentOf[v]).toBe(r[u]![v]! && r[v]![u]!);
          }
        }
        from.forEach((u, e) => expect(componentOf[u]!).toBeLessThanOrEqual(componentOf[to[e]!]!));
      }),
      { numRuns: 200 },
    );
  });
  it('handles a million-node path and ring without recursion', () => {
    const n = 1_000_000;
    const from = Int32Array.from({ length: n }, (_, i) => i);
    const successor = Int32Array.from({ length: n }, (_, i) => (i + 1) % n);
    const path = csrFromArrays(n, from.subarray(0, n - 1), successor.subarray(0, n - 1), true);
    expect(condense(path).componentCount).toBe(n);
    const ring = csrFromArrays(n, from, successor, true);
    expect(condense(ring).componentCount).toBe(1);
  });
});

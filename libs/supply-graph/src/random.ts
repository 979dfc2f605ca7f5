/**
 * mulberry32: a small, fast 32-bit seeded pseudo-random generator (Tommy Ettinger's public-domain
 * design), good enough for reproducible test and demo networks; not for cryptography.
 */

/** A function returning the next number in [0, 1). */
export type Random = () => number;

/** A seeded generator: the same seed gives the same sequence on every platform. */
export function mulberry32(seed: number): Random {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Integer in [low, high], both included. */
export function randomInt(random: Random, low: number, high: number): number {
  return low + Math.floor(random() * (high - low + 1));
}

/** One element of a non-empty array. */
export function pick<T>(random: Random, items: readonly T[]): T {
  return items[Math.floor(random() * items.length)]!;
}

/** Shuffles a copy (Fisher-Yates). */
export function shuffled<T>(random: Random, items: readonly T[]): T[] {
  const copy = [...items];
  for (let i = copy.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [copy[i], copy[j]] = [copy[j]!, copy[i]!];
  }
  return copy;
}

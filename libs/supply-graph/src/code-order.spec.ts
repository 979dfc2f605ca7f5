/** Code-point order (spec 8.15), checked against sorting by arrays of code points. */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compareCodePoints, sortedUniqueCodes } from './code-order';

const byCodePoints = (a: string, b: string) => {
  const x = [...a].map((c) => c.codePointAt(0)!);
  const y = [...b].map((c) => c.codePointAt(0)!);
  for (let i = 0; i < Math.min(x.length, y.length); i++) if (x[i] !== y[i]) return x[i]! - y[i]!;
  return x.length - y.length;
};

describe('compareCodePoints', () => {
  it('puts an astral character after U+FFFD, unlike UTF-16 order', () => {
    expect(compareCodePoints('\u{1F600}', '\uFFFD')).toBeGreaterThan(0);
    expect('\u{1F600}' < '\uFFFD').toBe(true);
  });
  it('agrees in sign with comparing code point arrays', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme' }), fc.string({ unit: 'grapheme' }), (a, b) => {
        expect(Math.sign(compareCodePoints(a, b))).toBe(Math.sign(byCodePoints(a, b)));
      }),
      { numRuns: 500 },
    );
  });
  it('sorts case-sensitively (uppercase first) and removes repeats', () => {
    expect(sortedUniqueCodes(['b', 'B', 'a', 'b', 'S-10', 'S-2'])).toEqual(
      ['B', 'S-10', 'S-2', 'a', 'b'],
    );
  });
});

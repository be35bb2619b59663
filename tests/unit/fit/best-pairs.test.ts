import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { FitInputError, bestPairs, evaluateCavityGoal, type CavityGoal, type MirrorSpec } from '../../../src/lib/fit';

const goal: CavityGoal = { wavelengthNm: 1064, lengthM: 0.2, target: { kind: 'finesse', value: 1e4 }, configuration: 'two-listings' };

const mirrorArb: fc.Arbitrary<MirrorSpec> = fc.record({
  diameterMm: fc.constant(25.4),
  substrate: fc.constant('fused silica'),
  rocMm: fc.constantFrom<number | null>(null, 50, 100, 150, 250, 500, 1000, -500),
  designWavelengthNm: fc.constant(1064),
  bandMinNm: fc.constantFrom(1000, 1070),
  bandMaxNm: fc.constant(1100),
  transmissionPpm: fc.record({ value: fc.double({ min: 0.5, max: 500, noNaN: true }), tol: fc.double({ min: 0, max: 50, noNaN: true }) }),
  lossPpm: fc.record({ value: fc.double({ min: 0.5, max: 100, noNaN: true }), tol: fc.double({ min: 0, max: 10, noNaN: true }) }),
  aoiDeg: fc.constantFrom(0, 0, 0, 45),
});

/** All N² pairs, the reference the pruned search must reproduce. */
function bruteForce(mirrors: MirrorSpec[], k: number): { a: number; b: number; worst: number }[] {
  const all: { a: number; b: number; worst: number }[] = [];
  for (let i = 0; i < mirrors.length; i++) {
    for (let j = i + 1; j < mirrors.length; j++) {
      const r = evaluateCavityGoal(goal, mirrors[i] as MirrorSpec, mirrors[j] as MirrorSpec);
      if (r.finesse !== null && r.stable) all.push({ a: i, b: j, worst: r.finesse.worst });
    }
  }
  return all.sort((x, y) => y.worst - x.worst).slice(0, k);
}

describe('bestPairs (two-listings) returns the brute-force top k', () => {
  test('same top-k worst-case finesse as brute force on random catalogues (fast-check)', () => {
    fc.assert(
      fc.property(fc.array(mirrorArb, { minLength: 0, maxLength: 30 }), fc.integer({ min: 1, max: 12 }), (mirrors, k) => {
        const expected = bruteForce(mirrors, k);
        const got = bestPairs(goal, mirrors, k);
        expect(got.map((p) => p.result.finesse?.worst)).toEqual(expected.map((p) => p.worst));
        for (const p of got) {
          expect(p.a).not.toBe(p.b);
          expect(p.result.stable).toBe(true);
          const direct = evaluateCavityGoal(goal, mirrors[p.a] as MirrorSpec, mirrors[p.b] as MirrorSpec);
          expect(direct.finesse?.worst).toBe(p.result.finesse?.worst);
        }
      }),
      { numRuns: 200 },
    );
  });

  test('scales to thousands of listings: the two lowest-loss stable mirrors come first', () => {
    const mirrors: MirrorSpec[] = Array.from({ length: 5000 }, (_, i) => ({
      diameterMm: 25.4,
      substrate: 'fused silica',
      rocMm: 1000,
      designWavelengthNm: 1064,
      bandMinNm: 1000,
      bandMaxNm: 1100,
      transmissionPpm: { value: 10 + ((i * 7919) % 5000) / 10, tol: 1 },
      lossPpm: { value: 5 },
      aoiDeg: 0,
    }));
    const top = bestPairs(goal, mirrors, 3);
    expect(top).toHaveLength(3);
    const lowest = mirrors
      .map((m, i) => ({ i, loss: m.transmissionPpm.value }))
      .sort((x, y) => x.loss - y.loss)
      .slice(0, 2)
      .map((x) => x.i);
    expect([top[0]?.a, top[0]?.b]).toEqual(lowest);
    expect(top[0]?.result.finesse?.worst).toBeGreaterThanOrEqual(top[1]?.result.finesse?.worst as number);
  });

  test('k must be a positive integer', () => {
    expect(() => bestPairs(goal, [], 0)).toThrow(FitInputError);
  });
});

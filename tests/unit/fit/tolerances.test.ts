import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { FitInputError, finesseFromMirrorLosses, worstCase } from '../../../src/lib/fit';

const finite = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

describe('worstCase: interval arithmetic at the pessimistic ends (physics.md A12 form 12.5)', () => {
  test('finesse worst case puts both losses at +tol', () => {
    const r = worstCase(({ l1, l2 }) => finesseFromMirrorLosses({ loss1: l1, loss2: l2 }), {
      l1: { value: 10e-6, tol: 2e-6 },
      l2: { value: 20e-6, tol: 5e-6 },
    });
    expect(r.nominal).toBeCloseTo(finesseFromMirrorLosses({ loss1: 10e-6, loss2: 20e-6 }), 6);
    expect(r.worst).toBeCloseTo(finesseFromMirrorLosses({ loss1: 12e-6, loss2: 25e-6 }), 6);
    expect(r.best).toBeCloseTo(finesseFromMirrorLosses({ loss1: 8e-6, loss2: 15e-6 }), 6);
  });

  test('lower-is-better swaps the ends; plain numbers are exact', () => {
    const r = worstCase(({ a, b }) => a / b, { a: { value: 2, tol: 1 }, b: 4 }, { better: 'lower' });
    expect(r).toEqual({ nominal: 0.5, worst: 0.75, best: 0.25 });
  });

  test('min/max clamp the tolerance ends to the physical domain', () => {
    const r = worstCase(({ t }) => t, { t: { value: 1, tol: 5, min: 0 } });
    expect(r.worst).toBe(0);
    expect(r.best).toBe(6);
  });

  test('negative tolerance and a non-finite formula value throw FitInputError', () => {
    expect(() => worstCase(({ a }) => a, { a: { value: 1, tol: -1 } })).toThrow(FitInputError);
    expect(() => worstCase(({ a }) => 1 / a, { a: { value: 1, tol: 1 } })).toThrow(FitInputError);
  });

  test('worst ≤ nominal ≤ best for monotone formulas (fast-check)', () => {
    const tolerated = fc.record({ value: finite(0.1, 100), tol: finite(0, 0.09) });
    fc.assert(
      fc.property(tolerated, tolerated, tolerated, fc.constantFrom<'higher' | 'lower'>('higher', 'lower'), (a, b, c, better) => {
        const r = worstCase(({ a: x, b: y, c: z }) => (x * y) / z + Math.sqrt(x), { a, b, c }, { better });
        if (better === 'higher') {
          expect(r.worst).toBeLessThanOrEqual(r.nominal);
          expect(r.nominal).toBeLessThanOrEqual(r.best);
        } else {
          expect(r.worst).toBeGreaterThanOrEqual(r.nominal);
          expect(r.nominal).toBeGreaterThanOrEqual(r.best);
        }
      }),
    );
  });
});

import { expect } from 'vitest';

/** |got − expected| / |expected| ≤ tol, the "rel" tolerance of physics.md. */
export function expectRel(got: number | null | undefined, expected: number, tol: number): void {
  expect(got, 'value').toBeTypeOf('number');
  const rel = Math.abs((got as number) - expected) / Math.abs(expected);
  expect(rel, `got ${got}, expected ${expected} (rel ${tol})`).toBeLessThanOrEqual(tol);
}

/** |got − expected| ≤ tol, the "abs" tolerance of physics.md. */
export function expectAbs(got: number | null | undefined, expected: number, tol: number): void {
  expect(got, 'value').toBeTypeOf('number');
  expect(Math.abs((got as number) - expected), `got ${got}, expected ${expected} (abs ${tol})`).toBeLessThanOrEqual(tol);
}

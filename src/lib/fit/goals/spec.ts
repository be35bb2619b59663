// Reading listing specs: toleranced numbers and single-wavelength values (physics.md A12 form 12.5:
// interval arithmetic at the pessimistic ends).

import type { CurvePoint } from '../interpolate';
import { nonNegative, positive, requireArray, requireObject } from '../validate';
import type { TolerancedSpec } from './types';

/**
 * A value quoted at one wavelength (a QE, an efficiency, a ring-down) is taken to hold within this
 * distance of it. Coating and detector responses change on the scale of tens of nm, so 1 nm keeps
 * the value meaningful without demanding an exact match to the quoted wavelength.
 */
export const SINGLE_WAVELENGTH_MATCH_NM = 1;

export interface Spread {
  nominal: number;
  low: number;
  high: number;
}

/** { value, tol? } with value ≥ 0, as nominal and its ± ends clamped at 0 (and at `max` when given). */
export function spread(field: string, v: TolerancedSpec, max = Infinity): Spread {
  const o = requireObject(field, v);
  const nominal = nonNegative(`${field}.value`, o.value);
  const tol = o.tol === undefined ? 0 : nonNegative(`${field}.tol`, o.tol);
  return { nominal, low: Math.max(0, nominal - tol), high: Math.min(max, nominal + tol) };
}

export function exact(x: number): Spread {
  return { nominal: x, low: x, high: x };
}

/** A measured curve stored as objects ({ wavelengthNm, qe } …), checked and turned into x/y points. */
export function readCurve(
  field: string,
  points: unknown,
  xKey: string,
  yKey: string,
  checkY: (field: string, v: unknown) => number,
): CurvePoint[] {
  return requireArray(field, points).map((p, i) => {
    const o = requireObject(`${field}[${i}]`, p);
    return { x: positive(`${field}[${i}].${xKey}`, o[xKey]), y: checkY(`${field}[${i}].${yKey}`, o[yKey]) };
  });
}

export function nearWavelength(a: number, b: number): boolean {
  return Math.abs(a - b) <= SINGLE_WAVELENGTH_MATCH_NM;
}

// Measured curves (spectra, QE curves, efficiency curves): linear interpolation between measured
// points and no value outside them (physics.md A12 form 12.6: never extrapolate).

import { FitInputError } from './errors';
import { finite } from './validate';

export interface CurvePoint {
  x: number;
  y: number;
}

/** Linear interpolation of y(x) on points given in any order; null outside [min x, max x]. */
export function interpolateCurve(field: string, points: readonly CurvePoint[], x: number): number | null {
  if (points.length === 0) throw new FitInputError(field, 'needs at least one measured point');
  let sorted = true;
  for (let i = 0; i < points.length; i++) {
    const p = points[i] as CurvePoint;
    finite(`${field}[${i}]`, p.x);
    finite(`${field}[${i}]`, p.y);
    if (i > 0 && p.x <= (points[i - 1] as CurvePoint).x) sorted = false;
  }
  const pts = sorted ? points : [...points].sort((a, b) => a.x - b.x);
  if (!sorted) {
    for (let i = 1; i < pts.length; i++) {
      if ((pts[i] as CurvePoint).x === (pts[i - 1] as CurvePoint).x) {
        throw new FitInputError(field, `has two points at ${(pts[i] as CurvePoint).x}`);
      }
    }
  }
  const first = pts[0] as CurvePoint;
  const last = pts[pts.length - 1] as CurvePoint;
  if (x < first.x || x > last.x) return null;
  if (pts.length === 1) return first.y;
  let lo = 0;
  let hi = pts.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if ((pts[mid] as CurvePoint).x <= x) lo = mid;
    else hi = mid;
  }
  const a = pts[lo] as CurvePoint;
  const b = pts[hi] as CurvePoint;
  // Differences of extreme abscissae can overflow; halving both first cannot, and the weighted
  // mean below never exceeds the larger |y|.
  const span = b.x - a.x;
  const f = Number.isFinite(span) ? (x - a.x) / span : (x / 2 - a.x / 2) / (b.x / 2 - a.x / 2);
  const t = Math.min(1, Math.max(0, f));
  return a.y * (1 - t) + b.y * t;
}

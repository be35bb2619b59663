import type { CurvePoint } from '../../../lib/fit';

/**
 * interpolateCurve's linear interpolation (no value outside the measured points) on points already
 * checked and sorted when the listing was read, so a search does not check them again.
 */
export function lerpSorted(points: readonly CurvePoint[], x: number): number | null {
  const n = points.length;
  if (n === 0) return null;
  const first = points[0]!;
  const last = points[n - 1]!;
  if (x < first.x || x > last.x) return null;
  if (n === 1) return first.y;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (points[mid]!.x <= x) lo = mid;
    else hi = mid;
  }
  const a = points[lo]!;
  const b = points[hi]!;
  const span = b.x - a.x;
  const f = Number.isFinite(span) ? (x - a.x) / span : (x / 2 - a.x / 2) / (b.x / 2 - a.x / 2);
  const t = Math.min(1, Math.max(0, f));
  return a.y * (1 - t) + b.y * t;
}

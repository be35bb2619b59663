// What is kept of a parsed measurement: the fit and figures are computed from every point first;
// the stored points only need to draw the plot and interpolate, so long files keep an even subset.

import type { MeasurementData } from './types';

export const STORED_POINTS_MAX = 2000;

function every<T>(points: readonly T[], max: number): T[] {
  if (points.length <= max) return [...points];
  const step = (points.length - 1) / (max - 1);
  return Array.from({ length: max }, (_, i) => points[Math.round(i * step)]!);
}

/** Ring-down traces are thinned; spectra and efficiency curves keep every measured point (they feed interpolation). */
export function forStorage(data: MeasurementData, max = STORED_POINTS_MAX): MeasurementData {
  if (data.kind !== 'ringdown' || data.points.length <= max) return data;
  return {
    ...data,
    points: every(data.points, max),
    notes: [...data.notes, `trace of ${data.points.length} points stored as ${max} for display; the fit used all of them`],
  };
}

/**
 * Figures and headroom of goal results in words, for the result list and the saved-search e-mail,
 * with the same rules as the fit report: large counts in thin-space groups, dB to 0.01, SI prefixes.
 */
import type { GoalResult } from '../fit';
import { formatCount, formatSI, THIN } from '../units';

export function formatFigure(x: number | null, unit: string): string {
  if (x === null) return '—';
  if (unit === '') return formatCount(x);
  if (unit === 'dB') return `${x.toFixed(2)}${THIN}dB`;
  if (unit === 'nm') return `${Number(x.toPrecision(6))}${THIN}nm`;
  return formatSI(x, unit);
}

/** "+35.0 % finesse" style: dB for squeezing, per cent otherwise; empty without a headroom. */
export function formatHeadroom(r: Pick<GoalResult, 'headroom' | 'unit'>): string {
  if (r.headroom === null) return '';
  const sign = r.headroom >= 0 ? '+' : '−';
  if (r.unit === 'dB') return `${sign}${Math.abs(r.headroom).toFixed(2)}${THIN}dB`;
  return `${sign}${Number((Math.abs(r.headroom) * 100).toPrecision(3))}${THIN}%`;
}

/**
 * Units people type and read, converted to the base units the fit engine takes, and numbers shown
 * the way the design asks: an SI prefix that keeps the mantissa in 1–999, a thin space before the unit.
 */
export const THIN = '\u2009';

export interface UnitOption {
  /** What the picker shows. */
  label: string;
  /** Multiply a typed value by this to get the base unit. */
  factor: number;
}

export const UNITS = {
  length: {
    nm: { label: 'nm', factor: 1e-9 },
    um: { label: 'µm', factor: 1e-6 },
    mm: { label: 'mm', factor: 1e-3 },
    cm: { label: 'cm', factor: 1e-2 },
    m: { label: 'm', factor: 1 },
  },
  fraction: { ppm: { label: 'ppm', factor: 1e-6 }, pct: { label: '%', factor: 1e-2 }, frac: { label: 'fraction', factor: 1 } },
  frequency: {
    Hz: { label: 'Hz', factor: 1 },
    kHz: { label: 'kHz', factor: 1e3 },
    MHz: { label: 'MHz', factor: 1e6 },
    GHz: { label: 'GHz', factor: 1e9 },
  },
  time: {
    ps: { label: 'ps', factor: 1e-12 },
    ns: { label: 'ns', factor: 1e-9 },
    us: { label: 'µs', factor: 1e-6 },
    ms: { label: 'ms', factor: 1e-3 },
    s: { label: 's', factor: 1 },
  },
  rate: { perS: { label: '/s', factor: 1 }, kperS: { label: 'k/s', factor: 1e3 }, MperS: { label: 'M/s', factor: 1e6 } },
  power: { uW: { label: 'µW', factor: 1e-6 }, mW: { label: 'mW', factor: 1e-3 }, W: { label: 'W', factor: 1 } },
  angle: { mrad: { label: 'mrad', factor: 1e-3 }, rad: { label: 'rad', factor: 1 }, deg: { label: '°', factor: Math.PI / 180 } },
} as const satisfies Record<string, Record<string, UnitOption>>;

export type Dimension = keyof typeof UNITS;
export type UnitKey<D extends Dimension> = keyof (typeof UNITS)[D] & string;

export function toBase<D extends Dimension>(dimension: D, value: number, unit: UnitKey<D>): number {
  return value * (UNITS[dimension][unit] as UnitOption).factor;
}

const PREFIXES: [number, string][] = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
  [1e-15, 'f'],
];

function trimmed(x: number, sig: number): string {
  return String(Number(x.toPrecision(sig)));
}

/** The prefix whose mantissa lands in 1–999 (0.9995 so that 999.6 reads 1 k, not 1000). */
export function siPrefix(x: number): [factor: number, prefix: string] {
  const a = Math.abs(x);
  if (a === 0) return [1, ''];
  return PREFIXES.find(([f]) => a >= f * 0.9995) ?? PREFIXES[PREFIXES.length - 1]!;
}

/** 47716 Hz → "47.7 kHz"; 3.335e-6 s → "3.34 µs" (thin space). */
export function formatSI(value: number, unit: string, sig = 3): string {
  if (!Number.isFinite(value)) return '—';
  const [f, p] = siPrefix(value);
  return `${trimmed(value / f, sig)}${THIN}${p}${unit}`;
}

/** Large dimensionless figures with thin-space digit groups: 312 585 → "313 000" at 3 significant figures. */
export function formatCount(value: number, sig = 3): string {
  if (!Number.isFinite(value)) return '—';
  const a = Math.abs(value);
  if (a >= 1e9 || (a < 1e-3 && a !== 0)) return value.toExponential(sig - 1).replace('e+', 'e');
  const rounded = Number(value.toPrecision(sig));
  const [int, frac] = String(rounded).split('.');
  const grouped = int!.replace(/\B(?=(\d{3})+(?!\d))/g, THIN);
  return frac ? `${grouped}.${frac}` : grouped;
}

/** A power fraction as ppm below 0.1 %, else as a percentage. */
export function formatFraction(x: number, sig = 3): string {
  if (!Number.isFinite(x)) return '—';
  if (Math.abs(x) < 1e-3) return `${trimmed(x * 1e6, sig)}${THIN}ppm`;
  return `${trimmed(x * 100, sig)}${THIN}%`;
}

export function formatDb(db: number, digits = 2): string {
  return Number.isFinite(db) ? `${db.toFixed(digits)}${THIN}dB` : '—';
}

/** "40 ± 5 ppm" */
export function formatTolerance(value: number, tol: number | undefined, unit: string): string {
  const v = trimmed(value, 4);
  return tol ? `${v} ± ${trimmed(tol, 3)}${THIN}${unit}` : `${v}${THIN}${unit}`;
}

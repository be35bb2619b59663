// Number formatting for the plain-words reasons of the goal evaluators.

/**
 * `digits` significant figures without exponent noise for everyday magnitudes. Rounds with
 * arithmetic rather than toPrecision, which is slow enough to dominate a catalogue-wide search.
 */
export function fmt(x: number, digits = 3): string {
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-3) return x.toExponential(digits - 1);
  const shift = digits - 1 - Math.floor(Math.log10(a));
  if (shift >= 0) {
    const p = 10 ** shift;
    return String(Math.round(x * p) / p);
  }
  const q = 10 ** -shift;
  return String(Math.round(x / q) * q);
}

function scaled(x: number, units: readonly [number, string][]): string {
  for (const [factor, name] of units) {
    if (Math.abs(x) >= factor) return `${fmt(x / factor)} ${name}`;
  }
  const last = units[units.length - 1] as [number, string];
  return `${fmt(x / last[0])} ${last[1]}`;
}

export function formatLength(m: number): string {
  return scaled(m, [
    [1e3, 'km'],
    [1, 'm'],
    [1e-3, 'mm'],
    [1e-6, 'µm'],
    [1e-9, 'nm'],
  ]);
}

export function formatHz(hz: number): string {
  return scaled(hz, [
    [1e9, 'GHz'],
    [1e6, 'MHz'],
    [1e3, 'kHz'],
    [1, 'Hz'],
    [1e-3, 'mHz'],
  ]);
}

export function formatSeconds(s: number): string {
  return scaled(s, [
    [1, 's'],
    [1e-3, 'ms'],
    [1e-6, 'µs'],
    [1e-9, 'ns'],
    [1e-12, 'ps'],
  ]);
}

export function formatWatts(w: number): string {
  return scaled(w, [
    [1, 'W'],
    [1e-3, 'mW'],
    [1e-6, 'µW'],
    [1e-9, 'nW'],
  ]);
}

export function formatNm(nm: number): string {
  return `${fmt(nm, 6)} nm`;
}

export function formatPercent(fraction: number): string {
  return `${fmt(fraction * 100)} %`;
}

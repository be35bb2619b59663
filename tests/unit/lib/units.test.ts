import { describe, expect, test } from 'vitest';
import { formatCount, formatDb, formatFraction, formatSI, formatTolerance, THIN, toBase } from '../../../src/lib/units';

describe('formatSI picks the prefix that keeps the mantissa in 1–999, with a thin space', () => {
  test.each([
    [95467, 'Hz', `95.5${THIN}kHz`],
    [47716, 'Hz', `47.7${THIN}kHz`],
    [1.498962e9, 'Hz', `1.5${THIN}GHz`],
    [3.33547e-6, 's', `3.34${THIN}µs`],
    [0.0254, 'm', `25.4${THIN}mm`],
    [999.6, 'Hz', `1${THIN}kHz`],
    [0, 'W', `0${THIN}W`],
  ])('%d %s → %s', (v, unit, out) => expect(formatSI(v, unit)).toBe(out));

  test('never prints NaN or Infinity', () => {
    expect(formatSI(NaN, 'Hz')).toBe('—');
    expect(formatSI(Infinity, 'Hz')).toBe('—');
  });
});

describe('other formats', () => {
  test('large counts get thin-space groups', () => {
    expect(formatCount(312585)).toBe(`313${THIN}000`);
    expect(formatCount(29.8038)).toBe('29.8');
  });
  test('fractions below 0.1 % read in ppm, else percent', () => {
    expect(formatFraction(12e-6)).toBe(`12${THIN}ppm`);
    expect(formatFraction(0.9231)).toBe(`92.3${THIN}%`);
  });
  test('tolerances read "40 ± 5 ppm"; dB keeps two decimals', () => {
    expect(formatTolerance(40, 5, 'ppm')).toBe(`40 ± 5${THIN}ppm`);
    expect(formatTolerance(40, undefined, 'ppm')).toBe(`40${THIN}ppm`);
    expect(formatDb(7.21249)).toBe(`7.21${THIN}dB`);
  });
  test('toBase converts typed units to base units', () => {
    expect(toBase('fraction', 12, 'ppm')).toBeCloseTo(12e-6, 15);
    expect(toBase('length', 852, 'nm')).toBeCloseTo(852e-9, 15);
    expect(toBase('frequency', 5, 'MHz')).toBe(5e6);
  });
});

import { describe, expect, test } from 'vitest';
import { CATEGORIES } from '../../../src/lib/listings/constants';
import { specRows, specsToText } from '../../../src/lib/specs';
import { THIN } from '../../../src/lib/units';
import { LASER_SPECS, MIRROR_SPECS, PHOTODIODE_SPECS, SPD_SPECS, SPECS_BY_CATEGORY } from './fixtures';

function row(rows: { label: string; value: string }[], label: string): string | undefined {
  return rows.find((r) => r.label === label)?.value;
}

describe('specRows: units after a thin space, SI prefixes for 1–999, tolerances as "40 ± 5 ppm" (design.md)', () => {
  const mirror = specRows('cavity-mirror', MIRROR_SPECS);

  test('the mirror table', () => {
    expect(row(mirror, 'Transmission')).toBe(`2 ± 0.5${THIN}ppm`);
    expect(row(mirror, 'Loss (absorption + scatter)')).toBe(`8${THIN}ppm`);
    expect(row(mirror, 'Radius of curvature')).toBe(`1${THIN}m`);
    expect(row(mirror, 'Coating band')).toBe(`760–800${THIN}nm`);
    expect(row(mirror, 'Design wavelength')).toBe(`780${THIN}nm`);
    expect(row(mirror, 'Diameter')).toBe(`7.75${THIN}mm`);
    expect(row(mirror, 'Angle of incidence')).toBe('0°');
    expect(mirror.map((r) => r.label)).not.toContain('Coating band to');
  });

  test('"flat" for a planar mirror; radii below 1 m in mm', () => {
    expect(row(specRows('cavity-mirror', { ...MIRROR_SPECS, rocMm: null }), 'Radius of curvature')).toBe('flat');
    expect(row(specRows('cavity-mirror', { ...MIRROR_SPECS, rocMm: 250 }), 'Radius of curvature')).toBe(`250${THIN}mm`);
  });

  test('prefixes keep the mantissa in 1–999', () => {
    const pd = specRows('photodiode', { ...PHOTODIODE_SPECS, bandwidthHz: 95_467 });
    expect(row(pd, 'Bandwidth (−3 dB)')).toBe(`95.47${THIN}kHz`);
    expect(row(pd, 'Input-referred electronic noise')).toBe(`5 ± 1${THIN}pA/√Hz`);
    expect(row(pd, 'Quantum efficiency')).toBe(`99 ± 0.5${THIN}%`);
    expect(row(specRows('laser', LASER_SPECS), 'Linewidth (FWHM)')).toBe(`1 ± 0.2${THIN}kHz`);
    expect(row(specRows('single-photon-detector', SPD_SPECS), 'Timing jitter (FWHM)')).toBe(`50${THIN}ps`);
  });

  test('selects read their label, booleans yes or no; absent optional specs have no row', () => {
    const laser = specRows('laser', LASER_SPECS);
    expect(row(laser, 'Laser hazard class')).toBe('Class 4');
    expect(row(laser, 'Fibre output')).toBe('no');
    const { roughnessNm: _omitted, ...rest } = MIRROR_SPECS;
    expect(specRows('cavity-mirror', rest).map((r) => r.label)).not.toContain('Surface roughness (rms)');
  });

  test.each(CATEGORIES)('%s: every row has a value, none prints NaN or undefined', (category) => {
    const rows = specRows(category, SPECS_BY_CATEGORY[category]);
    expect(rows.length).toBeGreaterThan(3);
    for (const r of rows) expect(r.value).not.toMatch(/NaN|undefined|^$/);
  });
});

describe('specsToText', () => {
  test('the mirror reads as searchable words with plain spaces', () => {
    const text = specsToText('cavity-mirror', MIRROR_SPECS);
    expect(text).toContain('transmission 2 ppm loss 8 ppm');
    expect(text).toContain('780 nm band 760–800 nm');
    expect(text).toContain('ROC 1 m');
    expect(text).not.toContain(THIN);
    expect(text).not.toContain('±');
  });
  test('true booleans add their word, false ones nothing', () => {
    const text = specsToText('laser', LASER_SPECS);
    expect(text).toContain('single-frequency');
    expect(text).not.toContain('fibre output');
    expect(text).toContain('Class 4');
  });
  test('a flat mirror says so', () => {
    expect(specsToText('cavity-mirror', { ...MIRROR_SPECS, rocMm: null })).toContain('ROC flat');
  });
});

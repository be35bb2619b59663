import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { CATEGORIES } from '../../../src/lib/listings/constants';
import {
  CATEGORY_FIELDS,
  normaliseFormValue,
  parseTypedNumber,
  toFormValues,
  toStoredSpecs,
  type FieldDef,
  type FormValues,
} from '../../../src/lib/specs';
import { expectRel } from '../fit/helpers';
import { MIRROR_SPECS, SPECS_BY_CATEGORY } from './fixtures';

function field(category: (typeof CATEGORIES)[number], path: string): FieldDef {
  const f = CATEGORY_FIELDS[category].find((d) => d.path === path);
  if (f === undefined) throw new Error(`no field ${path}`);
  return f;
}

function stored(f: FieldDef, value: string, unit: string, draft: Record<string, unknown> = {}, tol?: string): unknown {
  const r = normaliseFormValue(f, tol === undefined ? { value, unit } : { value, unit, tol }, draft);
  if (!r.ok) throw new Error(r.message);
  return r.value;
}

const MIRROR_FORM: FormValues = {
  diameterMm: { value: '0.5', unit: 'in' },
  substrate: 'fused silica',
  rocMm: { value: '1', unit: 'm' },
  designWavelengthNm: { value: '0.78', unit: 'um' },
  bandMinNm: { value: '760', unit: 'nm' },
  bandMaxNm: { value: '800', unit: 'nm' },
  transmissionPpm: { value: '2', unit: 'ppm', tol: '0.5' },
  lossPpm: { value: '0.0008', unit: 'pct' },
  aoiDeg: { value: '0', unit: 'deg' },
  roughnessNm: { value: '1', unit: 'angstrom' },
};

describe('typed numbers', () => {
  test.each([
    ['12', 12],
    [' 1.5 ', 1.5],
    ['0,5', 0.5],
    ['300 000', 300000],
    ['300\u2009000', 300000],
    ['1e-6', 1e-6],
    ['\u22123', -3],
    ['±5', 5],
    ['', null],
    ['abc', null],
    ['0x10', null],
    ['1,000.5', null],
  ])('%j → %s', (text, n) => expect(parseTypedNumber(text)).toBe(n));
});

describe('unit conversions to the stored unit', () => {
  test('plain factors: ppm and %, nm and µm, mm, m and inch, Hz prefixes, ps–s, µW–W', () => {
    expect(stored(field('cavity-mirror', 'transmissionPpm'), '0.0012', 'pct')).toEqual({ value: 12 });
    expect(stored(field('cavity-mirror', 'designWavelengthNm'), '1.064', 'um')).toBe(1064);
    expect(stored(field('cavity-mirror', 'diameterMm'), '1', 'in')).toBe(25.4);
    expect(stored(field('cavity-mirror', 'rocMm'), '0.5', 'm')).toBe(500);
    expect(stored(field('photodiode', 'bandwidthHz'), '100', 'MHz')).toBe(100e6);
    expect(stored(field('single-photon-detector', 'jitterFwhmS'), '50', 'ps')).toBe(50e-12);
    expect(stored(field('single-photon-detector', 'deadTimeS'), '45', 'ns')).toBe(45e-9);
    expect(stored(field('laser', 'powerW'), '500', 'mW', {}, '20')).toEqual({ value: 0.5, tol: 0.02 });
    expect(stored(field('photodiode', 'darkCurrentA'), '2', 'nA')).toBe(2e-9);
    expect(stored(field('single-photon-detector', 'efficiency'), '85', 'pct')).toEqual({ value: 0.85 });
  });

  test('A/W → QE needs the wavelength: 1.2 A/W at 1550 nm → 0.959878, 0.6 A/W at 1064 nm → 0.699159 (physics.md A12.1, form 12.1, CODATA 2018 constants)', () => {
    const qe = field('photodiode', 'quantumEfficiency');
    const a = stored(qe, '1.2', 'A/W', { wavelengthNm: 1550 }) as { value: number };
    expectRel(a.value, 0.959878, 1e-5);
    const b = stored(qe, '0.6', 'A/W', { wavelengthNm: 1064 }, '0.01') as { value: number; tol: number };
    expectRel(b.value, 0.699159, 1e-5);
    expectRel(b.tol, 0.699159 / 60, 1e-5);
    const r = normaliseFormValue(qe, { value: '1.2', unit: 'A/W' }, {});
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toMatch(/wavelength/);
  });

  test('NEP → noise current needs the responsivity: i_n = NEP·ℜ, with ℜ from QE 0.959878 at 1550 nm = 1.2 A/W (physics.md A12.1 inverted)', () => {
    const noise = field('photodiode', 'noiseCurrentAPerRtHz');
    const draft = { wavelengthNm: 1550, quantumEfficiency: { value: 0.959878 } };
    const n = stored(noise, '5', 'nep-pW/rtHz', draft) as { value: number };
    expectRel(n.value, 6e-12, 1e-5);
    expect(stored(noise, '5', 'pA/rtHz')).toEqual({ value: 5e-12 });
    const r = normaliseFormValue(noise, { value: '5', unit: 'nep-pW/rtHz' }, { wavelengthNm: 1550 });
    expect(!r.ok && r.message).toMatch(/responsivity/);
  });

  test('a linewidth in pm becomes Hz at the centre wavelength: Δν = cΔλ/λ² (physics.md A8 form 8.3)', () => {
    const lw = stored(field('laser', 'linewidthHz'), '1', 'pm', { centreWavelengthNm: 1064 }) as { value: number };
    expectRel(lw.value, (299_792_458 * 1e-12) / 1064e-9 / 1064e-9, 1e-9);
  });

  test('flat mirrors store null; an empty optional field stores nothing; a lone tolerance is refused', () => {
    expect(normaliseFormValue(field('cavity-mirror', 'rocMm'), { value: '', unit: 'mm', flat: true })).toEqual({ ok: true, value: null });
    expect(normaliseFormValue(field('cavity-mirror', 'thicknessMm'), { value: ' ', unit: 'mm' })).toEqual({ ok: true, value: undefined });
    expect(normaliseFormValue(field('cavity-mirror', 'lossPpm'), { value: '', unit: 'ppm', tol: '1' }).ok).toBe(false);
  });

  test('a list of poling periods', () => {
    expect(stored(field('nonlinear-crystal', 'polingPeriodsUm'), '9.0, 9.1; 9.2', 'um')).toEqual([9, 9.1, 9.2]);
    expect(normaliseFormValue(field('nonlinear-crystal', 'polingPeriodsUm'), { value: '9.0, x', unit: 'um' }).ok).toBe(false);
  });
});

describe('toStoredSpecs', () => {
  test('the mirror form in mixed units becomes the stored contract', () => {
    const r = toStoredSpecs('cavity-mirror', MIRROR_FORM);
    expect(r.ok && r.specs).toEqual({
      diameterMm: 12.7,
      substrate: 'fused silica',
      rocMm: 1000,
      designWavelengthNm: 780,
      bandMinNm: 760,
      bandMaxNm: 800,
      transmissionPpm: { value: 2, tol: 0.5 },
      lossPpm: { value: 8 },
      aoiDeg: 0,
      roughnessNm: 0.1,
    });
  });

  test('R given instead of the loss: loss = 1 − R − T with the tolerance of R (physics.md A1, R = 1 − T − loss)', () => {
    const r = toStoredSpecs('cavity-mirror', {
      ...MIRROR_FORM,
      lossPpm: { value: '', unit: 'ppm', tol: '' },
      reflectivity: { value: '99.999', unit: 'pct', tol: '0.0001' },
    });
    expect(r.ok && r.specs.lossPpm).toEqual({ value: 8, tol: 1 });
  });

  test('R with T above 100 % is an error on the reflectivity; giving both loss and R is refused', () => {
    const over = toStoredSpecs('cavity-mirror', {
      ...MIRROR_FORM,
      lossPpm: { value: '', unit: 'ppm' },
      reflectivity: { value: '99.99999', unit: 'pct' },
    });
    expect(!over.ok && over.errors['reflectivity']).toMatch(/exceed 100 %/);
    const both = toStoredSpecs('cavity-mirror', { ...MIRROR_FORM, reflectivity: { value: '99.999', unit: 'pct' } });
    expect(!both.ok && both.errors['reflectivity']).toMatch(/not both/);
  });

  test('schema errors come back keyed by form field: field checks first, then the cross-field checks', () => {
    const bad = toStoredSpecs('cavity-mirror', { ...MIRROR_FORM, diameterMm: { value: 'wide', unit: 'mm' } });
    expect(!bad.ok && bad.errors).toEqual({ diameterMm: 'Enter a number for the value.' });
    const outside = toStoredSpecs('cavity-mirror', { ...MIRROR_FORM, designWavelengthNm: { value: '1064', unit: 'nm' } });
    expect(!outside.ok && outside.errors['designWavelengthNm']).toMatch(/outside the coating band/);
  });

  test('a required field left empty is reported as required', () => {
    const r = toStoredSpecs('cavity-mirror', { ...MIRROR_FORM, substrate: '' });
    expect(!r.ok && r.errors['substrate']).toBe('Required.');
  });

  test('a conversion that lacks its input is reported on that field', () => {
    const r = toStoredSpecs('photodiode', {
      material: 'Si',
      quantumEfficiency: { value: '0.5', unit: 'A/W' },
      bandwidthHz: { value: '10', unit: 'MHz' },
    });
    expect(!r.ok && r.errors['quantumEfficiency']).toMatch(/wavelength/);
  });
});

describe('toFormValues is the inverse of toStoredSpecs', () => {
  test.each(CATEGORIES)('%s: stored → form → stored gives the same specs', (category) => {
    const specs = SPECS_BY_CATEGORY[category] as Record<string, unknown>;
    const r = toStoredSpecs(category, toFormValues(category, specs));
    expect(r.ok && r.specs).toEqual(specs);
  });

  test('a chosen unit pre-fills in that unit; the flat box is ticked for a flat mirror', () => {
    const v = toFormValues('cavity-mirror', { ...MIRROR_SPECS, rocMm: null }, { transmissionPpm: 'pct', designWavelengthNm: 'um' });
    expect(v['transmissionPpm']).toEqual({ value: '0.0002', unit: 'pct', tol: '0.00005' });
    expect(v['designWavelengthNm']).toEqual({ value: '0.78', unit: 'um' });
    expect(v['rocMm']).toEqual({ value: '', unit: 'mm', flat: true });
  });

  test('a unit whose conversion lacks its input falls back to a plain unit', () => {
    const v = toFormValues('photodiode', { bandwidthHz: 1e6, quantumEfficiency: { value: 0.9 } }, { quantumEfficiency: 'A/W' });
    expect(v['quantumEfficiency']).toEqual({ value: '90', unit: 'pct', tol: '' });
  });

  test('property: any mirror with T + loss < 10⁶ ppm round-trips through the form in any offered units', () => {
    const fields = CATEGORY_FIELDS['cavity-mirror'];
    const unitKeys = (path: string) => (fields.find((f) => f.path === path)?.units ?? []).map((u) => u.key);
    fc.assert(
      fc.property(
        fc.record({
          diameterMm: fc.double({ min: 1, max: 100, noNaN: true }),
          rocMm: fc.option(fc.double({ min: 10, max: 1e5, noNaN: true }), { nil: null }),
          bandMinNm: fc.double({ min: 300, max: 1500, noNaN: true }),
          width: fc.double({ min: 1, max: 300, noNaN: true }),
          where: fc.double({ min: 0, max: 1, noNaN: true }),
          t: fc.oneof(fc.constant(0), fc.double({ min: 1e-6, max: 5e5, noNaN: true })),
          loss: fc.oneof(fc.constant(0), fc.double({ min: 1e-6, max: 4e5, noNaN: true })),
          tol: fc.option(fc.double({ min: 1e-6, max: 10, noNaN: true }), { nil: undefined }),
        }),
        fc.record({
          diameterMm: fc.constantFrom(...unitKeys('diameterMm')),
          rocMm: fc.constantFrom(...unitKeys('rocMm')),
          transmissionPpm: fc.constantFrom(...unitKeys('transmissionPpm')),
          designWavelengthNm: fc.constantFrom(...unitKeys('designWavelengthNm')),
        }),
        (g, units) => {
          const round = (x: number) => Number(x.toPrecision(9));
          const bandMinNm = round(g.bandMinNm);
          const bandMaxNm = round(g.bandMinNm + g.width);
          const specs = {
            ...MIRROR_SPECS,
            diameterMm: round(g.diameterMm),
            rocMm: g.rocMm === null ? null : round(g.rocMm),
            bandMinNm,
            bandMaxNm,
            designWavelengthNm: Math.min(bandMaxNm, Math.max(bandMinNm, round(bandMinNm + g.where * g.width))),
            transmissionPpm: g.tol === undefined ? { value: round(g.t) } : { value: round(g.t), tol: round(g.tol) },
            lossPpm: { value: round(g.loss) },
          };
          const r = toStoredSpecs('cavity-mirror', toFormValues('cavity-mirror', specs, units));
          expect(r.ok && r.specs).toEqual(specs);
        },
      ),
    );
  });
});

import { describe, expect, test } from 'vitest';
import { CATEGORIES } from '../../../src/lib/listings/constants';
import { ListingInputSchema, parseListingPatch, SPEC_SCHEMAS } from '../../../src/lib/specs';
import { MIRROR_LISTING, MIRROR_SPECS, SPECS_BY_CATEGORY } from './fixtures';

function issuesOf(body: unknown): Record<string, string> {
  const r = ListingInputSchema.safeParse(body);
  if (r.success) return {};
  return Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message]));
}

function mirror(specs: Record<string, unknown>) {
  return { ...MIRROR_LISTING, specs: { ...MIRROR_SPECS, ...specs } };
}

describe('the cavity-mirror contract of POST /api/listings', () => {
  test('a listing in the contract shape passes and keeps every spec', () => {
    const r = ListingInputSchema.safeParse(MIRROR_LISTING);
    expect(r.success).toBe(true);
    expect(r.success && r.data.specs).toEqual(MIRROR_SPECS);
  });

  test('unknown top-level keys (the lab choice, a version) are dropped rather than refused', () => {
    const r = ListingInputSchema.safeParse({ ...MIRROR_LISTING, labId: 'lab_1', status: 'live' });
    expect(r.success && 'status' in r.data).toBe(false);
  });

  test('T + loss ≥ 10⁶ ppm fails at specs.transmissionPpm.value and specs.lossPpm.value — R = 1 − T − loss (physics.md A1, Hecht, Optics 5th ed. 2017 §9.6)', () => {
    const issues = issuesOf(mirror({ transmissionPpm: { value: 600_000 }, lossPpm: { value: 400_000 } }));
    expect(issues['specs.transmissionPpm.value']).toMatch(/below 1 000 000 ppm/);
    expect(issues['specs.lossPpm.value']).toMatch(/below 1 000 000 ppm/);
    expect(issuesOf(mirror({ transmissionPpm: { value: 600_000 }, lossPpm: { value: 399_999 } }))).toEqual({});
  });

  test('a design wavelength outside the coating band fails at specs.designWavelengthNm — the band over which the coating spec holds (product.md, Cavity mirror; common practice)', () => {
    expect(issuesOf(mirror({ designWavelengthNm: 852 }))['specs.designWavelengthNm']).toMatch(/outside the coating band 760–800 nm/);
    expect(issuesOf(mirror({ designWavelengthNm: 760 }))).toEqual({});
    expect(issuesOf(mirror({ designWavelengthNm: 800 }))).toEqual({});
  });

  test('an inverted or empty band fails at specs.bandMaxNm', () => {
    expect(issuesOf(mirror({ bandMinNm: 800, bandMaxNm: 760 }))['specs.bandMaxNm']).toMatch(/above its lower end/);
    expect(issuesOf(mirror({ bandMinNm: 780, bandMaxNm: 780 }))['specs.bandMaxNm']).toMatch(/above its lower end/);
  });

  test('ROC 0 or negative fails, null (flat) passes — g = 1 − L/R, flat R = ∞ gives g = 1 (physics.md A2 form 2.1, Kogelnik & Li, Appl. Opt. 5, 1550 (1966))', () => {
    expect(issuesOf(mirror({ rocMm: 0 }))['specs.rocMm']).toBe('Must be greater than 0.');
    expect(issuesOf(mirror({ rocMm: -500 }))['specs.rocMm']).toBe('Must be greater than 0.');
    expect(issuesOf(mirror({ rocMm: null }))).toEqual({});
    const { rocMm: _omitted, ...withoutRoc } = MIRROR_SPECS;
    expect(issuesOf({ ...MIRROR_LISTING, specs: withoutRoc })['specs.rocMm']).toBe('Required.');
  });

  test('negative transmission, negative tolerance and a missing loss name their paths', () => {
    const issues = issuesOf(mirror({ transmissionPpm: { value: -1 }, lossPpm: { value: 8, tol: -2 } }));
    expect(issues['specs.transmissionPpm.value']).toBe('Must be 0 or more.');
    expect(issues['specs.lossPpm.tol']).toBe('Must be 0 or more.');
    const { lossPpm: _omitted, ...withoutLoss } = MIRROR_SPECS;
    expect(issuesOf({ ...MIRROR_LISTING, specs: withoutLoss })['specs.lossPpm']).toBe('Required.');
  });

  test('an angle of incidence of 90° or more fails', () => {
    expect(issuesOf(mirror({ aoiDeg: 90 }))['specs.aoiDeg']).toMatch(/below 90°/);
  });
});

describe('listing fields', () => {
  test.each([
    [{ title: 'ab' }, 'title'],
    [{ title: 'x'.repeat(141) }, 'title'],
    [{ description: 'x'.repeat(20_001) }, 'description'],
    [{ condition: 'mint' }, 'condition'],
    [{ quantity: 1.5 }, 'quantity'],
    [{ quantity: 10_001 }, 'quantity'],
    [{ quantity: -1 }, 'quantity'],
    [{ priceCents: 0 }, 'priceCents'],
    [{ priceCents: 12.5 }, 'priceCents'],
    [{ priceCents: 1e10 + 1 }, 'priceCents'],
    [{ currency: 'eur' }, 'currency'],
    [{ currency: 'EURO' }, 'currency'],
    [{ currency: 'XYZ' }, 'currency'],
    [{ shipsTo: [] }, 'shipsTo'],
    [{ shipsTo: ['EU', 'MARS'] }, 'shipsTo.1'],
    [{ shipsTo: ['EU', 'UK', 'EU'] }, 'shipsTo'],
  ])('%o fails at %s', (change, path) => {
    expect(Object.keys(issuesOf({ ...MIRROR_LISTING, ...change }))).toContain(path);
  });

  test('a duplicate region is named in the message', () => {
    expect(issuesOf({ ...MIRROR_LISTING, shipsTo: ['EU', 'UK', 'EU'] })['shipsTo']).toBe('EU is listed twice.');
  });

  test('boundary values pass: quantity 0 (sold out) and 10 000, price 10¹⁰ cents, every common currency', () => {
    expect(issuesOf({ ...MIRROR_LISTING, quantity: 0, priceCents: 1e10 })).toEqual({});
    expect(issuesOf({ ...MIRROR_LISTING, quantity: 10_000 })).toEqual({});
    for (const currency of ['USD', 'GBP', 'CHF', 'JPY', 'SEK', 'INR']) expect(issuesOf({ ...MIRROR_LISTING, currency })).toEqual({});
  });

  test('the description may be left out and defaults to empty', () => {
    const { description: _omitted, ...rest } = MIRROR_LISTING;
    const r = ListingInputSchema.safeParse(rest);
    expect(r.success && r.data.description).toBe('');
  });

  test('an unknown category is refused with the list of categories', () => {
    expect(issuesOf({ ...MIRROR_LISTING, category: 'telescope' })['category']).toMatch(/cavity-mirror, photodiode/);
  });

  test('specs are checked against the category named in the body', () => {
    expect(Object.keys(issuesOf({ ...MIRROR_LISTING, category: 'laser' }))).toContain('specs.centreWavelengthNm');
  });
});

describe('every category', () => {
  test.each(CATEGORIES)('%s: the sample specs pass their schema and a listing with them passes', (category) => {
    expect(SPEC_SCHEMAS[category].safeParse(SPECS_BY_CATEGORY[category]).success).toBe(true);
    expect(issuesOf({ ...MIRROR_LISTING, category, specs: SPECS_BY_CATEGORY[category] })).toEqual({});
  });
});

function specIssues<C extends keyof typeof SPEC_SCHEMAS>(category: C, change: Record<string, unknown>): Record<string, string> {
  const r = SPEC_SCHEMAS[category].safeParse({ ...SPECS_BY_CATEGORY[category], ...change });
  return r.success ? {} : Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message]));
}

describe('efficiencies lie in (0, 1] — an efficiency is a power fraction of the light detected (physics.md A0 and A12; common practice)', () => {
  test.each([0, -0.1, 1.01])('photodiode quantum efficiency %d fails', (value) => {
    expect(specIssues('photodiode', { quantumEfficiency: { value } })['quantumEfficiency.value']).toBeDefined();
  });
  test.each([0, 1.2])('single-photon detection efficiency %d fails', (value) => {
    expect(specIssues('single-photon-detector', { efficiency: { value } })['efficiency.value']).toBeDefined();
  });
  test('an efficiency of exactly 1 passes', () => {
    expect(specIssues('balanced-detector', { quantumEfficiency: { value: 1 } })).toEqual({});
  });
  test('a responsivity that implies QE > 1 fails: 1.3 A/W at 1550 nm is η = 1.04 (physics.md A12 form 12.1; A12.1 gives 1.2 A/W → 0.959878)', () => {
    const { quantumEfficiency: _omitted, ...rest } = SPECS_BY_CATEGORY.photodiode;
    const r = SPEC_SCHEMAS.photodiode.safeParse({ ...rest, responsivityAW: { value: 1.3 } });
    expect(r.success).toBe(false);
    expect(!r.success && r.error.issues[0]?.path).toEqual(['responsivityAW', 'value']);
    expect(SPEC_SCHEMAS.photodiode.safeParse({ ...rest, responsivityAW: { value: 1.2 } }).success).toBe(true);
  });
  test('a QE without its wavelength fails at wavelengthNm', () => {
    expect(specIssues('photodiode', { wavelengthNm: undefined })['wavelengthNm']).toMatch(/wavelength/);
  });
  test('afterpulsing is a probability in [0, 1]', () => {
    expect(specIssues('single-photon-detector', { afterpulsing: 1.5 })['afterpulsing']).toBeDefined();
  });
});

describe('other cross-field checks', () => {
  test('the laser tuning range must contain the centre wavelength', () => {
    expect(specIssues('laser', { tuningMinNm: 1065, tuningMaxNm: 1070 })['centreWavelengthNm']).toMatch(/outside the tuning range/);
    expect(specIssues('laser', { tuningMaxNm: undefined })['tuningMaxNm']).toMatch(/both ends/);
    expect(specIssues('laser', { tuningMinNm: undefined, tuningMaxNm: undefined })).toEqual({});
  });
  test('the laser hazard class is one of the IEC 60825-1 classes', () => {
    expect(specIssues('laser', { hazardClass: '3A' })['hazardClass']).toMatch(/1, 2, 3R, 3B, 4/);
  });
  test('M² is at least 1 (a perfect Gaussian beam; common practice)', () => {
    expect(specIssues('laser', { m2: 0.9 })['m2']).toBeDefined();
  });
  test('single-photon detector cooling is one of the known kinds', () => {
    expect(specIssues('single-photon-detector', { cooling: 'fridge' })['cooling']).toMatch(/liquid-helium/);
  });
  test('crystal wavelengths conserve energy, 1/λp = 1/λs + 1/λi (physics.md A9 form 9.1; A9.6: pump 532, signal 810 → idler 1550.1 nm)', () => {
    expect(specIssues('nonlinear-crystal', { signalWavelengthNm: 810, idlerWavelengthNm: 1550.1 })).toEqual({});
    expect(specIssues('nonlinear-crystal', { signalWavelengthNm: 810, idlerWavelengthNm: 1500 })['idlerWavelengthNm']).toMatch(
      /1550\.1 nm/,
    );
    expect(specIssues('nonlinear-crystal', { signalWavelengthNm: 500 })['signalWavelengthNm']).toBeDefined();
  });
  test('positive dimensions', () => {
    expect(specIssues('nonlinear-crystal', { lengthMm: 0 })['lengthMm']).toBe('Must be greater than 0.');
    expect(specIssues('cavity-mirror', { diameterMm: -1 })['diameterMm']).toBe('Must be greater than 0.');
    expect(specIssues('other', { apertureMm: 0 })['apertureMm']).toBe('Must be greater than 0.');
  });
  test('a component wavelength range must not be inverted', () => {
    expect(specIssues('other', { wavelengthMinNm: 1100 })['wavelengthMaxNm']).toBeDefined();
  });
});

describe('parseListingPatch', () => {
  test('any subset of the fields, specs replaced whole and checked against the listing category', () => {
    const r = parseListingPatch('cavity-mirror', { priceCents: 200_000, version: 3 });
    expect(r.success && r.data).toEqual({ priceCents: 200_000 });
    const s = parseListingPatch('cavity-mirror', { specs: { ...MIRROR_SPECS, rocMm: null } });
    expect(s.success && s.data.specs?.rocMm).toBeNull();
  });
  test('partial specs fail: specs are replaced as a whole', () => {
    const r = parseListingPatch('cavity-mirror', { specs: { rocMm: 500 } });
    expect(!r.success && r.error.issues.map((i) => i.path.join('.'))).toContain('specs.diameterMm');
  });
  test('the cross-field checks apply to patched specs', () => {
    const r = parseListingPatch('cavity-mirror', { specs: { ...MIRROR_SPECS, designWavelengthNm: 1064 } });
    expect(!r.success && r.error.issues[0]?.path).toEqual(['specs', 'designWavelengthNm']);
  });
  test('specs of another category fail', () => {
    expect(parseListingPatch('laser', { specs: MIRROR_SPECS }).success).toBe(false);
  });
  test('a patch leaving out the description does not clear it', () => {
    const r = parseListingPatch('laser', { title: 'New title' });
    expect(r.success && 'description' in r.data && r.data.description !== undefined).toBe(false);
  });
  test('changing the category is refused; an empty patch is refused', () => {
    const r = parseListingPatch('cavity-mirror', { category: 'laser', title: 'Laser now' });
    expect(!r.success && r.error.issues[0]?.message).toMatch(/cannot change/);
    expect(parseListingPatch('cavity-mirror', { category: 'cavity-mirror', title: 'Same category' }).success).toBe(true);
    expect(parseListingPatch('cavity-mirror', {}).success).toBe(false);
  });
});

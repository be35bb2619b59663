import { describe, expect, test } from 'vitest';
import { DEFAULT_MAX_LINES, parseMeasurementCsv, type MeasurementData } from '../../../src/lib/measurements';
import type { MeasurementKind } from '../../../src/lib/listings/constants';

function ok(kind: MeasurementKind, text: string): MeasurementData {
  const r = parseMeasurementCsv(kind, text);
  if (!r.ok) throw new Error(`line ${r.error.line}, column ${r.error.column}: ${r.error.message}`);
  return r.data;
}

function error(kind: MeasurementKind, text: string) {
  const r = parseMeasurementCsv(kind, text);
  if (r.ok) throw new Error('expected an error');
  return r.error;
}

const WL = [760, 770, 780, 790, 800];

function csv(header: string, rows: (string | number)[][]): string {
  return [header, ...rows.map((r) => r.join(','))].join('\n');
}

describe('spectrum headers and units', () => {
  test('wavelength_nm,transmission_ppm', () => {
    const d = ok(
      'spectrum',
      csv(
        'wavelength_nm,transmission_ppm',
        WL.map((w, i) => [w, 2 + i]),
      ),
    );
    expect(d).toMatchObject({ kind: 'spectrum', quantity: 'transmission' });
    expect(d.kind === 'spectrum' && d.points[2]).toEqual({ wavelengthNm: 780, transmissionPpm: 4 });
  });

  test('"wavelength (nm), T (%)": percent becomes ppm (1 % = 10⁴ ppm)', () => {
    const d = ok(
      'spectrum',
      csv(
        'wavelength (nm), T (%)',
        WL.map((w) => [w, 0.0002]),
      ),
    );
    expect(d.kind === 'spectrum' && d.points[0]).toEqual({ wavelengthNm: 760, transmissionPpm: 2 });
  });

  test('lambda_um,R_pct: reflectance alone is kept as reflectance and the note says why', () => {
    const d = ok(
      'spectrum',
      csv(
        'lambda_um,R_pct',
        WL.map((w) => [w / 1000, 99.999]),
      ),
    );
    expect(d).toMatchObject({ kind: 'spectrum', quantity: 'reflectance' });
    expect(d.kind === 'spectrum' && d.quantity === 'reflectance' && d.points[4]).toEqual({ wavelengthNm: 800, reflectancePpm: 999_990 });
    expect(d.notes.join(' ')).toMatch(/reflectance only/);
  });

  test('R and T together become transmission and loss = 1 − R − T (physics.md A1, R = 1 − T − loss)', () => {
    const d = ok(
      'spectrum',
      csv(
        'wavelength_nm,R (%),T (ppm)',
        WL.map((w) => [w, 99.999, 2]),
      ),
    );
    expect(d).toMatchObject({ quantity: 'transmission-loss', derivedFromReflectance: true });
    expect(d.kind === 'spectrum' && d.points[0]).toEqual({ wavelengthNm: 760, transmissionPpm: 2, lossPpm: 8 });
  });

  test('R and loss together give T = 1 − R − loss', () => {
    const d = ok(
      'spectrum',
      csv(
        'wavelength_nm,reflectance_ppm,loss_ppm',
        WL.map((w) => [w, 999_990, 3]),
      ),
    );
    expect(d.kind === 'spectrum' && d.points[0]).toEqual({ wavelengthNm: 760, transmissionPpm: 7, lossPpm: 3 });
  });

  test('semicolon-separated with decimal commas; a decreasing scan is stored increasing', () => {
    const text = ['wl [nm];T [ppm];loss [ppm]', ...[...WL].reverse().map((w) => `${w};2,5;7,5`)].join('\n');
    const d = ok('spectrum', text);
    expect(d.kind === 'spectrum' && d.points.map((p) => p.wavelengthNm)).toEqual(WL);
    expect(d.kind === 'spectrum' && d.points[0]).toEqual({ wavelengthNm: 760, transmissionPpm: 2.5, lossPpm: 7.5 });
  });

  test('an unknown extra column is ignored with a note; CRLF line ends and a byte-order mark are fine', () => {
    const text = '\uFEFFwavelength_nm,transmission_ppm,sigma\r\n' + WL.map((w) => `${w},2,0.1`).join('\r\n');
    const d = ok('spectrum', text);
    expect(d.notes).toContain('column "sigma" ignored');
  });
});

describe('parse errors name the line and column, as a text editor counts them', () => {
  test('a non-numeric cell, counting a comment and a blank line before it', () => {
    const text = ['# measured 2024', 'wavelength_nm,transmission_ppm', '760,2', '', '770,two', '780,2', '790,2', '800,2'].join('\n');
    expect(error('spectrum', text)).toEqual({ line: 5, column: 2, message: '"two" is not a number (transmission).' });
  });
  test('too few columns', () => {
    expect(error('spectrum', csv('wavelength_nm,transmission_ppm', [[760, 2], [770], [780, 2]]))).toMatchObject({ line: 3, column: 2 });
  });
  test('an empty cell', () => {
    expect(
      error(
        'spectrum',
        csv('wavelength_nm,transmission_ppm', [
          [760, 2],
          [770, ' '],
          [780, 2],
        ]),
      ),
    ).toMatchObject({ line: 3, column: 2, message: expect.stringMatching(/empty/) as unknown });
  });
  test('unknown header units and missing units', () => {
    expect(error('spectrum', csv('wavelength_furlong,transmission_ppm', [[760, 2]]))).toEqual({
      line: 1,
      column: 1,
      message: 'Unknown unit "furlong" for the wavelength: use nm or µm.',
    });
    expect(error('spectrum', csv('wavelength_nm,T (dB)', [[760, 2]]))).toMatchObject({
      line: 1,
      column: 2,
      message: expect.stringMatching(/ppm, % or fraction/) as unknown,
    });
    expect(error('spectrum', csv('wavelength_nm,transmission', [[760, 2]]))).toMatchObject({
      line: 1,
      column: 2,
      message: expect.stringMatching(/Say the unit/) as unknown,
    });
  });
  test('no header row', () => {
    expect(error('spectrum', csv('760,2', [[770, 2]]))).toMatchObject({
      line: 1,
      column: 1,
      message: expect.stringMatching(/header row/) as unknown,
    });
  });
  test('a missing value column', () => {
    expect(error('spectrum', csv('wavelength_nm,loss_ppm', [[760, 2]])).message).toMatch(/No transmission or reflectance column/);
  });
  test('duplicate wavelengths', () => {
    const e = error(
      'spectrum',
      csv('wavelength_nm,transmission_ppm', [
        [760, 2],
        [770, 2],
        [770, 3],
        [780, 2],
        [790, 2],
      ]),
    );
    expect(e).toMatchObject({ line: 4, column: 1, message: expect.stringMatching(/770 nm appears twice \(lines 3 and 4\)/) as unknown });
  });
  test('non-monotonic wavelengths', () => {
    const e = error(
      'spectrum',
      csv('wavelength_nm,transmission_ppm', [
        [760, 2],
        [770, 2],
        [765, 3],
        [780, 2],
        [790, 2],
      ]),
    );
    expect(e).toMatchObject({ line: 4, column: 1, message: expect.stringMatching(/must increase/) as unknown });
  });
  test('negative values, and values above 100 %', () => {
    expect(
      error(
        'spectrum',
        csv('wavelength_nm,transmission_ppm', [
          [760, 2],
          [770, -1],
        ]),
      ),
    ).toMatchObject({ line: 3, column: 2, message: expect.stringMatching(/negative/) as unknown });
    expect(
      error(
        'spectrum',
        csv('wavelength_nm,T (%)', [
          [760, 2],
          [770, 120],
        ]),
      ),
    ).toMatchObject({ line: 3, column: 2, message: expect.stringMatching(/above 100 %/) as unknown });
    expect(error('spectrum', csv('wavelength_nm,transmission_ppm', [[-760, 2]]))).toMatchObject({ line: 2, column: 1 });
  });
  test('R + T above 100 %', () => {
    expect(
      error(
        'spectrum',
        csv('wavelength_nm,R (%),T (%)', [
          [760, 99.99, 0.005],
          [770, 99.99, 0.005],
          [780, 99.995, 0.01],
          [790, 99.99, 0.005],
          [800, 99.99, 0.005],
        ]),
      ),
    ).toMatchObject({ line: 4, column: 2, message: expect.stringMatching(/exceed 100 %/) as unknown });
  });
  test('fewer than 5 points', () => {
    expect(
      error(
        'spectrum',
        csv('wavelength_nm,transmission_ppm', [
          [760, 2],
          [770, 2],
          [780, 2],
          [790, 2],
        ]),
      ),
    ).toMatchObject({ line: 5, column: null, message: expect.stringMatching(/at least 5/) as unknown });
  });
  test('a quoted cell running over a line break', () => {
    expect(error('spectrum', 'wavelength_nm,transmission_ppm\n760,"2\n770",3\n780,2').message).toMatch(/quoted/);
  });
  test('an empty file', () => {
    expect(error('spectrum', '')).toMatchObject({ line: 1, message: expect.stringMatching(/empty/) as unknown });
  });
});

describe('the line limit', () => {
  test(`a CSV of 10⁶ lines is refused quickly with a message naming the ${DEFAULT_MAX_LINES} limit`, () => {
    const text = 'time_s,intensity\n' + '0.000001,1\n'.repeat(999_999);
    const started = performance.now();
    const e = error('ringdown', text);
    expect(performance.now() - started).toBeLessThan(1000);
    expect(e).toMatchObject({ line: 200_001, column: null });
    expect(e.message).toMatch(/1 000 000 lines/);
    expect(e.message).toMatch(/200 000 lines/);
  });
  test('maxLines sets the limit', () => {
    const text = csv(
      'wavelength_nm,transmission_ppm',
      WL.map((w) => [w, 2]),
    );
    expect(parseMeasurementCsv('spectrum', text, { maxLines: 6 }).ok).toBe(true);
    expect(parseMeasurementCsv('spectrum', text, { maxLines: 5 }).ok).toBe(false);
  });
});

describe('efficiency curves', () => {
  test('QE in % or as a fraction, stored as a fraction', () => {
    const pct = ok(
      'efficiency-curve',
      csv(
        'wavelength_nm,qe_pct',
        WL.map((w) => [w, 85]),
      ),
    );
    expect(pct.kind === 'efficiency-curve' && pct.points[0]).toEqual({ wavelengthNm: 760, efficiency: 0.85 });
    const frac = ok(
      'efficiency-curve',
      csv(
        'wavelength (µm),detection efficiency',
        WL.map((w) => [w / 1000, 0.85]),
      ),
    );
    expect(frac.kind === 'efficiency-curve' && frac.points[4]).toEqual({ wavelengthNm: 800, efficiency: 0.85 });
  });
  test('a unitless column above 1 points at the missing %', () => {
    expect(
      error(
        'efficiency-curve',
        csv(
          'wavelength_nm,QE',
          WL.map((w) => [w, 85]),
        ),
      ),
    ).toMatchObject({ line: 2, column: 2, message: expect.stringMatching(/write the unit/) as unknown });
  });
  test('an efficiency of 0 is refused: efficiencies lie in (0, 1] (physics.md A12; common practice)', () => {
    expect(
      error(
        'efficiency-curve',
        csv(
          'wavelength_nm,qe_pct',
          WL.map((w, i) => [w, i === 4 ? 0 : 80]),
        ),
      ),
    ).toMatchObject({ line: 6, column: 2 });
  });
});

// A mirror's transmission or reflectance spectrum. R = 1 − T − loss (physics.md A1), so R becomes
// transmission and loss only together with T (or with the loss); R alone stays R.

import { fail, PPM_UNITS, readHeader, WAVELENGTH_COLUMN, type ColumnKind, type CsvFile, type FoundColumn } from './csv';
import { readCurveRows, type ValueColumn } from './curve';
import type { SpectrumData } from './types';

type Quantity = 'wavelength' | 'transmission' | 'reflectance' | 'loss';

const PPM_TOTAL = 1e6;

function ppmColumn(quantity: Exclude<Quantity, 'wavelength'>, label: string, names: string[], example: string): ColumnKind<Quantity> {
  return { quantity, label, names, units: PPM_UNITS, example, unitHint: 'ppm, % or fraction' };
}

const COLUMNS: ColumnKind<Quantity>[] = [
  WAVELENGTH_COLUMN,
  ppmColumn('transmission', 'transmission', ['transmission', 'transmittance', 'trans', 't'], 'transmission_ppm or "T (%)"'),
  ppmColumn('reflectance', 'reflectance', ['reflectance', 'reflectivity', 'reflection', 'refl', 'r'], 'reflectance_pct or "R (%)"'),
  ppmColumn('loss', 'loss', ['loss', 'losses', 'absorption', 'absorption+scatter', 'a'], 'loss_ppm'),
];

function valueColumn(column: FoundColumn<Quantity>, label: string): ValueColumn {
  return { column, label, max: PPM_TOTAL, maxText: '100 %' };
}

/** 1 − a − b in ppm; rounded to 1e-6 ppm since R near 100 % leaves float noise far below any measured digit. */
function remainder(a: number, b: number): number {
  return Math.round((PPM_TOTAL - a - b) * 1e6) / 1e6;
}

export function parseSpectrum(file: CsvFile): SpectrumData {
  const { columns, ignored } = readHeader(file.header, COLUMNS, 'wavelength_nm,transmission_ppm');
  const wl = columns.get('wavelength');
  const t = columns.get('transmission');
  const r = columns.get('reflectance');
  const a = columns.get('loss');
  if (wl === undefined) fail(file.header.line, null, `No wavelength column: name it in the header, e.g. ${WAVELENGTH_COLUMN.example}.`);
  if (t === undefined && r === undefined) {
    fail(file.header.line, null, 'No transmission or reflectance column: name one in the header, e.g. transmission_ppm or "R (%)".');
  }
  const notes = ignored.map((c) => `column "${c}" ignored`);

  if (t !== undefined && a !== undefined) {
    const rows = readCurveRows(file, wl, [valueColumn(t, 'transmission'), valueColumn(a, 'loss')]);
    if (r !== undefined) notes.push('reflectance column ignored: transmission and loss are given');
    for (const row of rows) {
      if (!((row.values[0] as number) + (row.values[1] as number) < PPM_TOTAL)) {
        fail(row.line, a.index + 1, 'Transmission + loss reach 100 %: nothing would be reflected.');
      }
    }
    return {
      kind: 'spectrum',
      quantity: 'transmission-loss',
      derivedFromReflectance: false,
      notes,
      points: rows.map((p) => ({ wavelengthNm: p.wavelengthNm, transmissionPpm: p.values[0] as number, lossPpm: p.values[1] as number })),
    };
  }

  if (r !== undefined && (t !== undefined || a !== undefined)) {
    // With T the loss is what remains; with the loss, T is.
    const fromT = t !== undefined;
    const other = (t ?? a) as FoundColumn<Quantity>;
    const [given, derived, symbol] = fromT ? ['transmission', 'loss', 'T'] : ['loss', 'transmission', 'loss'];
    const rows = readCurveRows(file, wl, [valueColumn(r, 'reflectance'), valueColumn(other, given)]);
    const points = rows.map((p) => {
      const [rv, ov] = p.values as [number, number];
      const rest = remainder(rv, ov);
      if (rest < 0) {
        fail(p.line, r.index + 1, `Reflectance + ${given} exceed 100 % here, so the ${derived} 1 − R − ${symbol} would be negative.`);
      }
      return fromT
        ? { wavelengthNm: p.wavelengthNm, transmissionPpm: ov, lossPpm: rest }
        : { wavelengthNm: p.wavelengthNm, transmissionPpm: rest, lossPpm: ov };
    });
    notes.push(`${derived} derived as 1 − R − ${symbol}`);
    return { kind: 'spectrum', quantity: 'transmission-loss', derivedFromReflectance: true, notes, points };
  }

  if (t !== undefined) {
    const rows = readCurveRows(file, wl, [valueColumn(t, 'transmission')]);
    return {
      kind: 'spectrum',
      quantity: 'transmission',
      notes,
      points: rows.map((p) => ({ wavelengthNm: p.wavelengthNm, transmissionPpm: p.values[0] as number })),
    };
  }

  const rows = readCurveRows(file, wl, [valueColumn(r as FoundColumn<Quantity>, 'reflectance')]);
  notes.push(
    'reflectance only: without a transmission column it cannot be split into transmission and loss, so the fit uses the specs instead',
  );
  return {
    kind: 'spectrum',
    quantity: 'reflectance',
    notes,
    points: rows.map((p) => ({ wavelengthNm: p.wavelengthNm, reflectancePpm: p.values[0] as number })),
  };
}

// Rows of a wavelength curve (spectrum or efficiency curve): numeric, positive wavelengths in one
// direction without repeats (so that linear interpolation is defined, physics.md A12 form 12.6),
// values not negative, enough points to be a curve.

import { fail, numberCell, plural, type CsvFile, type FoundColumn } from './csv';

export const MIN_CURVE_POINTS = 5;

export interface ValueColumn {
  column: FoundColumn<string>;
  label: string;
  /** Largest allowed stored value (100 % in ppm, efficiency 1), with how to say it. */
  max: number;
  maxText: string;
}

export interface CurveRow {
  line: number;
  wavelengthNm: number;
  values: number[];
}

/** The data rows in increasing wavelength (a decreasing scan is accepted and reversed). */
export function readCurveRows(file: CsvFile, wavelength: FoundColumn<string>, values: readonly ValueColumn[]): CurveRow[] {
  const out: CurveRow[] = [];
  let direction = 0;
  for (const row of file.rows) {
    const wl = numberCell(row, wavelength, 'wavelength', file.decimalComma);
    if (!(wl > 0)) fail(row.line, wavelength.index + 1, `The wavelength must be above 0 (found ${wl}).`);
    const vs = values.map((v) => {
      const x = numberCell(row, v.column, v.label, file.decimalComma);
      if (x < 0) fail(row.line, v.column.index + 1, `The ${v.label} cannot be negative (found ${row.cells[v.column.index]?.trim()}).`);
      if (x > v.max)
        fail(
          row.line,
          v.column.index + 1,
          `The ${v.label} ${row.cells[v.column.index]?.trim()} is above ${v.maxText}; check the unit in the header.`,
        );
      return x;
    });
    const prev = out[out.length - 1];
    if (prev !== undefined) {
      if (wl === prev.wavelengthNm) {
        fail(
          row.line,
          wavelength.index + 1,
          `The wavelength ${wl} nm appears twice (lines ${prev.line} and ${row.line}); keep one point per wavelength.`,
        );
      }
      const step = Math.sign(wl - prev.wavelengthNm);
      if (direction === 0) direction = step;
      else if (step !== direction) {
        fail(
          row.line,
          wavelength.index + 1,
          `The wavelengths must ${direction > 0 ? 'increase' : 'decrease'} throughout, but ${wl} nm follows ${prev.wavelengthNm} nm (line ${prev.line}).`,
        );
      }
    }
    out.push({ line: row.line, wavelengthNm: wl, values: vs });
  }
  if (out.length < MIN_CURVE_POINTS) {
    const last = file.rows[file.rows.length - 1]?.line ?? file.header.line;
    fail(last, null, `The file has ${plural(out.length, 'data point')}; a curve needs at least ${MIN_CURVE_POINTS}.`);
  }
  return direction < 0 ? out.reverse() : out;
}

// A quantum-efficiency or detection-efficiency curve. The fit engine takes efficiencies in (0, 1],
// so a point at 0 (no response) is refused rather than silently dropped.

import { EFFICIENCY_UNITS, fail, readHeader, WAVELENGTH_COLUMN, type ColumnKind, type CsvFile } from './csv';
import { readCurveRows } from './curve';
import type { EfficiencyCurveData } from './types';

type Quantity = 'wavelength' | 'efficiency';

const COLUMNS: ColumnKind<Quantity>[] = [
  WAVELENGTH_COLUMN,
  {
    quantity: 'efficiency',
    label: 'efficiency',
    names: [
      'efficiency',
      'quantum efficiency',
      'detection efficiency',
      'system detection efficiency',
      'qe',
      'de',
      'pde',
      'sde',
      'eta',
      'η',
    ],
    units: EFFICIENCY_UNITS,
    // Without a unit the column is read as a fraction; a value above 1 then points at a missing "%".
    unitless: 1,
    example: 'qe_pct or "efficiency (%)"',
    unitHint: '% or fraction',
  },
];

export function parseEfficiencyCurve(file: CsvFile): EfficiencyCurveData {
  const { columns, ignored } = readHeader(file.header, COLUMNS, 'wavelength_nm,qe_pct');
  const wl = columns.get('wavelength');
  const eff = columns.get('efficiency');
  if (wl === undefined) fail(file.header.line, null, `No wavelength column: name it in the header, e.g. ${WAVELENGTH_COLUMN.example}.`);
  if (eff === undefined)
    fail(file.header.line, null, 'No efficiency column: name it in the header, e.g. qe_pct, "efficiency (%)" or efficiency_fraction.');
  const rows = readCurveRows(file, wl, [
    {
      column: eff,
      label: 'efficiency',
      max: 1,
      maxText: eff.factor === 1 ? '1 (write the unit in the header if the column is in %)' : '100 %',
    },
  ]);
  for (const row of rows) {
    if (row.values[0] === 0)
      fail(
        row.line,
        eff.index + 1,
        'An efficiency of 0 cannot be used (efficiencies lie in (0, 1]); leave out wavelengths where the detector does not respond.',
      );
  }
  return {
    kind: 'efficiency-curve',
    notes: ignored.map((c) => `column "${c}" ignored`),
    points: rows.map((p) => ({ wavelengthNm: p.wavelengthNm, efficiency: p.values[0] as number })),
  };
}

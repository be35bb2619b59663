// A cavity ring-down trace: time and intensity columns, optional `# key=value` comment lines giving
// the cavity length (needed for loss and finesse), the wavelength and the group index.

import { FitInputError } from '../fit';
import { fail, numberCell, plural, readHeader, TIME_UNITS, type ColumnKind, type CsvFile, type CsvRow } from './csv';
import { fitRingdown, MIN_RINGDOWN_POINTS, RingdownFitError, ringdownFigures } from './ringdown-fit';
import type { RingdownData, RingdownFigures, RingdownFit, TracePoint } from './types';

type Quantity = 'time' | 'intensity';

const COLUMNS: ColumnKind<Quantity>[] = [
  {
    quantity: 'time',
    label: 'time',
    names: ['time', 't'],
    units: TIME_UNITS,
    example: 'time_us or "time (ns)"',
    unitHint: 's, ms, µs (or us), ns or ps',
  },
  {
    quantity: 'intensity',
    label: 'intensity',
    names: ['intensity', 'signal', 'power', 'voltage', 'amplitude', 'counts', 'transmission', 'i', 'p', 'v'],
    // Any unit: only the decay time matters, not the scale.
    units: null,
    example: 'intensity',
  },
];

interface Settings {
  lengthM: number | null;
  wavelengthNm: number | null;
  groupIndex: number | null;
}

type SettingKey = keyof Settings;

/** Comment keys (lower case, spaces as _) and their factor to the stored unit. */
const KEYS: Record<string, [SettingKey, number]> = {
  length_m: ['lengthM', 1],
  length_cm: ['lengthM', 1e-2],
  length_mm: ['lengthM', 1e-3],
  cavity_length_m: ['lengthM', 1],
  cavity_length_mm: ['lengthM', 1e-3],
  wavelength_nm: ['wavelengthNm', 1],
  wavelength_um: ['wavelengthNm', 1e3],
  lambda_nm: ['wavelengthNm', 1],
  group_index: ['groupIndex', 1],
  n_g: ['groupIndex', 1],
};

/** The settings and the comment line each came from. */
function readSettings(comments: readonly CsvRow[]): { settings: Settings; lines: Partial<Record<SettingKey, number>> } {
  const out: Settings = { lengthM: null, wavelengthNm: null, groupIndex: null };
  const lines: Partial<Record<SettingKey, number>> = {};
  for (const c of comments) {
    const text = c.cells[0] ?? '';
    for (const m of text.matchAll(/([A-Za-zµ_ ]+?)\s*[=:]\s*([^\s,;]+)/g)) {
      const key = (m[1] as string).trim().toLowerCase().replace(/\s+/g, '_').replace('µm', 'um');
      const setting = KEYS[key];
      if (setting === undefined) continue;
      const value = Number(m[2]);
      if (!(value > 0) || !Number.isFinite(value)) fail(c.line, null, `"${(m[0] as string).trim()}": the value must be a number above 0.`);
      if (setting[0] === 'groupIndex' && value < 1) fail(c.line, null, `"${(m[0] as string).trim()}": a group index is at least 1.`);
      out[setting[0]] = value * setting[1];
      lines[setting[0]] = c.line;
    }
  }
  return { settings: out, lines };
}

function fitOrFail(points: readonly TracePoint[], line: number): RingdownFit {
  try {
    return fitRingdown(points);
  } catch (e) {
    if (e instanceof RingdownFitError) fail(line, null, e.message);
    throw e;
  }
}

export function parseRingdown(file: CsvFile): RingdownData {
  const { columns, ignored } = readHeader(file.header, COLUMNS, 'time_us,intensity');
  const time = columns.get('time');
  const intensity = columns.get('intensity');
  if (time === undefined) fail(file.header.line, null, `No time column: name it in the header with its unit, e.g. ${COLUMNS[0]?.example}.`);
  if (intensity === undefined) fail(file.header.line, null, 'No intensity column: name it in the header, e.g. time_us,intensity.');
  const { settings, lines } = readSettings(file.comments);

  const points: TracePoint[] = [];
  let prevLine = 0;
  for (const row of file.rows) {
    const t = numberCell(row, time, 'time', file.decimalComma);
    const y = numberCell(row, intensity, 'intensity', file.decimalComma);
    const prev = points[points.length - 1];
    if (prev !== undefined && !(t > prev.timeS)) {
      fail(row.line, time.index + 1, `The times must increase from row to row, but this one is not after line ${prevLine}.`);
    }
    points.push({ timeS: t, intensity: y });
    prevLine = row.line;
  }
  if (points.length < MIN_RINGDOWN_POINTS) {
    fail(
      prevLine || file.header.line,
      null,
      `The file has ${plural(points.length, 'data point')}; a ring-down fit needs at least ${MIN_RINGDOWN_POINTS}.`,
    );
  }

  const notes = ignored.map((c) => `column "${c}" ignored`);
  notes.push('τ uncertainty (1σ) from the fit residuals, assuming independent noise on each sample');
  const fit = fitOrFail(points, file.header.line);
  let figures: RingdownFigures | null = null;
  if (settings.lengthM === null) notes.push('no cavity length given (add a line "# length_m=0.05"): loss and finesse not computed');
  else {
    try {
      figures = ringdownFigures(fit, settings.lengthM, settings.groupIndex ?? undefined);
    } catch (e) {
      if (e instanceof FitInputError) {
        fail(
          lines.lengthM ?? file.header.line,
          null,
          `τ = ${fit.tauS.toPrecision(3)} s is not longer than the round trip of a ${settings.lengthM} m cavity: check the time unit and the length.`,
        );
      }
      throw e;
    }
  }
  return { kind: 'ringdown', points, ...settings, fit, figures, notes };
}

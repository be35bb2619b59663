// Reading a measurement CSV into rows that know their line in the file, and its header into
// quantities with units. Errors carry the line (1-based, as a text editor counts) and the column
// (1-based CSV field), so the seller can find the cell.

import Papa from 'papaparse';

export interface CsvError {
  line: number;
  column: number | null;
  message: string;
}

/** Thrown inside the parsers and turned into `{ ok: false, error }` at the contract boundary. */
export class CsvFailure extends Error {
  constructor(readonly error: CsvError) {
    super(error.message);
  }
}

export function fail(line: number, column: number | null, message: string): never {
  throw new CsvFailure({ line, column, message });
}

export interface CsvRow {
  line: number;
  cells: string[];
}

export interface CsvFile {
  header: CsvRow;
  rows: CsvRow[];
  comments: CsvRow[];
  /** A decimal comma is read only when the delimiter is not a comma (e.g. 780;0,5). */
  decimalComma: boolean;
}

const COMMENT = '#';

function countLines(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\n'); i !== -1; i = text.indexOf('\n', i + 1)) n++;
  return text.length === 0 || text.endsWith('\n') ? n : n + 1;
}

function groupDigits(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
}

/**
 * The file split into header, data rows and comment lines. The line limit is checked before any
 * parsing so that an oversized upload costs one scan for newlines.
 */
export function readCsv(raw: string, maxLines: number): CsvFile {
  const text = raw.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  const lines = countLines(text);
  if (lines > maxLines) {
    fail(
      maxLines + 1,
      null,
      `The file has ${groupDigits(lines)} lines; measurement files are limited to ${groupDigits(maxLines)} lines. Thin out the trace (every n-th point) or shorten it.`,
    );
  }
  const sourceLines = text.split('\n');
  // Papa drops empty and comment lines; these are the 1-based numbers of the lines it keeps, in order.
  const kept: number[] = [];
  const comments: CsvRow[] = [];
  sourceLines.forEach((l, i) => {
    if (l.startsWith(COMMENT)) comments.push({ line: i + 1, cells: [l.slice(COMMENT.length)] });
    else if (l !== '') kept.push(i + 1);
  });

  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true, comments: COMMENT, newline: '\n' });
  const bad = parsed.errors.find((e) => e.type === 'Quotes');
  if (bad !== undefined) fail(kept[bad.row ?? 0] ?? 1, null, `Cannot read the CSV here: ${bad.message}.`);
  if (parsed.data.length !== kept.length) {
    const quoted = kept.find((n) => (sourceLines[n - 1] ?? '').includes('"')) ?? 1;
    fail(quoted, null, 'A quoted cell spans several lines; a measurement file needs one row per line.');
  }
  const rows = parsed.data.map((cells, i) => ({ line: kept[i] as number, cells })).filter((r) => r.cells.some((c) => c.trim() !== ''));
  const header = rows.shift();
  if (header === undefined) fail(1, null, 'The file is empty: it needs a header row and data rows.');
  return { header, rows, comments, decimalComma: parsed.meta.delimiter !== ',' };
}

const NUMBER_RE = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

export function isNumberCell(cell: string, decimalComma: boolean): boolean {
  return NUMBER_RE.test(normaliseCell(cell, decimalComma));
}

function normaliseCell(cell: string, decimalComma: boolean): string {
  const s = cell.trim().replace(/\u2212/g, '-');
  return decimalComma ? s.replace(',', '.') : s;
}

/** A numeric cell in the stored unit; `what` names the column in the error. */
export function numberCell(row: CsvRow, column: FoundColumn<string>, what: string, decimalComma: boolean): number {
  const x = rawNumberCell(row, column.index, what, decimalComma) * column.factor;
  // Twelve significant digits drop the float noise of the unit factor (94 % → 0.94, not 0.9400000000000001).
  return column.factor === 1 ? x : Number(x.toPrecision(12));
}

function rawNumberCell(row: CsvRow, column: number, what: string, decimalComma: boolean): number {
  const cell = row.cells[column];
  if (cell === undefined) {
    fail(
      row.line,
      row.cells.length + 1,
      `Expected a ${what} value in column ${column + 1}, but the row has only ${plural(row.cells.length, 'column')}.`,
    );
  }
  const s = normaliseCell(cell, decimalComma);
  if (s === '') fail(row.line, column + 1, `The ${what} cell is empty.`);
  if (!NUMBER_RE.test(s)) fail(row.line, column + 1, `"${cell.trim()}" is not a number (${what}).`);
  return Number(s);
}

export interface HeaderCell {
  /** Lower case, runs of spaces, underscores and hyphens as one space. */
  name: string;
  /** Lower case, as written; null when the header gives none. */
  unit: string | null;
}

function normaliseName(s: string): string {
  return s
    .trim()
    .toLowerCase()
    .replace(/[\s_-]+/g, ' ');
}

/**
 * "wavelength_nm", "wavelength (nm)", "T [%]", "R_pct", "T%" → name and unit. A trailing word is a
 * unit only when the rest is a known column name, so "detection efficiency" stays a name.
 */
export function parseHeaderCell(cell: string, knownNames: ReadonlySet<string>): HeaderCell {
  const bracket = cell.trim().match(/^(.*?)\s*[([]\s*(.*?)\s*[)\]]\s*$/);
  if (bracket) return { name: normaliseName(bracket[1] as string), unit: (bracket[2] as string).toLowerCase() };
  const name = normaliseName(cell);
  if (knownNames.has(name)) return { name, unit: null };
  const percent = name.match(/^(.*?)\s*%$/);
  if (percent) return { name: (percent[1] as string).trim(), unit: '%' };
  const split = name.match(/^(.*)[ /]([^ /]+)$/);
  if (split && knownNames.has((split[1] as string).trim())) return { name: (split[1] as string).trim(), unit: split[2] as string };
  return { name, unit: null };
}

/** One quantity a measurement file may hold: the header names that mean it and its units (factor to the stored unit). */
export interface ColumnKind<Q extends string> {
  quantity: Q;
  label: string;
  names: readonly string[];
  /** Factor per unit to the stored unit; null accepts any unit (arbitrary intensity units). */
  units: Readonly<Record<string, number>> | null;
  /** Factor when the header gives no unit; absent means the unit is required. */
  unitless?: number;
  /** How the error suggests writing the header. */
  example: string;
  /** The units named in the error for an unknown one. */
  unitHint?: string;
}

export interface FoundColumn<Q extends string> {
  quantity: Q;
  index: number;
  factor: number;
}

/** The known columns of the header with their unit factors; unknown columns are left out (and reported as ignored). */
export function readHeader<Q extends string>(
  header: CsvRow,
  kinds: readonly ColumnKind<Q>[],
  headerExample: string,
): { columns: Map<Q, FoundColumn<Q>>; ignored: string[] } {
  if (header.cells.every((c) => isNumberCell(c, true))) {
    fail(
      header.line,
      1,
      `The first row holds numbers: the file needs a header row naming the columns and their units, e.g. ${headerExample}.`,
    );
  }
  const names = new Set(kinds.flatMap((k) => k.names));
  const columns = new Map<Q, FoundColumn<Q>>();
  const ignored: string[] = [];
  header.cells.forEach((cell, index) => {
    if (cell.trim() === '') return;
    const { name, unit } = parseHeaderCell(cell, names);
    const kind = kinds.find((k) => k.names.includes(name));
    if (kind === undefined) {
      ignored.push(cell.trim());
      return;
    }
    if (columns.has(kind.quantity)) fail(header.line, index + 1, `Two columns hold the ${kind.label}; keep one.`);
    let factor: number;
    if (unit === null || unit === '') {
      if (kind.units === null) factor = 1;
      else if (kind.unitless !== undefined) factor = kind.unitless;
      else fail(header.line, index + 1, `Say the unit of the ${kind.label} in the header, e.g. ${kind.example}.`);
    } else if (kind.units === null) {
      factor = 1;
    } else {
      const f = kind.units[unit];
      if (f === undefined)
        fail(
          header.line,
          index + 1,
          `Unknown unit "${unit}" for the ${kind.label}: use ${kind.unitHint ?? Object.keys(kind.units).join(', ')}.`,
        );
      factor = f;
    }
    columns.set(kind.quantity, { quantity: kind.quantity, index, factor });
  });
  return { columns, ignored };
}

export const WAVELENGTH_COLUMN: ColumnKind<'wavelength'> = {
  quantity: 'wavelength',
  label: 'wavelength',
  names: ['wavelength', 'wave length', 'wl', 'lambda', 'λ'],
  units: { nm: 1, um: 1e3, µm: 1e3, μm: 1e3, micron: 1e3, microns: 1e3, m: 1e9 },
  example: 'wavelength_nm or "wavelength (nm)"',
  unitHint: 'nm or µm',
};

/** Power fractions stored in ppm. */
export const PPM_UNITS: Readonly<Record<string, number>> = { ppm: 1, '%': 1e4, pct: 1e4, percent: 1e4, fraction: 1e6, frac: 1e6 };

/** Efficiencies stored as a fraction. */
export const EFFICIENCY_UNITS: Readonly<Record<string, number>> = { '%': 1e-2, pct: 1e-2, percent: 1e-2, fraction: 1, frac: 1 };

export const TIME_UNITS: Readonly<Record<string, number>> = { s: 1, sec: 1, ms: 1e-3, us: 1e-6, µs: 1e-6, μs: 1e-6, ns: 1e-9, ps: 1e-12 };

export function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

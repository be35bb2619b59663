// Stored specs as the spec table shows them (design.md: a thin space before the unit, SI prefixes
// that keep the mantissa in 1–999, tolerances as "40 ± 5 ppm") and as plain searchable text.

import type { Category } from '../listings/constants';
import { siPrefix, THIN } from '../units';
import type { Toleranced } from './common';
import type { DisplayDef, FieldDef } from './field-def';
import { CATEGORY_FIELDS } from './registry';

export interface SpecRow {
  label: string;
  value: string;
}

function digits(x: number, sig: number): string {
  return String(Number(x.toPrecision(sig)));
}

function formatNumber(d: DisplayDef, stored: number, tol: number | undefined, space: string): string {
  const scale = d.scale ?? 1;
  const v = stored * scale;
  const [f, p] = d.si ? siPrefix(v) : [1, ''];
  const sig = d.sig ?? 4;
  const unit = `${p}${d.unit}`;
  const number = tol ? `${digits(v / f, sig)} ± ${digits((tol * scale) / f, 3)}` : digits(v / f, sig);
  if (unit === '') return number;
  return `${number}${d.tight ? '' : space}${unit}`;
}

function optionLabel(field: FieldDef, value: string): string {
  return field.options?.find((o) => o.value === value)?.label ?? value;
}

type Style = { space: string; tolerances: boolean };

function valueText(field: FieldDef, stored: unknown, style: Style): string {
  const d = field.display ?? { unit: '' };
  if (stored === null) return field.nullLabel ?? '—';
  if (typeof stored === 'boolean') return stored ? 'yes' : 'no';
  if (typeof stored === 'string') return field.kind === 'select' ? optionLabel(field, stored) : stored;
  if (typeof stored === 'number') return formatNumber(d, stored, undefined, style.space);
  if (Array.isArray(stored)) {
    const list = stored.map((x: number) => formatNumber({ ...d, unit: '' }, x, undefined, style.space)).join(', ');
    return d.unit === '' ? list : `${list}${style.space}${d.unit}`;
  }
  const t = stored as Toleranced;
  return formatNumber(d, t.value, style.tolerances ? t.tol : undefined, style.space);
}

function rangeText(low: FieldDef, min: number, max: number, space: string): string {
  const d = low.display ?? { unit: '' };
  const bare = { ...d, unit: '' };
  return `${formatNumber(bare, min, undefined, space)}–${formatNumber(bare, max, undefined, space)}${d.unit === '' ? '' : space + d.unit}`;
}

interface Entry {
  field: FieldDef;
  label: string;
  text: (style: Style) => string;
}

/** The fields with a stored value, range ends merged into one entry, in form order. */
function entries(category: Category, specs: Readonly<Record<string, unknown>>): Entry[] {
  const fields = CATEGORY_FIELDS[category].filter((f) => f.alternative === undefined);
  const upperEnds = new Set(fields.flatMap((f) => (f.rangeTo === undefined ? [] : [f.rangeTo])));
  const out: Entry[] = [];
  for (const field of fields) {
    const stored = specs[field.path];
    if (upperEnds.has(field.path)) {
      const low = fields.find((f) => f.rangeTo === field.path);
      if (low !== undefined && typeof specs[low.path] === 'number') continue;
    }
    if (stored === undefined) continue;
    const high = field.rangeTo === undefined ? undefined : specs[field.rangeTo];
    if (typeof stored === 'number' && typeof high === 'number') {
      out.push({ field, label: field.rangeLabel ?? field.label, text: (s) => rangeText(field, stored, high, s.space) });
    } else {
      out.push({ field, label: field.label, text: (s) => valueText(field, stored, s) });
    }
  }
  return out;
}

/** The spec table: one row per stated spec, tolerances as "40 ± 5 ppm", "flat" for a planar mirror. */
export function specRows(category: Category, specs: Readonly<Record<string, unknown>>): SpecRow[] {
  return entries(category, specs).map((e) => ({ label: e.label, value: e.text({ space: THIN, tolerances: true }) }));
}

/** The specs as plain words for the search index: "transmission 2 ppm loss 8 ppm 780 nm band 760–800 nm ROC 1 m". */
export function specsToText(category: Category, specs: Readonly<Record<string, unknown>>): string {
  const words: string[] = [];
  for (const e of entries(category, specs)) {
    const word = e.field.textLabel ?? e.field.label.toLowerCase();
    const stored = specs[e.field.path];
    if (typeof stored === 'boolean') {
      if (stored) words.push(word);
      continue;
    }
    const value = e.text({ space: ' ', tolerances: false });
    words.push(word === '' ? value : `${word} ${value}`);
  }
  return words.join(' ');
}

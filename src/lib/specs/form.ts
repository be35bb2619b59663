// Between what the listing form holds (numbers as typed, with the unit picked) and the stored specs
// (base units named in the field). Fields convert in the order they are listed, so a conversion that
// needs another spec (A/W → QE needs the wavelength) sees it already stored.

import type { Category } from '../listings/constants';
import type { Toleranced } from './common';
import type { FieldDef } from './field-def';
import { factorOf, roundStored, type SpecDraft, type UnitChoice } from './form-units';
import { CATEGORY_FIELDS, SPEC_SCHEMAS, type SpecsByCategory } from './registry';

/** A numeric field as the form holds it: the typed text and the unit key; tol and flat where the kind has them. */
export interface QuantityInput {
  value: string;
  unit: string;
  tol?: string;
  flat?: boolean;
}

/** Quantity kinds hold a QuantityInput, text and select a string, boolean a boolean. */
export type FormValue = QuantityInput | string | boolean;
export type FormValues = Record<string, FormValue | undefined>;

export type Normalised = { ok: true; value: unknown } | { ok: false; message: string };

export type StoredSpecsResult<C extends Category> = { ok: true; specs: SpecsByCategory[C] } | { ok: false; errors: Record<string, string> };

const NUMBER_RE = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/**
 * A number as people type it: spaces or thin spaces between digit groups, a decimal comma when no
 * point is present, a Unicode minus, a leading ± on a tolerance. null when it is not a number.
 */
export function parseTypedNumber(text: string): number | null {
  let s = text
    .trim()
    .replace(/^±/, '')
    .replace(/\u2212/g, '-')
    .replace(/[\s\u2009\u202f\u00a0_]/g, '');
  if (!s.includes('.') && (s.match(/,/g) ?? []).length === 1) s = s.replace(',', '.');
  if (!NUMBER_RE.test(s)) return null;
  const n = Number(s);
  return Number.isFinite(n) ? n : null;
}

function unitOf(field: FieldDef, key: string | undefined): UnitChoice | null {
  const units = field.units ?? [];
  if (units.length === 0) return null;
  return units.find((u) => u.key === key) ?? (units[0] as UnitChoice);
}

type Factor = { ok: true; factor: number } | { ok: false; message: string };

function factorFor(field: FieldDef, key: string | undefined, draft: SpecDraft): Factor {
  const unit = unitOf(field, key);
  if (unit === null) return { ok: true, factor: 1 };
  const factor = factorOf(unit, draft);
  if (factor === null)
    return { ok: false, message: `Cannot convert from ${unit.label}: ${unit.needs ?? 'a value it depends on is missing'}.` };
  return { ok: true, factor };
}

function quantity(input: FormValue | undefined): QuantityInput {
  if (input !== null && typeof input === 'object') return input;
  return { value: typeof input === 'string' ? input : '', unit: '' };
}

function typedNumber(text: string, what: string): { ok: true; n: number } | { ok: false; message: string } {
  const n = parseTypedNumber(text);
  return n === null ? { ok: false, message: `Enter a number for the ${what}.` } : { ok: true, n };
}

/** One field's form value in its stored form; value undefined when the field was left empty. */
export function normaliseFormValue(field: FieldDef, input: FormValue | undefined, draft: SpecDraft = {}): Normalised {
  switch (field.kind) {
    case 'boolean':
      return { ok: true, value: input === true };
    case 'text':
    case 'select': {
      const s = typeof input === 'string' ? input.trim() : '';
      return { ok: true, value: s === '' ? undefined : s };
    }
    case 'number-list': {
      const q = quantity(input);
      const parts = q.value.split(/[\s,;]+/).filter((p) => p !== '');
      if (parts.length === 0) return { ok: true, value: undefined };
      const f = factorFor(field, q.unit, draft);
      if (!f.ok) return f;
      const out: number[] = [];
      for (const p of parts) {
        const n = parseTypedNumber(p);
        if (n === null) return { ok: false, message: `"${p}" is not a number: separate several values with commas.` };
        out.push(roundStored(n * f.factor));
      }
      return { ok: true, value: out };
    }
    case 'nullable-number':
    case 'number':
    case 'toleranced': {
      const q = quantity(input);
      if (field.kind === 'nullable-number' && q.flat === true) return { ok: true, value: null };
      const tolText = (q.tol ?? '').trim();
      if (q.value.trim() === '') {
        return tolText === '' ? { ok: true, value: undefined } : { ok: false, message: 'Give the value as well as its tolerance.' };
      }
      const v = typedNumber(q.value, 'value');
      if (!v.ok) return v;
      const f = factorFor(field, q.unit, draft);
      if (!f.ok) return f;
      const value = roundStored(v.n * f.factor);
      if (field.kind !== 'toleranced') return { ok: true, value };
      if (tolText === '') return { ok: true, value: { value } };
      const t = typedNumber(tolText, 'tolerance');
      if (!t.ok) return t;
      return { ok: true, value: { value, tol: roundStored(t.n * f.factor) } };
    }
  }
}

function fieldLabel(fields: readonly FieldDef[], path: string): string {
  return (fields.find((f) => f.path === path)?.label ?? path).toLowerCase();
}

/**
 * The form's values as stored specs, checked by the category's schema. Errors are keyed by the
 * form field path (a schema error on a field the form derived from another, such as the loss from
 * the reflectivity, is reported on the field the seller typed).
 */
export function toStoredSpecs<C extends Category>(category: C, values: FormValues): StoredSpecsResult<C> {
  const fields = CATEGORY_FIELDS[category];
  const draft: Record<string, unknown> = {};
  const errors: Record<string, string> = {};
  const typedAs: Record<string, string> = {};

  for (const field of fields.filter((f) => f.alternative === undefined)) {
    const r = normaliseFormValue(field, values[field.path], draft);
    if (!r.ok) errors[field.path] = r.message;
    else if (r.value !== undefined) draft[field.path] = r.value;
  }
  for (const field of fields) {
    const alt = field.alternative;
    if (alt === undefined) continue;
    const r = normaliseFormValue(field, values[field.path], draft);
    if (!r.ok) {
      errors[field.path] = r.message;
      continue;
    }
    if (r.value === undefined) continue;
    if (draft[alt.replaces] !== undefined || errors[alt.replaces] !== undefined) {
      errors[field.path] = `Give the ${fieldLabel(fields, alt.replaces)} or the ${field.label.toLowerCase()}, not both.`;
      continue;
    }
    const derived = alt.derive(r.value as Toleranced, draft);
    if (typeof derived === 'string') errors[field.path] = derived;
    else {
      draft[alt.replaces] = derived;
      typedAs[alt.replaces] = field.path;
    }
  }

  const parsed = SPEC_SCHEMAS[category].safeParse(draft);
  if (parsed.success && Object.keys(errors).length === 0) return { ok: true, specs: parsed.data as SpecsByCategory[C] };
  if (!parsed.success) {
    for (const i of parsed.error.issues) {
      const top = String(i.path[0] ?? '');
      const key = typedAs[top] ?? top;
      if (errors[key] === undefined) errors[key] = i.message;
    }
  }
  return { ok: false, errors };
}

/** 15 digits, three more than roundStored keeps, so that form → stored gives back the stored value exactly. */
function typedText(x: number): string {
  return String(Number(x.toPrecision(15)));
}

/** Stored specs as form values, to pre-fill an edit form; `units` picks a unit per field (else the first offered). */
export function toFormValues(
  category: Category,
  specs: Readonly<Record<string, unknown>>,
  units: Readonly<Record<string, string>> = {},
): FormValues {
  const out: FormValues = {};
  for (const field of CATEGORY_FIELDS[category]) {
    const stored = field.alternative === undefined ? specs[field.path] : undefined;
    switch (field.kind) {
      case 'boolean':
        out[field.path] = stored === true;
        break;
      case 'text':
      case 'select':
        out[field.path] = typeof stored === 'string' ? stored : '';
        break;
      default:
        out[field.path] = quantityFor(field, stored, units[field.path], specs);
    }
  }
  return out;
}

function quantityFor(field: FieldDef, stored: unknown, wanted: string | undefined, specs: SpecDraft): QuantityInput {
  const chosen = unitOf(field, wanted);
  // A unit that needs other specs the listing lacks falls back to the first plain one.
  const unit =
    chosen !== null && factorOf(chosen, specs) === null ? (field.units?.find((u) => typeof u.factor === 'number') ?? null) : chosen;
  const factor = unit === null ? 1 : (factorOf(unit, specs) as number);
  const q: QuantityInput = { value: '', unit: unit?.key ?? '' };
  if (field.kind === 'toleranced') q.tol = '';
  if (field.kind === 'nullable-number') q.flat = stored === null;
  if (typeof stored === 'number') q.value = typedText(stored / factor);
  else if (Array.isArray(stored)) q.value = stored.map((x: number) => typedText(x / factor)).join(', ');
  else if (stored !== null && typeof stored === 'object') {
    const t = stored as Toleranced;
    q.value = typedText(t.value / factor);
    if (t.tol !== undefined) q.tol = typedText(t.tol / factor);
  }
  return q;
}

// What a generic form needs to render one spec field, and how the spec table shows its stored value.

import type { SpecDraft, UnitChoice } from './form-units';
import type { Toleranced } from './common';

export type FieldKind = 'number' | 'toleranced' | 'nullable-number' | 'number-list' | 'text' | 'select' | 'boolean';

export interface SelectOption {
  value: string;
  label: string;
}

/** How the stored value reads in the spec table: `unit` after a thin space, SI prefixes when `si`. */
export interface DisplayDef {
  unit: string;
  /** Stored value × scale is in `unit` (rocMm shown in m: 1e-3; a fraction shown in %: 100). */
  scale?: number;
  si?: boolean;
  /** Significant digits (default 4). */
  sig?: number;
  /** No space before the unit (°). */
  tight?: boolean;
}

/** A form-only field that stands in for a stored one (reflectivity given instead of the loss). */
export interface AlternativeDef {
  /** The stored field it replaces when that one is left empty. */
  replaces: string;
  /** The replaced field's stored value from this field's stored-unit value; a string is the error. */
  derive: (value: Toleranced, draft: SpecDraft) => Toleranced | string;
}

export interface FieldDef {
  /** Key in the stored specs (or of the form-only field). */
  path: string;
  label: string;
  kind: FieldKind;
  required: boolean;
  /** The choices offered, the first is the default; absent for unitless numbers and non-numbers. */
  units?: readonly UnitChoice[];
  hint?: string;
  options?: readonly SelectOption[];
  /** Common answers for a free-text field (a datalist), not a closed list. */
  suggestions?: readonly string[];
  /** nullable-number: the checkbox that stores null ("flat"). */
  nullLabel?: string;
  display?: DisplayDef;
  /** The word before the value in searchable text; '' for none; the label lower-cased when absent. */
  textLabel?: string;
  /** This field is the lower end of a range whose upper end is the field at this path (shown as one row). */
  rangeTo?: string;
  rangeLabel?: string;
  /** Not offered in the form (an API-only alternative such as a stated responsivity); still shown. */
  formHidden?: boolean;
  /** Offered in the form but not stored: converted into another field. */
  alternative?: AlternativeDef;
}

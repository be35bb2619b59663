import { useId } from 'react';
import { UNITS, type Dimension, type UnitKey, type UnitOption } from '../../lib/units';

export interface Quantity<D extends Dimension> {
  text: string;
  unit: UnitKey<D>;
}

export function parseQuantity<D extends Dimension>(dimension: D, q: Quantity<D>): number | null {
  const t = q.text.trim().replace(',', '.').replace(/\s/g, '');
  if (t === '') return null;
  const v = Number(t);
  if (!Number.isFinite(v)) return null;
  return v * (UNITS[dimension][q.unit] as UnitOption).factor;
}

interface Props<D extends Dimension> {
  label: string;
  dimension: D;
  value: Quantity<D>;
  onChange: (q: Quantity<D>) => void;
  /** Units offered in the picker (default: all of the dimension). */
  units?: UnitKey<D>[];
  error?: string | null;
  hint?: string;
}

/** A number with a unit picker; the caller converts with parseQuantity. */
export function QuantityInput<D extends Dimension>({ label, dimension, value, onChange, units, error, hint }: Props<D>) {
  const id = useId();
  const all = UNITS[dimension] as Record<string, UnitOption>;
  const keys = (units ?? Object.keys(all)) as UnitKey<D>[];
  const describedBy = error ? `${id}-err` : hint ? `${id}-hint` : undefined;
  return (
    <div className="mb-3">
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <div className="flex">
        <input
          id={id}
          inputMode="decimal"
          className="field-input num rounded-r-none"
          value={value.text}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          onChange={(e) => onChange({ ...value, text: e.target.value })}
        />
        {keys.length > 1 ? (
          <select
            aria-label={`${label} unit`}
            className="rounded-r-sm border border-l-0 border-rule-strong bg-paper px-2 text-sm"
            value={value.unit}
            onChange={(e) => onChange({ ...value, unit: e.target.value as UnitKey<D> })}
          >
            {keys.map((k) => (
              <option key={k} value={k}>
                {all[k]!.label}
              </option>
            ))}
          </select>
        ) : (
          <span className="rounded-r-sm border border-l-0 border-rule-strong bg-paper px-2 py-2 text-sm">{all[keys[0]!]!.label}</span>
        )}
      </div>
      {error ? (
        <p id={`${id}-err`} className="field-error">
          {error}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="field-hint">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

/** A result line: the number first, then the formula and its source, folded. */
export function ResultRow({
  label,
  value,
  formula,
  source,
  testId,
}: {
  label: string;
  value: string;
  formula: string;
  source: string;
  testId?: string;
}) {
  return (
    <div className="border-b border-rule py-2 last:border-b-0">
      <div className="flex items-baseline justify-between gap-3">
        <span className="text-sm text-ink-soft">{label}</span>
        <span className="num text-lg font-semibold" data-testid={testId}>
          {value}
        </span>
      </div>
      <details className="text-xs text-ink-faint">
        <summary className="cursor-pointer">formula and source</summary>
        <p className="mt-1 font-mono">{formula}</p>
        <p className="mt-0.5">{source}</p>
      </details>
    </div>
  );
}

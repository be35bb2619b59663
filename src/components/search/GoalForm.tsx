import type { GoalMode } from '../../lib/schemas/search';
import { visibleFields, type Values } from '../../lib/search/goal-forms';

/** The goal's fields for one mode, each with its unit; problems shown on their fields. */
export function GoalForm({
  mode,
  values,
  errors,
  onChange,
}: {
  mode: GoalMode;
  values: Values;
  errors: Record<string, string>;
  onChange: (key: string, value: string) => void;
}) {
  return (
    <div className="grid gap-x-4 gap-y-3 sm:grid-cols-2 lg:grid-cols-4" data-testid={`goal-form-${mode}`}>
      {visibleFields(mode, values).map((f) => {
        const id = `goal-${mode}-${f.key}`;
        const error = errors[f.key];
        const described = [f.hint && !error ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
        return (
          <div key={f.key} className="min-w-0">
            <label className="field-label" htmlFor={id}>
              {f.label}
            </label>
            {f.options ? (
              <select id={id} className="field-input" value={values[f.key] ?? f.initial} onChange={(e) => onChange(f.key, e.target.value)}>
                {f.options.map((o) => (
                  <option key={o.value} value={o.value}>
                    {o.label}
                  </option>
                ))}
              </select>
            ) : (
              <div className="flex">
                <input
                  id={id}
                  inputMode="decimal"
                  autoComplete="off"
                  className={`field-input num min-w-0 ${f.unit ? 'rounded-r-none' : ''}`}
                  value={values[f.key] ?? ''}
                  aria-invalid={error ? true : undefined}
                  aria-describedby={described}
                  onChange={(e) => onChange(f.key, e.target.value)}
                />
                {f.unit && (
                  <span
                    className="shrink-0 rounded-r-sm border border-l-0 border-rule-strong bg-paper px-2 py-2 text-sm"
                    aria-hidden="true"
                  >
                    {f.unit}
                  </span>
                )}
              </div>
            )}
            {f.hint && !error && (
              <p id={`${id}-hint`} className="field-hint">
                {f.hint}
              </p>
            )}
            {error && (
              <p id={`${id}-error`} className="field-error" role="alert">
                {error}
              </p>
            )}
          </div>
        );
      })}
    </div>
  );
}

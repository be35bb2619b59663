import { forwardRef, useId, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

interface Described {
  label: string;
  error?: string | undefined;
  hint?: ReactNode;
}

function describedBy(id: string, hint: unknown, error: unknown): string | undefined {
  return [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
}

function Below({ id, hint, error }: { id: string; hint?: ReactNode; error?: string | undefined }) {
  return (
    <>
      {hint && !error && (
        <p id={`${id}-hint`} className="field-hint">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="field-error" role="alert">
          {error}
        </p>
      )}
    </>
  );
}

/** A labelled select with hint and error, like Field for inputs. */
export const SelectField = forwardRef<HTMLSelectElement, Described & SelectHTMLAttributes<HTMLSelectElement>>(function SelectField(
  { label, error, hint, id, children, ...rest },
  ref,
) {
  const auto = useId();
  const selectId = id ?? auto;
  return (
    <div className="mb-4">
      <label htmlFor={selectId} className="field-label">
        {label}
      </label>
      <select
        ref={ref}
        id={selectId}
        className="field-input"
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(selectId, hint, error)}
        {...rest}
      >
        {children}
      </select>
      <Below id={selectId} hint={hint} error={error} />
    </div>
  );
});

export const TextAreaField = forwardRef<HTMLTextAreaElement, Described & TextareaHTMLAttributes<HTMLTextAreaElement>>(
  function TextAreaField({ label, error, hint, id, ...rest }, ref) {
    const auto = useId();
    const areaId = id ?? auto;
    return (
      <div className="mb-4">
        <label htmlFor={areaId} className="field-label">
          {label}
        </label>
        <textarea
          ref={ref}
          id={areaId}
          className="field-input min-h-32"
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(areaId, hint, error)}
          {...rest}
        />
        <Below id={areaId} hint={hint} error={error} />
      </div>
    );
  },
);

/** A thin bar with its share as a number beside it (the number, not the bar, is what a screen reader gets). */
export function ProgressBar({ share, label }: { share: number; label: string }) {
  const pct = Math.round(Math.min(1, Math.max(0, share)) * 100);
  return (
    <div className="flex items-center gap-2">
      <div
        className="h-1.5 min-w-0 flex-1 overflow-hidden rounded-full bg-rule"
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct}
      >
        <div className="h-full bg-accent" style={{ width: `${pct}%` }} />
      </div>
      <span className="num w-10 text-right text-xs text-ink-soft">{pct}&thinsp;%</span>
    </div>
  );
}

import { useId } from 'react';
import { get, useFormContext, useWatch, type FieldErrors, type Path } from 'react-hook-form';
import type { Category } from '../../lib/listings/constants';
import { CATEGORY_FIELDS, HAZARD_CLASSES, normaliseFormValue, suggestedHazardClass, type FieldDef, type Toleranced } from '../../lib/specs';
import type { ListingFormValues } from './listing-form';

type Name = Path<ListingFormValues>;

function errorAt(errors: FieldErrors<ListingFormValues>, path: string): string | undefined {
  const e = get(errors, path) as { message?: unknown } | undefined;
  return typeof e?.message === 'string' ? e.message : undefined;
}

function UnitPicker({ field, name, label }: { field: FieldDef; name: string; label: string }) {
  const { register } = useFormContext<ListingFormValues>();
  const units = field.units ?? [];
  if (units.length === 0) return null;
  if (units.length === 1) {
    return (
      <span className="flex items-center rounded-r-sm border border-l-0 border-rule-strong bg-paper px-2 text-sm">{units[0]!.label}</span>
    );
  }
  return (
    <select
      aria-label={`${label} unit`}
      className="rounded-r-sm border border-l-0 border-rule-strong bg-paper px-1.5 text-sm"
      {...register(`${name}.unit` as Name)}
    >
      {units.map((u) => (
        <option key={u.key} value={u.key}>
          {u.label}
        </option>
      ))}
    </select>
  );
}

function Messages({ id, hint, error }: { id: string; hint?: string | undefined; error?: string | undefined }) {
  if (error) {
    return (
      <p id={`${id}-error`} className="field-error" role="alert">
        {error}
      </p>
    );
  }
  return hint ? (
    <p id={`${id}-hint`} className="field-hint">
      {hint}
    </p>
  ) : null;
}

function labelText(field: FieldDef): string {
  return field.required ? field.label : `${field.label} (optional)`;
}

/** number, toleranced, nullable-number, number-list: typed text with a unit picker (and ±, and "flat"). */
function QuantityField({ field, labelHidden }: { field: FieldDef; labelHidden?: boolean }) {
  const { register, control, formState } = useFormContext<ListingFormValues>();
  const id = useId();
  const name = `specs.${field.path}`;
  const error = errorAt(formState.errors, name);
  const flat = useWatch({ control, name: `${name}.flat` as Name }) === true;
  const described = error ? `${id}-error` : field.hint ? `${id}-hint` : undefined;
  const hasUnits = (field.units?.length ?? 0) > 0;
  const inputClass = `field-input num min-w-0 flex-1 ${flat ? 'bg-paper text-ink-faint' : ''}`;
  return (
    <div className="mb-4">
      <label htmlFor={id} className={labelHidden ? 'sr-only' : 'field-label'}>
        {labelText(field)}
      </label>
      <div className="flex items-stretch">
        <input
          id={id}
          inputMode={field.kind === 'number-list' ? 'text' : 'decimal'}
          className={`${inputClass} ${hasUnits || field.kind === 'toleranced' ? 'rounded-r-none' : ''}`}
          aria-invalid={error ? true : undefined}
          aria-describedby={described}
          readOnly={flat}
          placeholder={field.kind === 'number-list' ? 'e.g. 9.4, 9.6' : undefined}
          {...register(`${name}.value` as Name)}
        />
        {field.kind === 'toleranced' && (
          <>
            <span className="flex items-center border-y border-rule-strong bg-paper px-1.5 text-sm" aria-hidden="true">
              ±
            </span>
            <input
              inputMode="decimal"
              aria-label={`${field.label} tolerance (±)`}
              placeholder="tol."
              className={`field-input num w-20 shrink-0 rounded-none border-l-0 ${hasUnits ? '' : 'rounded-r-sm'}`}
              {...register(`${name}.tol` as Name)}
            />
          </>
        )}
        <UnitPicker field={field} name={name} label={field.label} />
      </div>
      {field.kind === 'nullable-number' && field.nullLabel && (
        <label className="mt-1.5 flex items-center gap-1.5 text-sm">
          <input type="checkbox" {...register(`${name}.flat` as Name)} /> {field.nullLabel}
        </label>
      )}
      <Messages id={id} hint={field.hint} error={error} />
    </div>
  );
}

function TextSpecField({ field }: { field: FieldDef }) {
  const { register, formState } = useFormContext<ListingFormValues>();
  const id = useId();
  const name = `specs.${field.path}` as Name;
  const error = errorAt(formState.errors, name);
  const listId = field.suggestions ? `${id}-list` : undefined;
  return (
    <div className="mb-4">
      <label htmlFor={id} className="field-label">
        {labelText(field)}
      </label>
      <input
        id={id}
        list={listId}
        className="field-input"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : field.hint ? `${id}-hint` : undefined}
        {...register(name)}
      />
      {field.suggestions && (
        <datalist id={listId}>
          {field.suggestions.map((s) => (
            <option key={s} value={s} />
          ))}
        </datalist>
      )}
      <Messages id={id} hint={field.hint} error={error} />
    </div>
  );
}

function SelectSpecField({ field, category }: { field: FieldDef; category: Category }) {
  const { register, formState } = useFormContext<ListingFormValues>();
  const id = useId();
  const name = `specs.${field.path}` as Name;
  const error = errorAt(formState.errors, name);
  return (
    <div className="mb-4">
      <label htmlFor={id} className="field-label">
        {labelText(field)}
      </label>
      <select
        id={id}
        className="field-input"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : field.hint ? `${id}-hint` : undefined}
        {...register(name)}
      >
        <option value="">{field.required ? 'Choose…' : '—'}</option>
        {field.options?.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {category === 'laser' && field.path === 'hazardClass' && <HazardSuggestion />}
      <Messages id={id} hint={field.hint} error={error} />
    </div>
  );
}

const LASER_FIELDS = CATEGORY_FIELDS.laser;
const laserField = (path: string) => LASER_FIELDS.find((f) => f.path === path) as FieldDef;

/** The class the fit engine suggests from the power (upper end) and wavelength typed above; the seller confirms it. */
function HazardSuggestion() {
  const { control, setValue } = useFormContext<ListingFormValues>();
  const [wavelength, power] = useWatch({ control, name: ['specs.centreWavelengthNm', 'specs.powerW'] as Name[] });
  const nm = normaliseFormValue(laserField('centreWavelengthNm'), wavelength as never);
  const w = normaliseFormValue(laserField('powerW'), power as never);
  if (!nm.ok || !w.ok || typeof nm.value !== 'number' || !(nm.value > 0) || w.value === undefined || !((w.value as Toleranced).value > 0)) {
    return <p className="field-hint">Enter the centre wavelength and output power above for a suggested class.</p>;
  }
  const s = suggestedHazardClass({ centreWavelengthNm: nm.value, powerW: w.value as Toleranced });
  const usable = (HAZARD_CLASSES as readonly string[]).includes(s.hazardClass);
  return (
    <div className="mt-1.5 text-sm" data-testid="hazard-suggestion">
      <p>
        Suggested: <strong>{usable ? `Class ${s.hazardClass}` : 'needs the IEC 60825-1 tables'}</strong>
        {s.atMostClass && ` (at most Class ${s.atMostClass})`}.{' '}
        {usable && (
          <button
            type="button"
            className="text-accent underline"
            onClick={() => setValue('specs.hazardClass' as Name, s.hazardClass as never, { shouldDirty: true, shouldValidate: true })}
          >
            Use Class {s.hazardClass}
          </button>
        )}
      </p>
      <p className="field-hint">{s.caution}</p>
    </div>
  );
}

function BooleanSpecField({ field }: { field: FieldDef }) {
  const { register } = useFormContext<ListingFormValues>();
  return (
    <div className="mb-4 flex items-center gap-2 sm:pt-7">
      <input id={`spec-${field.path}`} type="checkbox" {...register(`specs.${field.path}` as Name)} />
      <label htmlFor={`spec-${field.path}`} className="text-sm font-medium">
        {field.label}
      </label>
    </div>
  );
}

/** A form-only stand-in (the reflectivity instead of the loss), folded until wanted. */
function AlternativeField({ field }: { field: FieldDef }) {
  const { control, formState } = useFormContext<ListingFormValues>();
  const value = useWatch({ control, name: `specs.${field.path}.value` as Name });
  const open = (typeof value === 'string' && value.trim() !== '') || errorAt(formState.errors, `specs.${field.path}`) !== undefined;
  return (
    <details className="mb-4" open={open}>
      <summary className="cursor-pointer text-sm font-medium text-accent">{field.label}</summary>
      <div className="mt-2 sm:max-w-[calc(50%-0.5rem)]">
        <QuantityField field={field} labelHidden />
      </div>
    </details>
  );
}

function SpecField({ field, category }: { field: FieldDef; category: Category }) {
  if (field.alternative) return <AlternativeField field={field} />;
  switch (field.kind) {
    case 'text':
      return <TextSpecField field={field} />;
    case 'select':
      return <SelectSpecField field={field} category={category} />;
    case 'boolean':
      return <BooleanSpecField field={field} />;
    default:
      return <QuantityField field={field} />;
  }
}

/** The category's spec fields, rendered from its FieldDefs in their order. */
export function SpecFields({ category }: { category: Category }) {
  const fields = CATEGORY_FIELDS[category].filter((f) => !f.formHidden);
  return (
    <div className="grid gap-x-4 sm:grid-cols-2">
      {fields.map((f) => (
        // The two ends of a range share a row; a folded alternative takes a row of its own.
        <div key={f.path} className={f.alternative ? 'sm:col-span-2' : f.rangeTo ? 'sm:col-start-1' : undefined}>
          <SpecField field={f} category={category} />
        </div>
      ))}
    </div>
  );
}

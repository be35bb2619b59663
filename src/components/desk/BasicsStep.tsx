import { useFormContext } from 'react-hook-form';
import {
  CATEGORIES,
  CATEGORY_LABELS,
  CONDITION_LABELS,
  CONDITIONS,
  REGION_LABELS,
  REGIONS,
  type Category,
} from '../../lib/listings/constants';
import { CURRENCIES } from '../../lib/specs';
import { Field } from '../forms/Field';
import { SelectField, TextAreaField } from './FormBits';
import type { ListingFormValues } from './listing-form';
import { minorDigits } from './money';
import type { LabOption } from './types';

interface Props {
  labs: LabOption[];
  /** The category of a saved listing cannot change. */
  fixedCategory: Category | null;
  /** A new listing by someone in several labs says which lab lists it. */
  chooseLab: boolean;
}

/** Step 1: category and the fields every listing has. */
export function BasicsStep({ labs, fixedCategory, chooseLab }: Props) {
  const { register, formState, watch } = useFormContext<ListingFormValues>();
  const { errors } = formState;
  const currency = watch('currency');
  const digits = minorDigits(currency);
  return (
    <div>
      {chooseLab && (
        <SelectField label="Lab" error={errors.labId?.message} {...register('labId')}>
          <option value="">Choose…</option>
          {labs.map((l) => (
            <option key={l.id} value={l.id}>
              {l.name}
            </option>
          ))}
        </SelectField>
      )}
      {fixedCategory ? (
        <div className="mb-4">
          <p className="field-label">Category</p>
          <p className="text-sm">
            {CATEGORY_LABELS[fixedCategory]} <span className="text-ink-faint">(fixed once saved; duplicate the listing to change it)</span>
          </p>
        </div>
      ) : (
        <SelectField
          label="Category"
          error={errors.category?.message}
          hint="Decides which specs the next step asks for."
          {...register('category')}
        >
          <option value="">Choose…</option>
          {CATEGORIES.map((c) => (
            <option key={c} value={c}>
              {CATEGORY_LABELS[c]}
            </option>
          ))}
        </SelectField>
      )}
      <Field
        label="Title"
        maxLength={140}
        error={errors.title?.message}
        hint="What a buyer searches for, e.g. “Matched pair of 780 nm supermirrors, ROC 50 mm”."
        {...register('title')}
      />
      <TextAreaField
        label="Description (optional)"
        error={errors.description?.message}
        hint="Markdown: **bold**, *italic*, lists, [links](https://…). HTML is not allowed and is removed."
        {...register('description')}
      />
      <SelectField label="Condition" error={errors.condition?.message} {...register('condition')}>
        <option value="">Choose…</option>
        {CONDITIONS.map((c) => (
          <option key={c} value={c}>
            {CONDITION_LABELS[c]}
          </option>
        ))}
      </SelectField>
      <div className="grid gap-x-4 sm:grid-cols-[8rem_minmax(0,1fr)_9rem]">
        <Field
          label="Quantity"
          inputMode="numeric"
          className="field-input num"
          error={errors.quantity?.message}
          {...register('quantity')}
        />
        <Field
          label="Price per unit"
          inputMode="decimal"
          className="field-input num"
          error={errors.price?.message}
          hint={digits === 0 ? `In whole ${currency}.` : `In ${currency}, e.g. 1250 or 1250.50.`}
          {...register('price')}
        />
        <SelectField label="Currency" error={errors.currency?.message} {...register('currency')}>
          {CURRENCIES.map((c) => (
            <option key={c} value={c}>
              {c}
            </option>
          ))}
        </SelectField>
      </div>
      <fieldset className="mb-4" aria-describedby={errors.shipsTo ? 'ships-to-error' : undefined}>
        <legend className="field-label">Ships to</legend>
        <div className="grid grid-cols-1 gap-x-4 gap-y-1 min-[400px]:grid-cols-2 sm:grid-cols-3">
          {REGIONS.map((r) => (
            <label key={r} className="flex items-center gap-2 text-sm">
              <input type="checkbox" value={r} {...register('shipsTo')} /> {REGION_LABELS[r]}
            </label>
          ))}
        </div>
        {errors.shipsTo?.message && (
          <p id="ships-to-error" className="field-error" role="alert">
            {errors.shipsTo.message}
          </p>
        )}
      </fieldset>
    </div>
  );
}

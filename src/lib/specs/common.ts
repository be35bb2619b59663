// Building blocks of the spec schemas: numbers with plain-words messages, toleranced numbers
// { value, tol? } (tol a ± in the same unit), and the cross-field checks several categories share.

import { z } from 'zod';

const NUMBER = { required_error: 'Required.', invalid_type_error: 'Enter a number.' };

export function numberSchema(): z.ZodNumber {
  return z.number(NUMBER).finite('Enter a finite number.');
}

export function positiveSchema(): z.ZodNumber {
  return numberSchema().positive('Must be greater than 0.');
}

export function nonNegativeSchema(): z.ZodNumber {
  return numberSchema().nonnegative('Must be 0 or more.');
}

/** A power fraction of light detected or transmitted: 0 would be no detector at all, above 1 is impossible. */
export function efficiencySchema(): z.ZodNumber {
  return positiveSchema().max(1, 'An efficiency is a fraction in (0, 1]: at most 1 (100 %).');
}

export function probabilitySchema(): z.ZodNumber {
  return nonNegativeSchema().max(1, 'A probability is at most 1 (100 %).');
}

export function tolerancedSchema(value: z.ZodNumber) {
  return z.object(
    {
      value,
      tol: nonNegativeSchema().optional(),
    },
    { required_error: 'Required.', invalid_type_error: 'Give { value, tol? }.' },
  );
}

export function textSchema(max = 120) {
  return z
    .string({ required_error: 'Required.', invalid_type_error: 'Enter text.' })
    .trim()
    .min(1, 'Required.')
    .max(max, `Use at most ${max} characters.`);
}

export function enumSchema<T extends readonly [string, ...string[]]>(values: T, what: string) {
  return z.enum(values, { errorMap: () => ({ message: `Choose ${what}: ${values.join(', ')}.` }) });
}

export function booleanSchema() {
  return z.boolean({ required_error: 'Required.', invalid_type_error: 'Answer yes or no.' });
}

export type Toleranced = z.infer<ReturnType<typeof tolerancedSchema>>;

export function issue(ctx: z.RefinementCtx, path: (string | number)[], message: string): void {
  ctx.addIssue({ code: z.ZodIssueCode.custom, path, message });
}

/** A value quoted at one wavelength needs that wavelength, or the fit engine cannot place it. */
export function requireWavelengthFor(
  ctx: z.RefinementCtx,
  specs: { wavelengthNm?: number | undefined },
  present: boolean,
  what: string,
): void {
  if (present && specs.wavelengthNm === undefined) issue(ctx, ['wavelengthNm'], `Say the wavelength the ${what} refers to.`);
}

/** min < max for a range of two fields. */
export function checkRange(ctx: z.RefinementCtx, min: number, max: number, maxPath: string, what: string): boolean {
  if (min < max) return true;
  issue(ctx, [maxPath], `The upper end of the ${what} must be above its lower end (${min}).`);
  return false;
}

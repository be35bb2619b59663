// The listing body of POST /api/listings (a union on category, so spec errors carry paths like
// specs.transmissionPpm.value) and of PATCH /api/listings/:id (any subset; specs replaced whole
// and checked against the listing's own category).

import { z } from 'zod';
import { CATEGORIES, CONDITIONS, REGIONS, type Category } from '../listings/constants';
import { issue } from './common';
import { SPEC_SCHEMAS } from './registry';

/** ISO 4217 codes accepted for prices (the currencies of the labs we expect). */
export const CURRENCIES = [
  'EUR',
  'USD',
  'GBP',
  'CHF',
  'JPY',
  'CAD',
  'AUD',
  'SEK',
  'NOK',
  'DKK',
  'PLN',
  'CNY',
  'KRW',
  'SGD',
  'INR',
] as const;
export type Currency = (typeof CURRENCIES)[number];

const MAX_PRICE_CENTS = 1e10;

export const CurrencySchema = z
  .string({ required_error: 'Choose a currency.', invalid_type_error: 'Choose a currency.' })
  .regex(/^[A-Z]{3}$/, 'Use the three-letter ISO 4217 code in capitals, like EUR or USD.')
  .pipe(z.enum(CURRENCIES, { errorMap: () => ({ message: `Choose one of ${CURRENCIES.join(', ')}.` }) }));

export const ShipsToSchema = z
  .array(z.enum(REGIONS, { errorMap: () => ({ message: `Choose regions from ${REGIONS.join(', ')}.` }) }), {
    required_error: 'Say where you ship to.',
    invalid_type_error: 'Give a list of regions.',
  })
  .min(1, 'Say where you ship to: at least one region.')
  .superRefine((regions, ctx) => {
    const seen = new Set<string>();
    for (const r of regions) {
      if (seen.has(r)) issue(ctx, [], `${r} is listed twice.`);
      seen.add(r);
    }
  });

const listingFields = {
  title: z
    .string({ required_error: 'Give the listing a title.', invalid_type_error: 'Enter text.' })
    .trim()
    .min(3, 'Use at least 3 characters.')
    .max(140, 'Use at most 140 characters.'),
  description: z.string({ invalid_type_error: 'Enter text.' }).max(20_000, 'Use at most 20 000 characters.').default(''),
  condition: z.enum(CONDITIONS, { errorMap: () => ({ message: `Choose a condition: ${CONDITIONS.join(', ')}.` }) }),
  quantity: z
    .number({ required_error: 'Say how many you have.', invalid_type_error: 'Enter a whole number.' })
    .int('Enter a whole number.')
    .min(0, 'Use 0 or more.')
    .max(10_000, 'At most 10 000 per listing.'),
  priceCents: z
    .number({ required_error: 'Set a price.', invalid_type_error: 'Enter the price in minor units (cents) as a whole number.' })
    .int('Enter the price in minor units (cents) as a whole number.')
    .positive('The price must be above 0.')
    .max(MAX_PRICE_CENTS, 'The price is above the largest we accept (10⁸ in major units).'),
  currency: CurrencySchema,
  shipsTo: ShipsToSchema,
};

const ListingBaseSchema = z.object(listingFields);

function withCategory<C extends Category>(category: C) {
  return ListingBaseSchema.extend({ category: z.literal(category), specs: SPEC_SCHEMAS[category] });
}

export const ListingInputSchema = z.discriminatedUnion(
  'category',
  [
    withCategory('cavity-mirror'),
    withCategory('photodiode'),
    withCategory('balanced-detector'),
    withCategory('single-photon-detector'),
    withCategory('laser'),
    withCategory('nonlinear-crystal'),
    withCategory('other'),
  ],
  { errorMap: () => ({ message: `Choose a category: ${CATEGORIES.join(', ')}.` }) },
);

export type ListingInput = z.infer<typeof ListingInputSchema>;

/** Keys of a patch before the listing's category is known; specs are checked by listingPatchSchema. */
export const ListingPatchSchema = ListingBaseSchema.partial().extend({ specs: z.unknown().optional() });

/** The patch schema for a listing of this category: any subset of the fields, at least one. */
export function listingPatchSchema<C extends Category>(category: C) {
  return ListingBaseSchema.partial()
    .extend({
      specs: z.optional(SPEC_SCHEMAS[category]),
      category: z.unknown().optional(),
    })
    .superRefine((patch, ctx) => {
      if (patch.category !== undefined && patch.category !== category) {
        issue(ctx, ['category'], 'The category of a listing cannot change: create a new listing instead.');
      }
      if (Object.keys(listingFields).every((k) => patch[k as keyof typeof patch] === undefined) && patch.specs === undefined) {
        issue(ctx, [], 'Nothing to change.');
      }
    })
    .transform(({ category: _category, ...rest }) => rest);
}

export type ListingPatch<C extends Category = Category> = z.infer<ReturnType<typeof listingPatchSchema<C>>>;

export function parseListingPatch<C extends Category>(category: C, body: unknown) {
  return listingPatchSchema(category).safeParse(body);
}

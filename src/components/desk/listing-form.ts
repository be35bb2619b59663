// The listing editor's form: what the seller types (numbers as text with their units, the price in
// major units) and its conversion into the body of POST/PATCH /api/listings, checked by the very
// schema the endpoint parses with. Errors are keyed by the form field the seller typed into.
import { z } from 'zod';
import { CATEGORIES, type Category, type Condition, type Region } from '../../lib/listings/constants';
import { ListingInputSchema, parseTypedNumber, toFormValues, toStoredSpecs, type FormValues, type ListingInput } from '../../lib/specs';
import { majorUnitsText, parseMajorUnits } from './money';
import type { DeskListing } from './types';

export interface ListingFormValues {
  labId: string;
  category: Category | '';
  title: string;
  description: string;
  condition: Condition | '';
  quantity: string;
  price: string;
  currency: string;
  shipsTo: Region[];
  specs: FormValues;
}

export interface ListingFormOutput {
  body: ListingInput;
  labId: string | undefined;
}

export const BASICS_FIELDS = [
  'labId',
  'category',
  'title',
  'description',
  'condition',
  'quantity',
  'price',
  'currency',
  'shipsTo',
] as const;

const isCategory = (c: string): c is Category => (CATEGORIES as readonly string[]).includes(c);

/** Where an issue of the API body belongs in the form: priceCents is typed as price, a spec's value or tol on the spec's field. */
function formPathOf(apiPath: readonly (string | number)[]): string | null {
  const [top, next] = apiPath;
  if (top === 'priceCents') return 'price';
  if (top === 'specs') return typeof next === 'string' ? `specs.${next}` : null;
  if (typeof top === 'string' && (BASICS_FIELDS as readonly string[]).includes(top)) return top;
  return null;
}

/** A server error's field key ("specs.transmissionPpm.value", "shipsTo.1") as a form field path. */
export function formPathOfServerField(key: string): string | null {
  return formPathOf(key.split('.'));
}

export function listingFormSchema(opts: { needsLab: boolean }) {
  return z
    .object({
      labId: z.string(),
      category: z.custom<Category | ''>((v) => typeof v === 'string'),
      title: z.string(),
      description: z.string(),
      condition: z.custom<Condition | ''>((v) => typeof v === 'string'),
      quantity: z.string(),
      price: z.string(),
      currency: z.string(),
      shipsTo: z.custom<Region[]>((v) => Array.isArray(v)),
      specs: z.custom<FormValues>((v) => typeof v === 'object' && v !== null),
    })
    .transform((v, ctx): ListingFormOutput => {
      const reported = new Set<string>();
      const fail = (path: string, message: string) => {
        if (reported.has(path)) return;
        reported.add(path);
        ctx.addIssue({ code: z.ZodIssueCode.custom, path: path.split('.'), message });
      };
      if (opts.needsLab && v.labId === '') fail('labId', 'Choose the lab that lists this part.');
      if (v.condition === '') fail('condition', 'Choose the condition the part is in.');
      if (!isCategory(v.category)) {
        fail('category', 'Choose a category.');
        return z.NEVER;
      }
      const specs = toStoredSpecs(v.category, v.specs);
      if (!specs.ok) for (const [key, message] of Object.entries(specs.errors)) fail(`specs.${key}`, message);
      const price = parseMajorUnits(v.price, v.currency);
      if (!price.ok) fail('price', price.message);
      const quantity = v.quantity.trim() === '' ? undefined : (parseTypedNumber(v.quantity) ?? Number.NaN);

      const parsed = ListingInputSchema.safeParse({
        category: v.category,
        title: v.title,
        description: v.description,
        condition: v.condition === '' ? undefined : v.condition,
        quantity,
        priceCents: price.ok ? price.minor : 1,
        currency: v.currency,
        shipsTo: v.shipsTo,
        specs: specs.ok ? specs.specs : {},
      });
      if (!parsed.success) {
        for (const i of parsed.error.issues) {
          // Spec errors were already reported on the typed fields when the specs did not convert.
          if (i.path[0] === 'specs' && !specs.ok) continue;
          fail(formPathOf(i.path) ?? 'root', i.message);
        }
      }
      if (reported.size > 0 || !parsed.success) return z.NEVER;
      return { body: parsed.data, labId: v.labId === '' ? undefined : v.labId };
    });
}

/** A fresh form: the lab preselected when there is one; specs follow the category once chosen. */
export function emptyListingForm(labId: string): ListingFormValues {
  return {
    labId,
    category: '',
    title: '',
    description: '',
    condition: '',
    quantity: '1',
    price: '',
    currency: 'EUR',
    shipsTo: [],
    specs: {},
  };
}

export function listingToForm(l: DeskListing): ListingFormValues {
  return {
    labId: l.labId,
    category: l.category,
    title: l.title,
    description: l.description,
    condition: l.condition,
    quantity: String(l.quantity),
    price: majorUnitsText(l.priceCents, l.currency),
    currency: l.currency,
    shipsTo: [...l.shipsTo],
    specs: toFormValues(l.category, l.specs),
  };
}

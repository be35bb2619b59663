/**
 * Requests of the search API (GET /api/search, POST /api/search/goal) and of saved searches, shared
 * by the endpoints and the search island. The cavity goal is the API's own shape (lengths in mm, one
 * of finesse, linewidth or storage time); the other goals are the fit engine's (schemas/goals.ts).
 */
import { z } from 'zod';
import { CATEGORIES, CONDITIONS, REGIONS } from '../listings/constants';
import { BAND_VALUES, MEASURED_VALUES, PRICE_VALUES } from '../search/facets';
import { CountingGoalSchema, LaserGoalSchema, SqueezingGoalSchema } from './goals';

export const TEXT_SORTS = ['relevance', 'newest', 'price-asc', 'price-desc'] as const;
export type TextSort = (typeof TEXT_SORTS)[number];
/** fit: passes first, then worst-case headroom, then price; price: passes first, then price. */
export const GOAL_SORTS = ['fit', 'price'] as const;
export type GoalSort = (typeof GOAL_SORTS)[number];

export const GOAL_MODES = ['cavity', 'squeezing', 'counting', 'laser'] as const;
export type GoalMode = (typeof GOAL_MODES)[number];
export const CAVITY_CONFIGURATIONS = ['pair', 'with-own-mirror', 'two-listings'] as const;

export const DEFAULT_PAGE_SIZE = 20;
const MAX_PAGE_SIZE = 50;
const MAX_PAGE = 10_000;

export const FiltersSchema = z
  .object({
    category: z.array(z.enum(CATEGORIES)).max(CATEGORIES.length).optional(),
    condition: z.array(z.enum(CONDITIONS)).max(CONDITIONS.length).optional(),
    band: z.array(z.enum(BAND_VALUES)).max(BAND_VALUES.length).optional(),
    price: z.array(z.enum(PRICE_VALUES)).max(PRICE_VALUES.length).optional(),
    region: z.array(z.enum(REGIONS)).max(REGIONS.length).optional(),
    measured: z.array(z.enum(MEASURED_VALUES)).max(MEASURED_VALUES.length).optional(),
  })
  .strict();
export type Filters = z.infer<typeof FiltersSchema>;

const query = z.string().trim().max(200, 'Use at most 200 characters.');

/** A comma-separated list in the query string, each item one of `values`. */
function commaList<T extends [string, ...string[]]>(values: T) {
  return z
    .string()
    .max(400)
    .transform((s) => [
      ...new Set(
        s
          .split(',')
          .map((x) => x.trim())
          .filter(Boolean),
      ),
    ])
    .pipe(z.array(z.enum(values, { errorMap: () => ({ message: `Use ${values.join(', ')}.` }) })));
}

/** GET /api/search: lists as comma-separated values, pages from 1. */
export const TextSearchQuerySchema = z.object({
  q: query.optional(),
  category: commaList([...CATEGORIES]).optional(),
  condition: commaList([...CONDITIONS]).optional(),
  band: commaList(BAND_VALUES).optional(),
  price: commaList(PRICE_VALUES).optional(),
  region: commaList([...REGIONS]).optional(),
  measured: commaList([...MEASURED_VALUES]).optional(),
  sort: z.enum(TEXT_SORTS).optional(),
  page: z.coerce.number().int().min(1).max(MAX_PAGE).default(1),
  pageSize: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(DEFAULT_PAGE_SIZE),
});
export type TextSearchQuery = z.infer<typeof TextSearchQuerySchema>;

const positive = (what: string) =>
  z
    .number({ required_error: `Enter ${what}.`, invalid_type_error: `Enter ${what} as a number.` })
    .finite()
    .positive(`${what[0]!.toUpperCase()}${what.slice(1)} must be above zero.`);
const wavelengthNm = positive('the wavelength').max(20_000, 'Wavelengths above 20 µm are outside what Lightyard covers.');
const ppm = (what: string) =>
  z
    .number({ invalid_type_error: `Enter ${what} as a number.` })
    .finite()
    .min(0, `${what[0]!.toUpperCase()}${what.slice(1)} cannot be negative.`)
    .lt(1e6, `${what[0]!.toUpperCase()}${what.slice(1)} must stay below 1 000 000 ppm.`);

/** The buyer's mirror in with-own-mirror: R (a fraction), or T + loss in ppm; rocMm null for a flat mirror. */
export const OwnMirrorSchema = z
  .object({
    reflectivity: z
      .number()
      .finite()
      .gt(0, 'The reflectivity is a fraction above 0.')
      .lt(1, 'The reflectivity is a fraction below 1.')
      .optional(),
    transmissionPpm: ppm('the transmission').optional(),
    lossPpm: ppm('the loss').optional(),
    rocMm: positive('the radius of curvature').nullable(),
  })
  .strict()
  .superRefine((m, ctx) => {
    if ((m.reflectivity === undefined) === (m.transmissionPpm === undefined)) {
      ctx.addIssue({
        code: 'custom',
        path: ['reflectivity'],
        message: 'Give the reflectivity, or the transmission (with its loss), not both.',
      });
    }
    if (m.reflectivity !== undefined && m.lossPpm !== undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['lossPpm'],
        message: 'The loss goes with the transmission; with a reflectivity leave it out.',
      });
    }
  });

export const CavitySearchGoalSchema = z
  .object({
    wavelengthNm,
    finesse: positive('the finesse').optional(),
    linewidthHz: positive('the linewidth').optional(),
    storageTimeS: positive('the storage time').optional(),
    lengthMm: positive('the cavity length').max(1e7, 'Cavity lengths above 10 km are outside what Lightyard covers.'),
    configuration: z.enum(CAVITY_CONFIGURATIONS, { errorMap: () => ({ message: 'Choose pair, with-own-mirror or two-listings.' }) }),
    ownMirror: OwnMirrorSchema.optional(),
    extraLossPpm: ppm('the extra round-trip loss').optional(),
    atom: z
      .object({ wavelengthNm, gammaHz: positive('the natural linewidth') })
      .strict()
      .optional(),
  })
  .strict()
  .superRefine((g, ctx) => {
    const targets = [g.finesse, g.linewidthHz, g.storageTimeS].filter((t) => t !== undefined).length;
    if (targets !== 1) {
      ctx.addIssue({ code: 'custom', path: ['finesse'], message: 'Give one goal: a finesse, a linewidth or a storage time.' });
    }
    if (g.configuration === 'with-own-mirror' && g.ownMirror === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['ownMirror'],
        message: 'Describe your own mirror: its reflectivity, or transmission and loss, and its radius of curvature.',
      });
    }
  });
export type CavitySearchGoal = z.infer<typeof CavitySearchGoalSchema>;

const goalCommon = {
  q: query.optional(),
  filters: FiltersSchema.optional(),
  sort: z.enum(GOAL_SORTS).optional(),
  page: z.number().int().min(1).max(MAX_PAGE).optional(),
  pageSize: z.number().int().min(1).max(MAX_PAGE_SIZE).optional(),
};

/** POST /api/search/goal. */
export const GoalSearchSchema = z.discriminatedUnion('mode', [
  z.object({ mode: z.literal('cavity'), goal: CavitySearchGoalSchema, ...goalCommon }).strict(),
  z.object({ mode: z.literal('squeezing'), goal: SqueezingGoalSchema, ...goalCommon }).strict(),
  z.object({ mode: z.literal('counting'), goal: CountingGoalSchema, ...goalCommon }).strict(),
  z.object({ mode: z.literal('laser'), goal: LaserGoalSchema, ...goalCommon }).strict(),
]);
export type GoalSearchRequest = z.infer<typeof GoalSearchSchema>;

/** A text search as a saved search keeps it: words and filters, no page. */
export const TextSearchRequestSchema = z
  .object({ mode: z.literal('text'), q: query.optional(), filters: FiltersSchema.optional(), sort: z.enum(TEXT_SORTS).optional() })
  .strict();
export type TextSearchRequest = z.infer<typeof TextSearchRequestSchema>;

export const SavedSearchCreateSchema = z
  .object({
    name: z.string().trim().min(1, 'Name the search.').max(120, 'Use at most 120 characters.'),
    search: z.union([TextSearchRequestSchema, GoalSearchSchema]),
    /** The search page's address for this search, to open it again from the list and the e-mail. */
    url: z
      .string()
      .max(4000)
      .regex(/^\/search(\?|$)/, 'Must be a /search address.'),
  })
  .strict()
  .superRefine((s, ctx) => {
    if (s.search.mode === 'text' && !s.search.q && !Object.values(s.search.filters ?? {}).some((v) => v.length > 0)) {
      ctx.addIssue({
        code: 'custom',
        path: ['search', 'q'],
        message: 'A saved text search needs words or a filter, or it would match every listing.',
      });
    }
  });
export type SavedSearchCreate = z.infer<typeof SavedSearchCreateSchema>;

export const UnsubscribeSchema = z.object({ token: z.string().min(20).max(200) }).strict();

/**
 * The buyer's goals as the API and the goal forms accept them; shapes are the fit engine's goal types.
 */
import { z } from 'zod';
import type { CavityGoal, CountingGoal, LaserGoal, SqueezingGoal } from '../fit';

const positive = (what: string) =>
  z
    .number({ invalid_type_error: `Enter ${what} as a number.` })
    .finite()
    .positive(`${what[0]!.toUpperCase()}${what.slice(1)} must be above zero.`);
const efficiency = (what: string) =>
  z
    .number({ invalid_type_error: `Enter ${what} as a number.` })
    .finite()
    .gt(0, `${what[0]!.toUpperCase()}${what.slice(1)} must be above 0.`)
    .lte(1, `${what[0]!.toUpperCase()}${what.slice(1)} is a fraction of at most 1.`);
const wavelengthNm = positive('the wavelength').max(20_000, 'Wavelengths above 20 µm are outside what Lightyard covers.');

export const CavityGoalSchema = z.object({
  wavelengthNm,
  lengthM: positive('the cavity length').max(10_000),
  target: z.discriminatedUnion('kind', [
    z.object({ kind: z.literal('finesse'), value: positive('the finesse') }),
    z.object({ kind: z.literal('linewidth'), hz: positive('the linewidth') }),
    z.object({ kind: z.literal('storage-time'), s: positive('the storage time') }),
  ]),
  configuration: z.enum(['pair', 'with-own-mirror', 'two-listings']),
  ownMirror: z
    .union([
      z.object({ reflectivity: efficiency('the reflectivity'), rocMm: positive('the radius of curvature').nullable() }),
      z.object({
        transmissionPpm: z.number().finite().min(0),
        lossPpm: z.number().finite().min(0),
        rocMm: positive('the radius of curvature').nullable(),
      }),
    ])
    .optional(),
  extraLossPpm: z.number().finite().min(0).max(1e6).optional(),
  atom: z.object({ wavelengthNm, gammaHz: positive('the natural linewidth') }).optional(),
}) satisfies z.ZodType<CavityGoal>;

export const SqueezingGoalSchema = z.object({
  wavelengthNm,
  targetDb: positive('the squeezing goal').max(30),
  sidebandHz: z.number().finite().min(0),
  source: z.discriminatedUnion('kind', [
    z.object({
      kind: z.literal('initial'),
      initialDb: positive('the initial squeezing').max(40),
      antiSqueezingDb: positive('the anti-squeezing').max(60).optional(),
    }),
    z.object({
      kind: z.literal('opo'),
      pumpParameter: z.number().finite().min(0).lt(1, 'The pump parameter stays below 1 (threshold).'),
      linewidthHz: positive('the OPO linewidth'),
    }),
  ]),
  escapeEfficiency: efficiency('the escape efficiency'),
  propagationEfficiency: efficiency('the propagation efficiency'),
  visibility: efficiency('the fringe visibility'),
  loPowerW: positive('the local-oscillator power').max(1),
  phaseNoiseRad: z.number().finite().min(0).max(1).optional(),
}) satisfies z.ZodType<SqueezingGoal>;

export const CountingGoalSchema = z.object({
  wavelengthNm,
  target: z.discriminatedUnion('kind', [
    z.object({ kind: z.literal('heralding'), efficiency: efficiency('the heralding efficiency') }),
    z.object({ kind: z.literal('bell'), test: z.enum(['chsh', 'eberhard']) }),
  ]),
  opticalEfficiency: efficiency('your optical efficiency'),
  countRateHz: positive('the count rate').optional(),
  coincidenceWindowS: positive('the coincidence window').optional(),
  carMin: positive('the coincidence-to-accidental ratio').optional(),
  maxDeadTimeLoss: efficiency('the dead-time loss').optional(),
}) satisfies z.ZodType<CountingGoal>;

export const LaserGoalSchema = z.object({
  wavelength: z.union([
    z.object({ kind: z.literal('fixed'), nm: wavelengthNm, toleranceNm: z.number().finite().min(0).optional() }),
    z
      .object({ kind: z.literal('range'), minNm: wavelengthNm, maxNm: wavelengthNm })
      .refine((r) => r.minNm < r.maxNm, { message: 'The range starts below where it ends.', path: ['maxNm'] }),
  ]),
  coherence: z
    .discriminatedUnion('kind', [
      z.object({ kind: z.literal('linewidth'), maxHz: positive('the linewidth') }),
      z.object({ kind: z.literal('coherence-length'), minM: positive('the coherence length') }),
    ])
    .optional(),
  minPowerW: positive('the power').optional(),
}) satisfies z.ZodType<LaserGoal>;

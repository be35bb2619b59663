import type { ZodType, ZodTypeDef } from 'zod';
import {
  evaluateCavityGoal,
  evaluateCountingGoal,
  evaluateLaserGoal,
  evaluateSqueezingGoal,
  FitInputError,
  gaussianMode,
  idlerWavelength,
  ktpDatasetInfo,
  qpmPeriod,
  refractiveIndex,
} from '../../../lib/fit';
import {
  FitCavitySchema,
  FitCountingSchema,
  FitCrystalSchema,
  FitLaserSchema,
  FitModesSchema,
  FitSqueezingSchema,
} from '../../../lib/schemas/fit-api';
import { readJson } from '../../../server/http/body';
import { clientAddress } from '../../../server/http/client-address';
import { endpoint } from '../../../server/http/endpoint';
import { HttpError, notFound } from '../../../server/http/errors';
import { rateLimit } from '../../../server/http/rate-limit';

const KOGELNIK = 'H. Kogelnik and T. Li, "Laser Beams and Resonators", Appl. Opt. 5, 1550 (1966)';

interface Route<T> {
  schema: ZodType<T, ZodTypeDef, unknown>;
  run: (input: T) => unknown;
}
const route = <T>(r: Route<T>) => r as Route<unknown>;

/** Each kind validates its body and answers the result with the formula and its source. */
const ROUTES: Record<string, Route<unknown>> = {
  cavity: route({ schema: FitCavitySchema, run: (b) => ({ result: evaluateCavityGoal(b.goal, b.mirrorA, b.mirrorB) }) }),
  modes: route({
    schema: FitModesSchema,
    run: (b) => ({
      result: gaussianMode({ lengthM: b.lengthM, roc1M: b.roc1M ?? Infinity, roc2M: b.roc2M ?? Infinity, wavelengthM: b.wavelengthM }),
      formula: 'g_i = 1 − L/R_i; 0 < g1·g2 < 1; w0² = (λL/π)·√[g1g2(1 − g1g2)/(g1 + g2 − 2g1g2)²]',
      source: KOGELNIK,
    }),
  }),
  squeezing: route({ schema: FitSqueezingSchema, run: (b) => ({ result: evaluateSqueezingGoal(b.goal, b.detector) }) }),
  counting: route({ schema: FitCountingSchema, run: (b) => ({ result: evaluateCountingGoal(b.goal, b.detector) }) }),
  laser: route({ schema: FitLaserSchema, run: (b) => ({ result: evaluateLaserGoal(b.goal, b.laser) }) }),
  crystal: route({
    schema: FitCrystalSchema,
    run: (b) => {
      const idlerM = b.idlerM ?? idlerWavelength(b);
      const axes = b.type === 'type-0' ? (['z', 'z', 'z'] as const) : (['y', 'y', 'z'] as const);
      const t = b.temperatureC === undefined ? {} : { temperatureC: b.temperatureC };
      const n = (axis: 'y' | 'z', wavelengthM: number) => refractiveIndex({ material: 'KTP', axis, dataset: b.dataset, wavelengthM, ...t });
      const info = ktpDatasetInfo(b.dataset);
      return {
        result: {
          periodM: qpmPeriod(b),
          idlerM,
          indices: { pump: n(axes[0], b.pumpM), signal: n(axes[1], b.signalM), idler: n(axes[2], idlerM) },
          dataset: info,
        },
        formula: 'Λ = 1 / |n_p/λ_p − n_s/λ_s − n_i/λ_i|, 1/λ_p = 1/λ_s + 1/λ_i',
        source: `physics.md A9 (forms 9.1–9.4) with the ${b.dataset} Sellmeier set`,
      };
    },
  }),
};

export const POST = endpoint(async (ctx) => {
  await rateLimit(`fit:${clientAddress(ctx)}`, 600, 60_000);
  const kind = ctx.params.kind ?? '';
  // own keys only: "constructor" or "toString" would otherwise find Object.prototype's
  const r = Object.hasOwn(ROUTES, kind) ? ROUTES[kind] : undefined;
  if (!r) throw notFound(`No fit kind "${ctx.params.kind}". Use cavity, modes, squeezing, counting, laser or crystal.`);
  const body = await readJson(ctx.request, r.schema);
  try {
    return r.run(body);
  } catch (e) {
    if (e instanceof FitInputError) throw new HttpError(422, 'unprocessable', e.message, { [e.field]: e.message });
    throw e;
  }
});

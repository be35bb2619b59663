/** Request bodies of POST /api/fit/{kind}: a goal and a candidate's specs, or a geometry to compute. */
import { z } from 'zod';
import { SPEC_SCHEMAS } from '../specs';
import { CavityGoalSchema, CountingGoalSchema, LaserGoalSchema, SqueezingGoalSchema } from './goals';

const MeasuredMirrorSchema = z.object({
  spectrum: z
    .object({
      points: z
        .array(
          z.object({
            wavelengthNm: z.number().finite().positive(),
            transmissionPpm: z.number().finite().min(0),
            lossPpm: z.number().finite().min(0).optional(),
          }),
        )
        .min(2)
        .max(20_000),
    })
    .optional(),
  ringdown: z
    .object({ wavelengthNm: z.number().finite().positive(), lengthM: z.number().finite().positive(), tauS: z.number().finite().positive() })
    .optional(),
});

const MirrorSchema = z.intersection(SPEC_SCHEMAS['cavity-mirror'], MeasuredMirrorSchema);

export const FitCavitySchema = z.object({ goal: CavityGoalSchema, mirrorA: MirrorSchema, mirrorB: MirrorSchema.optional() });

export const FitModesSchema = z.object({
  lengthM: z.number().finite().positive(),
  roc1M: z.number().finite().positive().nullable(),
  roc2M: z.number().finite().positive().nullable(),
  wavelengthM: z.number().finite().positive().max(2e-5),
});

export const FitSqueezingSchema = z.object({
  goal: SqueezingGoalSchema,
  detector: z.union([SPEC_SCHEMAS.photodiode, SPEC_SCHEMAS['balanced-detector']]),
});

export const FitCountingSchema = z.object({ goal: CountingGoalSchema, detector: SPEC_SCHEMAS['single-photon-detector'] });

export const FitLaserSchema = z.object({ goal: LaserGoalSchema, laser: SPEC_SCHEMAS.laser });

export const FitCrystalSchema = z.object({
  pumpM: z.number().finite().positive().max(2e-5),
  signalM: z.number().finite().positive().max(2e-5),
  idlerM: z.number().finite().positive().max(2e-5).optional(),
  type: z.enum(['type-0', 'type-II']),
  dataset: z.enum(['kato2002', 'fradkin-koenig', 'fan1987']),
  temperatureC: z.number().finite().min(-50).max(250).optional(),
});

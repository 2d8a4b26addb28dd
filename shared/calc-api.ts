import { z } from 'zod';

import type { ProfileAnalysisJson } from '@/calc/analysis';

import { engineSchema } from './engine';
import { measure } from './numbers';
import { profileSpecSchema } from './profile';

/** A clearance measured with the old cam, along the valve axis. Inches, crank degrees ATDC overlap. */
const ptvSideSchema = z.strictObject({
  clearance: measure('Baseline clearance', 'in', 0, 2),
  crankAngle: measure('Crank angle of the baseline reading', '° ATDC', -180, 180).optional(),
  valveLift: measure('Old valve lift at the baseline reading', 'in', 0, 1.5).optional(),
});

export const ptvBaselineSchema = z.strictObject({
  intake: ptvSideSchema.optional(),
  exhaust: ptvSideSchema.optional(),
});

/** Hydraulic lifter preload with the original cam, to predict it after a smaller regrind base circle. Inches. */
export const regrindSchema = z.strictObject({
  originalPreload: measure('Original preload', 'in', 0, 0.25),
  stockBaseCircle: measure('Stock base circle', 'in', 0.6, 2),
  pushrodLength: measure('Pushrod length', 'in', 3, 12).optional(),
  plungerTravel: measure('Plunger travel', 'in', 0.01, 0.5).optional(),
});

/** A lobe of the core's stock sheet (the cam before wear). Crank degrees, inches of tappet lift. */
const coreLobeSchema = z
  .strictObject({
    duration050: measure('Duration at 0.050 in', '°', 120, 330),
    advertisedDuration: measure('Advertised duration', '°', 150, 360),
    advertisedHeight: measure('Advertised checking height', 'in', 0.001, 0.049),
    lobeLift: measure('Lobe lift', 'in', 0.15, 0.8),
  })
  .refine((l) => l.advertisedDuration > l.duration050, {
    path: ['advertisedDuration'],
    message: 'Advertised duration must be longer than the duration at 0.050 in',
  });

/** The core a candidate is ground from: its stock lobes, phasing, base circle and damage. */
export const coreSchema = z.strictObject({
  intake: coreLobeSchema,
  exhaust: coreLobeSchema,
  lsa: measure('Core lobe separation angle', '° cam', 90, 130),
  icl: measure('Core intake centreline', '° ATDC', 80, 140),
  baseCircle: measure('Core base circle', 'in', 0.6, 2),
  damageDepth: z
    .strictObject({
      intake: measure('Intake damage depth', 'in', 0, 0.1).optional(),
      exhaust: measure('Exhaust damage depth', 'in', 0, 0.1).optional(),
    })
    .optional(),
});

/** Follower and grinding numbers. Inches. */
export const grindingSchema = z.strictObject({
  rollerDiameter: measure('Roller diameter', 'in', 0.3, 1.5).optional(),
  wheelDiameter: measure('Grinding wheel diameter', 'in', 1, 40).optional(),
  cleanupAllowance: measure('Cleanup allowance', 'in', 0, 0.05).optional(),
  largestCut: measure('Largest cut', 'in', 0, 0.3).optional(),
});

const watchBand = measure('Watch band', 'in or ratio', 0, 5).optional();
const source = z.string().trim().min(1, 'Name the source, or leave it out').max(200, 'Keep the source under 200 characters').optional();
const minimumRule = z.strictObject({ min: measure('Minimum', 'in', -1, 5).optional(), watchBand, source });
const maximumRule = z.strictObject({ max: measure('Maximum', 'in, ratio or °', 0, 30).optional(), watchBand, source });
const rangeRule = z
  .strictObject({
    min: measure('Minimum', 'in', 0, 1).optional(),
    max: measure('Maximum', 'in', 0, 1).optional(),
    watchBand,
    source,
  })
  .refine((r) => r.min === undefined || r.max === undefined || r.max > r.min, {
    path: ['max'],
    message: 'Maximum must be above the minimum',
  });

/** A shop's own check limits: any subset of any rule. */
export const checkLimitsSchema = z.strictObject({
  coilBind: minimumRule.optional(),
  retainerToSeal: minimumRule.optional(),
  ptvIntake: minimumRule.optional(),
  ptvExhaust: minimumRule.optional(),
  hydraulicPreload: rangeRule.optional(),
  dynamicCompression: maximumRule.optional(),
  degreeing: maximumRule.optional(),
  wornLobe: maximumRule.optional(),
  pressureAngle: maximumRule.optional(),
  undercut: minimumRule.optional(),
  finishingStock: minimumRule.optional(),
});

/** Body of `POST /api/calc/analyze`: one engine, one to three profiles on it. */
export const calcAnalyzeSchema = z.strictObject({
  engine: engineSchema,
  profiles: z.array(profileSpecSchema, { error: 'Send a list of 1 to 3 profiles' }).min(1, 'Send at least one profile').max(3, 'Send at most three profiles'),
  ptvBaseline: ptvBaselineSchema.optional(),
  regrind: regrindSchema.optional(),
  core: coreSchema.optional(),
  grinding: grindingSchema.optional(),
  limits: checkLimitsSchema.optional(),
  /** False drops the sampled curves (lift, velocity, acceleration, piston motion, PTV sweep). */
  curves: z.boolean({ error: 'curves is true or false' }).default(true),
});
export type CalcAnalyzeRequest = z.input<typeof calcAnalyzeSchema>;

/** An analysis with its sampled curves (every number array) left out. */
type WithoutCurves<T> = T extends (infer U)[]
  ? WithoutCurves<U>[]
  : T extends object
    ? { [K in keyof T as T[K] extends number[] ? never : K]: WithoutCurves<T[K]> }
    : T;
export type ProfileAnalysisSummaryJson = WithoutCurves<ProfileAnalysisJson>;

/** One analysis per profile, in the order sent; with `curves: false` the sampled arrays are left out. */
export type CalcAnalyzeResponse = { analyses: ProfileAnalysisJson[] | ProfileAnalysisSummaryJson[] };

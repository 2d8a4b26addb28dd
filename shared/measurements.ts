import { z } from 'zod';

import type { CheckResult, CheckLimitOverrides, SkippedCheck } from '@/calc/checks';
import type { DegreeResult } from '@/calc/degree';
import type { LiftTableAnalysis, WornLobeResult } from '@/calc/measured';
import type { PreloadResult } from '@/calc/regrind';
import type { PtvSweep } from '@/calc/ptv';

import { measure, versionSchema } from './numbers';

/** Piston-to-valve clearance measured with the old cam: one or more readings per valve. Inches, crank degrees ATDC overlap. */
const ptvReading = z.strictObject({
  crankAngle: measure('Crank angle', '° ATDC', -90, 90),
  clearance: measure('Clearance', 'in', 0, 1),
  /** Old cam's valve lift at that angle, if measured. */
  valveLift: measure('Valve lift at that angle', 'in', 0, 0.8).default(0),
});
export const ptvBaselineSchema = z.strictObject({
  method: z.enum(['clay', 'checking-springs'], { error: 'Method is clay or checking springs' }),
  intake: z.array(ptvReading).min(1, 'Add at least one intake reading').max(40),
  exhaust: z.array(ptvReading).min(1, 'Add at least one exhaust reading').max(40),
});

/** Valve springs as measured: per valve, per head, or one set for all. */
const springReading = z.strictObject({
  where: z.string().trim().min(1, 'Say which valve or head, e.g. "3E" or "left head"').max(40),
  installedHeight: measure('Installed height', 'in', 0.9, 2.6),
  seatLoad: measure('Seat load', 'lbf', 10, 600),
  rate: measure('Spring rate', 'lbf/in', 50, 2000),
  coilBindHeight: measure('Coil-bind height', 'in', 0.5, 2.2),
  retainerToSeal: measure('Retainer-to-seal at seat', 'in', 0.1, 1.5),
});
export const springsSchema = z.strictObject({ springs: z.array(springReading).min(1, 'Add at least one spring').max(32) });

/** Pushrod and preload: checking pushrod at zero lash, lifter plunger travel, target preload. Inches. */
export const pushrodSchema = z.strictObject({
  checkingLength: measure('Checking pushrod length at zero lash', 'in', 4, 12),
  currentLength: measure('Pushrod length in the engine', 'in', 4, 12).nullable().default(null),
  plungerTravel: measure('Lifter plunger travel', 'in', 0.02, 0.25),
  targetPreload: measure('Target preload', 'in', 0.005, 0.2),
  /** Preload with the old cam, if measured. */
  originalPreload: measure('Preload with the old cam', 'in', 0, 0.2).nullable().default(null),
  stockBaseCircle: measure('Stock base circle', 'in', 0.6, 2),
});

/** Degree-wheel readings at cam install. Crank degrees. */
export const degreeSchema = z.strictObject({
  /** Piston-stop readings either side of TDC; true TDC is halfway between. */
  stopBefore: measure('Piston stop before TDC', '° BTDC', 5, 60),
  stopAfter: measure('Piston stop after TDC', '° ATDC', 5, 60),
  checkingLift: measure('Dial reading used on both flanks', 'in', 0.01, 0.2),
  openingAngle: measure('Opening-flank angle', '° ATDC', -60, 180),
  closingAngle: measure('Closing-flank angle', '° ATDC', 0, 300),
  /** Optional full table, lift in inches against crank degrees ATDC. */
  table: z
    .array(z.strictObject({ angle: measure('Angle', '°', -360, 720), lift: measure('Lift', 'in', 0, 1) }))
    .max(1440)
    .default([]),
});

/** Measured lobes from an uploaded table. */
export const lobesSchema = z.strictObject({
  basis: z.enum(['crank', 'cam']),
  fileName: z.string().max(200),
  lobes: z
    .array(
      z.strictObject({
        id: z.string().regex(/^\d{1,2}[IE]$/, 'Lobe names are cylinder number and I or E, e.g. 3E'),
        points: z.array(z.strictObject({ angle: z.number(), lift: z.number() })).min(5).max(1440),
      }),
    )
    .min(1)
    .max(32),
});

export const measurementKinds = ['ptv-baseline', 'springs', 'pushrod', 'degree', 'lobes'] as const;
export type MeasurementKind = (typeof measurementKinds)[number];

export const measurementDataSchemas = {
  'ptv-baseline': ptvBaselineSchema,
  springs: springsSchema,
  pushrod: pushrodSchema,
  degree: degreeSchema,
  lobes: lobesSchema,
} as const;

export type MeasurementData = { [K in MeasurementKind]: z.output<(typeof measurementDataSchemas)[K]> };

/** Create: the kind picks the schema for `data`. Lobes come from the CSV upload route instead. */
export const measurementCreateSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('ptv-baseline'), note: z.string().trim().max(2000).default(''), data: ptvBaselineSchema }),
  z.strictObject({ kind: z.literal('springs'), note: z.string().trim().max(2000).default(''), data: springsSchema }),
  z.strictObject({ kind: z.literal('pushrod'), note: z.string().trim().max(2000).default(''), data: pushrodSchema }),
  z.strictObject({ kind: z.literal('degree'), note: z.string().trim().max(2000).default(''), data: degreeSchema }),
]);
export type MeasurementCreate = z.input<typeof measurementCreateSchema>;

/** Replace a measurement's data and note (same kind), guarded by version. */
export const measurementPatchSchema = z.strictObject({
  version: versionSchema,
  note: z.string().trim().max(2000).optional(),
  data: z.unknown(),
});

export type Measurement<K extends MeasurementKind = MeasurementKind> = {
  id: string;
  jobId: string;
  kind: K;
  data: MeasurementData[K];
  note: string;
  version: number;
  createdBy: string | null;
  createdAt: string;
  updatedAt: string;
};

/** Photos of failed parts. */
export const photoMimeTypes = ['image/jpeg', 'image/png', 'image/webp'] as const;
export const photoLimits = { maxBytes: 10 * 1024 * 1024, maxFiles: 6 } as const;
export type Photo = {
  id: string;
  jobId: string;
  caption: string;
  mimeType: (typeof photoMimeTypes)[number];
  size: number;
  /** Shown to the owner on the share page (a later feature). */
  shareable: boolean;
  url: string;
  createdAt: string;
};
export const photoPatchSchema = z.strictObject({
  caption: z.string().trim().max(200, 'Keep the caption under 200 characters').optional(),
  shareable: z.boolean().optional(),
});

/** The job checklist. */
export const checklistAddSchema = z.strictObject({ label: z.string().trim().min(1, 'Write the item').max(200, 'Keep it under 200 characters') });
export const checklistPatchSchema = z.strictObject({ done: z.boolean({ error: 'Say whether it is done' }) });
export type ChecklistItem = {
  id: string;
  jobId: string;
  label: string;
  position: number;
  doneAt: string | null;
  doneBy: { id: string; name: string } | null;
};

/** The shop's own check limits (overrides of calc's defaults). */
export type ShopLimits = { limits: CheckLimitOverrides; version: number };

/** One run of the fit checks against a sheet revision, saved with that revision. */
export type FitCheckRun = {
  id: string;
  sheetId: string;
  revisionId: string;
  revisionNumber: number;
  createdAt: string;
  createdBy: string | null;
  results: {
    status: 'pass' | 'watch' | 'fail';
    checks: CheckResult[];
    skipped: SkippedCheck[];
    ptv: { intake: PtvSweep | null; exhaust: PtvSweep | null };
    springs: { where: string; openLoad: number; coilBindMargin: number; retainerToSealMargin: number }[];
    preload: PreloadResult | null;
    degree: (DegreeResult & { trueTdcOffset: number }) | null;
    lobes: { analyses: { id: string; table: LiftTableAnalysis }[]; worn: WornLobeResult | null } | null;
  };
};

import { z } from 'zod';

import type { CheckLimits, CheckResult, CheckLimitOverrides, CheckSummary, SkippedCheck } from '@/calc/checks';
import type { DegreeResult } from '@/calc/degree';
import type { LiftTableAnalysis, WornLobeResult } from '@/calc/measured';
import type { PreloadResult, PushrodAdvice } from '@/calc/regrind';
import type { PtvSweep } from '@/calc/ptv';

import { measure, versionSchema } from './numbers';

/** Piston-to-valve clearance measured with the old cam: one or more readings per valve. Inches, crank degrees ATDC overlap. */
const ptvReading = z.strictObject({
  crankAngle: measure('Crank angle', '° ATDC', -90, 90),
  clearance: measure('Clearance', 'in', 0, 1),
  /** Old cam's valve lift at that angle; null = not measured (the PTV check then does not run), never zero. */
  valveLift: measure('Valve lift at that angle', 'in', 0, 0.8).nullable().default(null),
});
export const ptvBaselineSchema = z.strictObject({
  method: z.enum(['clay', 'checking-springs'], { error: 'Method is clay or checking springs' }),
  intake: z.array(ptvReading).min(1, 'Add at least one intake reading').max(40),
  exhaust: z.array(ptvReading).min(1, 'Add at least one exhaust reading').max(40),
});

/** Valve springs as measured: per valve, per head, or one set for all. */
const springReading = z
  .strictObject({
    /** Which valve or head; a name ending in I or E (e.g. "3E") is checked at that valve's lift, anything else at the larger of the two. */
    where: z.string().trim().min(1, 'Say which valve or head, e.g. "3E" or "left head"').max(40),
    installedHeight: measure('Installed height', 'in', 0.9, 2.6),
    seatLoad: measure('Seat load', 'lbf', 10, 600),
    rate: measure('Spring rate', 'lbf/in', 50, 2000),
    coilBindHeight: measure('Coil-bind height', 'in', 0.5, 2.2),
    retainerToSeal: measure('Retainer-to-seal at seat', 'in', 0.1, 1.5),
  })
  .refine((s) => s.coilBindHeight < s.installedHeight, {
    path: ['coilBindHeight'],
    message: 'Coil-bind height must be below the installed height',
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
  /** Which cam the checking pushrod was read on; null = not said, so no pushrod advice is given. */
  checkedOn: z.enum(['old-cam', 'reground-cam'], { error: 'Say which cam the checking pushrod was read on' }).nullable().default(null),
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

/** Lobe-table CSV upload (`POST /api/jobs/:jobId/measurements/lobes`, multipart field `file`); lift in inches. */
export const lobeCsvLimits = { maxBytes: 1024 * 1024, minRows: 5, maxLift: 1.5, minAngle: -360, maxAngle: 720 } as const;

/** One lobe's readings: crank degrees, strictly increasing; tappet lift in inches. */
const lobeReadings = z
  .array(
    z.strictObject({
      angle: measure('Angle', '° crank', lobeCsvLimits.minAngle, lobeCsvLimits.maxAngle),
      lift: measure('Lift', 'in', 0, lobeCsvLimits.maxLift),
    }),
  )
  .min(lobeCsvLimits.minRows)
  .max(1440)
  .superRefine((points, ctx) => {
    const back = points.findIndex((p, i) => i > 0 && !(p.angle > points[i - 1]!.angle));
    if (back > 0) {
      ctx.addIssue({
        code: 'custom',
        path: [back, 'angle'],
        message: `Angles must increase: ${points[back]!.angle} does not come after ${points[back - 1]!.angle}`,
      });
    }
  });

/** Measured lobes from an uploaded table: every lobe named once and read at the same angles, as the CSV upload stores them. */
export const lobesSchema = z.strictObject({
  basis: z.enum(['crank', 'cam']),
  fileName: z.string().max(200),
  lobes: z
    .array(
      z.strictObject({
        id: z.string().regex(/^([1-9]|1[0-6])[IE]$/, 'Lobe names are cylinder number (1 to 16) and I or E, e.g. 3E'),
        points: lobeReadings,
      }),
    )
    .min(1)
    .max(32)
    .superRefine((lobes, ctx) => {
      const [first] = lobes;
      lobes.forEach((lobe, i) => {
        if (lobes.findIndex((l) => l.id === lobe.id) < i) ctx.addIssue({ code: 'custom', path: [i, 'id'], message: `${lobe.id} is named twice` });
        const sameAngles = lobe.points.length === first?.points.length && lobe.points.every((p, j) => p.angle === first.points[j]?.angle);
        if (!sameAngles) ctx.addIssue({ code: 'custom', path: [i, 'points'], message: `Read every lobe at the same angles as ${first?.id}` });
      });
    }),
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

/** Replace a measurement's data and/or note (same kind), guarded by version. `data` is checked with the schema of the stored kind. */
export const measurementPatchSchema = z.strictObject({
  version: versionSchema,
  note: z.string().trim().max(2000).optional(),
  data: z.unknown().optional(),
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
  /** The file name as uploaded (the stored file has a generated name). */
  originalName: string;
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
/** Items every regrind job starts with (written on the first read of a job's checklist). */
export const defaultChecklistLabels = [
  'New lifters go in with the new cam; the old ones are not reused',
  'Torque-to-yield head bolts replaced with new ones, not reused',
  'New head gaskets, intake gaskets and valve stem seals',
  'Timing set inspected, or replaced if worn',
  'Pushrods and rockers kept in order for reassembly',
  'Cam degreed in and the installed ICL recorded',
  'Piston-to-valve clearance checked with checking springs or clay',
  'Spring installed height and coil bind checked',
  'Break-in done as the cam and lifter maker says, with the oil additive they call for',
] as const;

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
/** `GET /api/shop/limits`: the overrides, plus every rule as it applies (with its source) and calc's defaults. */
export type ShopLimitsResponse = ShopLimits & { resolved: CheckLimits; defaults: CheckLimits };

const limitNumber = (label: string) => z.number({ error: `${label} must be a number` }).refine(Number.isFinite, `${label} must be a finite number`);
const watchBand = limitNumber('Watch band').refine((v) => v >= 0, 'Watch band cannot be negative');
const source = z.string().trim().min(1, 'Name the source or leave it out').max(200, 'Keep the source under 200 characters');
const minimumOverride = z.strictObject({ min: limitNumber('Minimum').optional(), watchBand: watchBand.optional(), source: source.optional() });
const maximumOverride = z.strictObject({ max: limitNumber('Maximum').optional(), watchBand: watchBand.optional(), source: source.optional() });
const rangeOverride = z
  .strictObject({
    min: limitNumber('Minimum').optional(),
    max: limitNumber('Maximum').optional(),
    watchBand: watchBand.optional(),
    source: source.optional(),
  })
  .refine((r) => r.min === undefined || r.max === undefined || r.max > r.min, {
    path: ['max'],
    message: 'Maximum must be above the minimum',
  });

/** A grinding number the shop sets (inches), within what a cam grinder could use. */
const settingOverride = (label: string, max: number) =>
  z.strictObject({
    value: limitNumber(label)
      .refine((v) => v >= 0, `${label} cannot be negative`)
      .refine((v) => v <= max, `${label} is at most ${max} in`)
      .optional(),
    source: source.optional(),
  });

/** `PUT /api/shop/limits`. Rule names are calc's; unknown names or fields are refused. Version 0 creates the shop's first settings. */
export const shopLimitsSaveSchema = z.strictObject({
  version: versionSchema,
  limits: z.strictObject({
    coilBind: minimumOverride.optional(),
    retainerToSeal: minimumOverride.optional(),
    ptvIntake: minimumOverride.optional(),
    ptvExhaust: minimumOverride.optional(),
    hydraulicPreload: rangeOverride.optional(),
    dynamicCompression: maximumOverride.optional(),
    degreeing: maximumOverride.optional(),
    wornLobe: maximumOverride.optional(),
    pressureAngle: maximumOverride.optional(),
    finishingStock: minimumOverride.optional(),
    cleanupAllowance: settingOverride('Cleanup allowance', 0.05).optional(),
    largestCut: settingOverride('Largest cut', 0.3).optional(),
    rollerDiameter: settingOverride('Roller diameter', 1.5).optional(),
    wheelRadius: settingOverride('Grinding wheel radius', 20).optional(),
  }),
});
export type ShopLimitsSave = z.input<typeof shopLimitsSaveSchema>;

/**
 * A predicted PTV sweep as stored (JSON: `clearance` is a plain array), with
 * the baseline reading that governed it: every reading is swept and the one
 * predicting the smallest clearance is kept.
 */
export type FitCheckPtv = Omit<PtvSweep, 'clearance'> & {
  clearance: number[];
  /** Only readings with the old cam's valve lift measured are swept. */
  baseline: { crankAngle: number; clearance: number; valveLift: number };
};

/** One run of the fit checks against a sheet revision, saved with that revision. */
export type FitCheckRun = {
  id: string;
  sheetId: string;
  revisionId: string;
  revisionNumber: number;
  createdAt: string;
  createdBy: string | null;
  /** Who ran it, by name (null when the account is gone). */
  createdByName: string | null;
  /** The run's one summary (summarizeChecks): Pass only when every check ran and passed, else "5 of 8 checks run". */
  summary: CheckSummary;
  results: {
    /** The worst verdict among the checks that ran; the summary says whether every check ran. */
    status: 'pass' | 'watch' | 'fail';
    checks: CheckResult[];
    skipped: SkippedCheck[];
    ptv: { intake: FitCheckPtv | null; exhaust: FitCheckPtv | null };
    springs: {
      where: string;
      /** Valve lift the spring was checked at, inches (intake, exhaust, or the larger when `where` names neither). */
      valveLift: number;
      openLoad: number;
      openHeight: number;
      coilBindMargin: number;
      retainerToSealMargin: number;
    }[];
    preload: PreloadResult | null;
    /** The pushrod length for the target preload, or what it lacks (runs stored before it was worked out have neither). */
    pushrod?: { advice: PushrodAdvice | null; missing: string | null };
    degree: (DegreeResult & { trueTdcOffset: number }) | null;
    lobes: { analyses: { id: string; table: LiftTableAnalysis }[]; worn: WornLobeResult | null } | null;
  };
};

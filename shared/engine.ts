import { z } from 'zod';

import { measure, versionSchema } from './numbers';

export const lifterTypes = ['hydraulic-roller', 'solid-roller', 'hydraulic-flat', 'solid-flat'] as const;
export type LifterTypeName = (typeof lifterTypes)[number];
export const lifterTypeLabels: Record<LifterTypeName, string> = {
  'hydraulic-roller': 'Hydraulic roller',
  'solid-roller': 'Solid roller',
  'hydraulic-flat': 'Hydraulic flat tappet',
  'solid-flat': 'Solid flat tappet',
};
export const isHydraulic = (t: LifterTypeName) => t === 'hydraulic-roller' || t === 'hydraulic-flat';

/** Valve spring as installed. Inches, lbf, lbf/in. */
export const springSchema = z
  .strictObject({
    seatLoad: measure('Seat load', 'lbf', 10, 600),
    rate: measure('Spring rate', 'lbf/in', 50, 2000),
    installedHeight: measure('Installed height', 'in', 0.9, 2.6),
    coilBindHeight: measure('Coil-bind height', 'in', 0.5, 2.2),
    retainerToSeal: measure('Retainer-to-seal clearance', 'in', 0.1, 1.5),
  })
  .refine((s) => s.coilBindHeight < s.installedHeight, {
    path: ['coilBindHeight'],
    message: 'Coil-bind height must be below the installed height',
  });

/** An engine's geometry, as calc takes it. Inches, cc, degrees. */
export const engineSchema = z
  .strictObject({
    cylinders: z
      .number({ error: 'Cylinders must be a whole number' })
      .int('Cylinders is a whole number')
      .min(1, 'At least 1 cylinder')
      .max(16, 'At most 16 cylinders'),
    bore: measure('Bore', 'in', 2, 6),
    stroke: measure('Stroke', 'in', 1.5, 6),
    rodLength: measure('Rod length', 'in', 3, 10),
    chamberCc: measure('Chamber volume', 'cc', 20, 200),
    gasketBore: measure('Gasket bore', 'in', 2, 6.5),
    gasketThickness: measure('Gasket thickness', 'in', 0.01, 0.2),
    deckClearance: measure('Deck clearance', 'in', -0.1, 0.1),
    pistonCc: measure('Piston dome/dish', 'cc', -80, 80),
    valveAngle: measure('Valve angle', '°', 0, 30),
    rockerRatioIntake: measure('Intake rocker ratio', ':1', 1, 2.2),
    rockerRatioExhaust: measure('Exhaust rocker ratio', ':1', 1, 2.2),
    lifterType: z.enum(lifterTypes, { error: `Lifter type is one of: ${lifterTypes.join(', ')}` }),
    firingOrder: z
      .string()
      .trim()
      .regex(/^$|^\d{1,2}(-\d{1,2})+$/, 'Write the firing order as numbers joined by dashes, e.g. 1-8-4-3-6-5-7-2')
      .max(60)
      .default(''),
    spring: springSchema,
  })
  .refine((e) => e.rodLength > e.stroke / 2, { path: ['rodLength'], message: 'Rod length must exceed half the stroke' })
  .refine((e) => e.gasketBore >= e.bore, { path: ['gasketBore'], message: 'Gasket bore must be at least the cylinder bore' });
export type EngineSpec = z.output<typeof engineSchema>;

export const engineSaveSchema = z.strictObject({ version: versionSchema, engine: engineSchema });
export type EngineSave = z.input<typeof engineSaveSchema>;

export type EngineRecord = { jobId: string; engine: EngineSpec; version: number; updatedAt: string };

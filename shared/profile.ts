import { z } from 'zod';

import { measure, versionSchema } from './numbers';

/** One lobe as the grinder states it. Crank degrees at a tappet checking height; inches. */
export const lobeSchema = z
  .strictObject({
    duration050: measure('Duration at 0.050 in', '°', 120, 330),
    advertisedDuration: measure('Advertised duration', '°', 150, 360),
    advertisedHeight: measure('Advertised checking height', 'in', 0.001, 0.049),
    lobeLift: measure('Lobe lift', 'in', 0.15, 0.8),
    lash: measure('Lash', 'in', 0, 0.04),
  })
  .refine((l) => l.advertisedDuration > l.duration050, {
    path: ['advertisedDuration'],
    message: 'Advertised duration must be longer than the duration at 0.050 in',
  });
export type LobeSpecValues = z.output<typeof lobeSchema>;

export const profileLabelSchema = z.string({ error: 'Name the profile' }).trim().min(1, 'Name the profile').max(80, 'Keep the name under 80 characters');

/** A cam profile: both lobes, lobe separation (cam degrees), installed ICL (crank degrees ATDC), base circle. */
export const profileSpecSchema = z.strictObject({
  intake: lobeSchema,
  exhaust: lobeSchema,
  lsa: measure('Lobe separation angle', '° cam', 100, 125),
  icl: measure('Intake centreline', '° ATDC', 90, 135),
  baseCircle: measure('Base circle', 'in', 0.6, 2).nullable().default(null),
});
export type ProfileSpec = z.output<typeof profileSpecSchema>;

export const profileCreateSchema = z.strictObject({
  label: profileLabelSchema,
  coreNotes: z.string().trim().max(2000, 'Keep core notes under 2000 characters').default(''),
  spec: profileSpecSchema,
});
export type ProfileCreate = z.input<typeof profileCreateSchema>;

export const profilePatchSchema = z.strictObject({
  version: versionSchema,
  label: profileLabelSchema.optional(),
  coreNotes: z.string().trim().max(2000, 'Keep core notes under 2000 characters').optional(),
  spec: profileSpecSchema.optional(),
});
export type ProfilePatch = z.input<typeof profilePatchSchema>;

/** Copy a library profile into a job. */
export const profileCopySchema = z.strictObject({ fromProfileId: z.string({ error: 'Choose a profile to copy' }).min(1, 'Choose a profile to copy') });

export type Profile = {
  id: string;
  shopId: string;
  /** Null for the shop's library; set when the profile belongs to a job. */
  jobId: string | null;
  /** The library profile this was copied from, if any. */
  sourceProfileId: string | null;
  label: string;
  coreNotes: string;
  spec: ProfileSpec;
  version: number;
  createdAt: string;
  updatedAt: string;
};

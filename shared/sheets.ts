import { z } from 'zod';

import type { CleanupResult, LifterCutResult } from '@/calc/regrind';
import type { LobeGeometry } from '@/calc/analysis';
import type { CheckLimits, CheckResult, CheckStatus, SkippedCheck } from '@/calc/checks';
import type { ValveEvents } from '@/calc/events';

import type { EngineSpec } from './engine';
import { profileLabelSchema, profileSpecSchema, type ProfileSpec } from './profile';
import { versionSchema } from './numbers';

export const revisionStates = ['draft', 'issued'] as const;
export type RevisionState = (typeof revisionStates)[number];

/**
 * Start the spec sheet of one of the job's profiles (one sheet per profile); revision 1 is a draft with the
 * profile's values, or with `spec` when given (values tried on the compare screen).
 */
export const sheetCreateSchema = z.strictObject({
  title: z.string({ error: 'Name the sheet' }).trim().min(1, 'Name the sheet').max(120, 'Keep the title under 120 characters'),
  profileId: z.string({ error: 'Choose the profile to grind' }).min(1, 'Choose the profile to grind'),
  note: z.string().trim().max(4000).default(''),
  spec: profileSpecSchema.optional(),
});
export type SheetCreate = z.input<typeof sheetCreateSchema>;

/**
 * Save the sheet's profile values and note. Edits the current draft revision;
 * when the latest revision is issued, starts a new draft revision instead.
 */
export const sheetSaveSchema = z.strictObject({
  version: versionSchema,
  label: profileLabelSchema.optional(),
  spec: profileSpecSchema.optional(),
  note: z.string().trim().max(4000, 'Keep the note under 4000 characters').optional(),
  /** Re-take the engine snapshot from the job's current engine. */
  refreshEngine: z.boolean().optional(),
  /** Keep the current revision as history and save these values as the next revision. */
  newRevision: z.boolean().optional(),
});
export type SheetSave = z.input<typeof sheetSaveSchema>;

/** One lobe's geometry as stored (the margin as a plain array). */
export type LobeGeometryResults = Omit<LobeGeometry, 'envelope'> & {
  envelope: (Omit<NonNullable<LobeGeometry['envelope']>, 'margin'> & { margin: number[] }) | null;
};

/**
 * Can the core become this cam: calc's feasibility (cut, envelope per lobe, pressure angle,
 * curvature, cleanup, the lifter side; inches and cam degrees), the checks and NOT RUN notes
 * that belong to it, the rules they were judged by, and where the core came from.
 */
export type FeasibilityResults = {
  cut: number | null;
  baseCircle: number | null;
  intake: LobeGeometryResults;
  exhaust: LobeGeometryResults;
  cleanup: CleanupResult | null;
  lifter: LifterCutResult | null;
  criterion: string;
  limits: Pick<CheckLimits, 'finishingStock' | 'pressureAngle' | 'undercut'>;
  checks: CheckResult[];
  skipped: SkippedCheck[];
  /** Where the core's lobes came from, in words, or null when the job has no core yet. */
  coreFrom: string | null;
  /** What the job lacks for the core, in words. */
  coreMissing: string[];
};

/** The numbers a revision was saved with, so the sheet never depends on re-running calc. */
export type RevisionResults = {
  /** Worst check status. */
  status: CheckStatus;
  /** Events at 0.050 in tappet lift, crank degrees. */
  events050: ValveEvents;
  /** Events at the advertised checking heights, crank degrees. */
  eventsAdvertised: ValveEvents;
  /** Net valve lift, inches. */
  valveLift: { intake: number; exhaust: number };
  staticCompression: number;
  dynamicCompression: number;
  /** Cylinder volume, cubic inches, whole engine. */
  displacementCubicInches: number;
  checks: CheckResult[];
  skipped: SkippedCheck[];
  /** Fits the core? Worked out when the revision was saved from the job's core and the shop's settings (absent on older revisions). */
  feasibility?: FeasibilityResults;
};

export type Revision = {
  id: string;
  sheetId: string;
  number: number;
  state: RevisionState;
  label: string;
  spec: ProfileSpec;
  engine: EngineSpec;
  results: RevisionResults;
  note: string;
  /** The profile's core notes when this revision was written; they go to the grinder with it. */
  coreNotes: string;
  createdBy: string | null;
  createdAt: string;
  updatedAt: string;
  issuedAt: string | null;
  /** The later revision of this sheet that was issued after this one, when it was issued; null while this one is live. */
  supersededBy: Supersession | null;
};

/** A revision is superseded once a later revision of its sheet is issued. */
export type Supersession = { number: number; at: string };

export type Sheet = {
  id: string;
  shopId: string;
  jobId: string;
  /** The job profile (the option) this sheet grinds; null for a sheet that no profile of the job owns. */
  profileId: string | null;
  title: string;
  version: number;
  createdAt: string;
  updatedAt: string;
  /** The latest revision (draft or issued). */
  current: Revision;
};

/**
 * A revision in a sheet's history: all but its saved results. The latest one's results come as the sheet's
 * `current`; an earlier one's from `GET /api/sheets/:id/revisions/:number`, so a long history stays light.
 */
export type RevisionSummary = Omit<Revision, 'results'>;

export type SheetWithHistory = Sheet & {
  /** Every revision, oldest first, without results (the latest in full is `current`). */
  revisions: RevisionSummary[];
  /** The revision issuing sends to a grinder: the owner's approved one once there is an approval, else the latest draft; null when none can go. */
  /** `replacesApproved`: the owner's approved revision this one supersedes; issuing it withdraws that approval. */
  toIssue: { number: number; approved: boolean; replacesApproved: number | null } | null;
  /** Why no revision can be issued (toIssue is null), in words for the builder. */
  issueBlocked: string | null;
};

/** The path of one revision: `/api/sheets/:id/revisions/:number`, the number as the sheet shows it (1, 2, …). */
export const revisionPathSchema = z.object({ number: z.coerce.number().int().min(1).max(1_000_000) });

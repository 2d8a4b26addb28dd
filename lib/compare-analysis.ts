import type { ProfileAnalysis } from '@/calc/analysis';
import { compareProfilesForOwner, type OwnerComparison } from '@/calc/compare';
import { isCalcInputError } from '@/calc/errors';
import type { CheckLimitOverrides } from '@/calc/checks';
import type { ShownUnits } from '@/lib/number-draft';
import { applyTryValues, type TryDraft } from '@/lib/try-values';
import { analyzeForJob, analyzeRecords, feasibilityResults } from '@/shared/analysis';
import type { EngineSpec } from '@/shared/engine';
import type { JobCore } from '@/shared/job-core';
import type { Profile, ProfileSpec } from '@/shared/profile';
import type { FeasibilityResults } from '@/shared/sheets';

/** One profile on the compare screen: the spec with any typed values applied, and its analysis or why there is none. */
export type CompareColumn = {
  profile: Profile;
  spec: ProfileSpec;
  analysis: ProfileAnalysis | null;
  error: string | null;
  fieldErrors: Partial<Record<string, string>>;
  /** Fits the core? From the same analysis (null without the job's core, or with no analysis). */
  feasibility?: FeasibilityResults | null;
};

/** The job's core and the shop's limits the compare screen analyses with, as the server does for sheets. */
export type CompareCore = { job: JobCore; limits: CheckLimitOverrides };

/**
 * Runs calc's analysis on a profile with its tried-but-unsaved values (in calc units); a bad value keeps the
 * saved spec and names the field, in the units shown.
 */
export function analyzeColumn(engine: EngineSpec, profile: Profile, draft: TryDraft | undefined, units: ShownUnits, core?: CompareCore): CompareColumn {
  const applied = draft ? applyTryValues(profile.spec, draft, units) : ({ ok: true, spec: profile.spec } as const);
  const spec = applied.ok ? applied.spec : profile.spec;
  const fieldErrors = applied.ok ? {} : applied.errors;
  try {
    if (core) {
      // The same path the server takes for a sheet: one calc analysis with the job's core.
      const worked = analyzeForJob(engine, spec, core.job, core.limits);
      const feasibility = worked.job ? feasibilityResults(worked.analysis, worked.job) : null;
      return { profile, spec, analysis: worked.analysis, error: null, fieldErrors, feasibility };
    }
    return { profile, spec, analysis: analyzeRecords(engine, spec), error: null, fieldErrors };
  } catch (error) {
    const message = isCalcInputError(error) ? `${error.field}: ${error.message}` : error instanceof Error ? error.message : String(error);
    return { profile, spec, analysis: null, error: message, fieldErrors };
  }
}

export type AnalyzedColumn = CompareColumn & { analysis: ProfileAnalysis };

/** What the screen shows from the columns that could be worked out: plots, the owner's comparison of the first two, and whether to warn. */
export function summarizeColumns(columns: readonly CompareColumn[]): {
  shown: AnalyzedColumn[];
  analyses: ProfileAnalysis[];
  names: string[];
  nearLimit: boolean;
  owner: OwnerComparison | null;
} {
  const shown = columns.filter((c): c is AnalyzedColumn => c.analysis !== null);
  const analyses = shown.map((c) => c.analysis);
  const names = shown.map((c) => c.profile.label);
  const nearLimit = analyses.some((a) => a.status !== 'pass');
  const owner =
    analyses.length >= 2 && analyses[0] && analyses[1]
      ? compareProfilesForOwner({ current: analyses[0], candidate: analyses[1], currentName: names[0], candidateName: names[1] })
      : null;
  return { shown, analyses, names, nearLimit, owner };
}

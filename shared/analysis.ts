import { analyzeProfile, type AnalysisInput, type AnalysisWorkspace, type LobeGeometry, type ProfileAnalysis } from '@/calc/analysis';
import type { CheckLimitOverrides } from '@/calc/checks';
import { isCalcInputError } from '@/calc/errors';

import type { EngineSpec } from './engine';
import type { ProfileSpec } from './profile';
import type { JobCore } from './job-core';
import type { FeasibilityResults, RevisionResults } from './sheets';

/** Extra measurements an analysis can use when the job has them. */
export type AnalysisExtras = Pick<AnalysisInput, 'ptvBaseline' | 'regrind' | 'core' | 'grinding'> & { limits?: CheckLimitOverrides };

/** Maps stored records onto calc's input (calc has no nulls and no firing order). */
export function toAnalysisInput(engine: EngineSpec, spec: ProfileSpec, extras: AnalysisExtras = {}): AnalysisInput {
  const { firingOrder: _firingOrder, ...geometry } = engine;
  const { baseCircle, ...profile } = spec;
  return {
    engine: geometry,
    profile: baseCircle === null ? profile : { ...profile, baseCircle },
    ...extras,
  };
}

export function analyzeRecords(engine: EngineSpec, spec: ProfileSpec, extras?: AnalysisExtras, workspace?: AnalysisWorkspace): ProfileAnalysis {
  return analyzeProfile(toAnalysisInput(engine, spec, extras), { workspace });
}

/** The core and grinding part of an analysis's input, from the job (shared/job-core.ts). */
export function coreExtras(job: JobCore): AnalysisExtras {
  return { ...(job.core ? { core: job.core } : {}), grinding: job.grinding, ...(job.regrind ? { regrind: job.regrind } : {}) };
}

/** Fields of calc's input that come from the job's core, not from the sheet. */
const fromCore = (field: string) => /^(core|grinding|regrind)(\.|$)/.test(field) || field === 'profile.baseCircle';

/**
 * The analysis of a sheet's values on the job: with the job's core, grinding settings and
 * preload readings when calc can use them. When calc refuses the core's part (a base
 * circle larger than the core's, a measured lobe it cannot describe), the sheet is still
 * worked out without it and the refusal is named in `job.missing`, so "fits the core?"
 * says NOT RUN and why.
 */
export function analyzeForJob(
  engine: EngineSpec,
  spec: ProfileSpec,
  job: JobCore,
  limits?: CheckLimitOverrides,
  workspace?: AnalysisWorkspace,
): { analysis: ProfileAnalysis; job: Pick<JobCore, 'from' | 'missing'> | null } {
  // No core on the job: the sheet alone, exactly as before the core was known.
  if (job.core === null) return { analysis: analyzeRecords(engine, spec, { limits }, workspace), job: null };
  try {
    return { analysis: analyzeRecords(engine, spec, { ...coreExtras(job), limits }, workspace), job };
  } catch (error) {
    if (!isCalcInputError(error) || !fromCore(error.field)) throw error;
    const missing = [...job.missing, `${error.field}: ${error.message}`];
    try {
      return { analysis: analyzeRecords(engine, spec, { grinding: job.grinding, limits }, workspace), job: { from: null, missing } };
    } catch (again) {
      if (!isCalcInputError(again) || !fromCore(again.field)) throw again;
      return { analysis: analyzeRecords(engine, spec, { limits }, workspace), job: { from: null, missing } };
    }
  }
}

/** Plotted margins are kept to a millionth of an inch, far below any grinder's or gauge's step; the minimum and its angle stay exact. */
const MARGIN_DECIMALS = 1e6;

const geometryJson = (g: LobeGeometry): FeasibilityResults['intake'] => ({
  pressureAngle: g.pressureAngle,
  curvature: g.curvature,
  envelope: g.envelope ? { ...g.envelope, margin: Array.from(g.envelope.margin, (m) => Math.round(m * MARGIN_DECIMALS) / MARGIN_DECIMALS) } : null,
});

/** Checks that belong to "fits the core?" (the lifter side's preload among them). */
export const FEASIBILITY_CHECKS: ReadonlySet<string> = new Set([
  'pressureAngle',
  'undercut',
  'grindingWheel',
  'finishingStock',
  'cleanup',
  'largestCut',
  'hydraulicPreload',
]);

/** Calc's feasibility as JSON (margins as plain arrays), with where the core came from and what it lacks. */
export function feasibilityResults(a: ProfileAnalysis, job: Pick<JobCore, 'from' | 'missing'>): FeasibilityResults {
  const f = a.feasibility;
  return {
    cut: f.cut,
    baseCircle: f.baseCircle,
    intake: geometryJson(f.intake),
    exhaust: geometryJson(f.exhaust),
    cleanup: f.cleanup,
    lifter: f.lifter,
    criterion: f.criterion,
    limits: { finishingStock: a.limits.finishingStock, pressureAngle: a.limits.pressureAngle, undercut: a.limits.undercut },
    checks: a.checks.filter((c) => FEASIBILITY_CHECKS.has(c.id)),
    skipped: a.skipped.filter((c) => FEASIBILITY_CHECKS.has(c.id)),
    coreFrom: job.from,
    coreMissing: job.missing,
  };
}

/** The numbers a sheet revision keeps, taken from a full analysis (with "fits the core?" when the job's core was asked about). */
export function revisionResults(a: ProfileAnalysis, job?: Pick<JobCore, 'from' | 'missing'> | null): RevisionResults {
  const events = ({ ivoBtdc, ivcAbdc, evoBbdc, evcAtdc, ecl, overlap, advance }: ProfileAnalysis['events']['at050']) => ({
    ivoBtdc,
    ivcAbdc,
    evoBbdc,
    evcAtdc,
    ecl,
    overlap,
    advance,
  });
  return {
    status: a.status,
    events050: events(a.events.at050),
    eventsAdvertised: events(a.events.advertised),
    valveLift: { intake: a.intake.valveLift, exhaust: a.exhaust.valveLift },
    staticCompression: a.compression.static.ratio,
    dynamicCompression: a.compression.dynamic.ratio,
    displacementCubicInches: a.displacement.cubicInches,
    checks: a.checks,
    skipped: a.skipped,
    ...(job ? { feasibility: feasibilityResults(a, job) } : {}),
  };
}

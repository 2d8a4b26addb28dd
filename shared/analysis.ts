import { analyzeProfile, type AnalysisInput, type AnalysisWorkspace, type ProfileAnalysis } from '@/calc/analysis';
import type { CheckLimitOverrides } from '@/calc/checks';

import type { EngineSpec } from './engine';
import type { ProfileSpec } from './profile';
import type { RevisionResults } from './sheets';

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

export function analyzeRecords(
  engine: EngineSpec,
  spec: ProfileSpec,
  extras?: AnalysisExtras,
  workspace?: AnalysisWorkspace,
): ProfileAnalysis {
  return analyzeProfile(toAnalysisInput(engine, spec, extras), { workspace });
}

/** The numbers a sheet revision keeps, taken from a full analysis. */
export function revisionResults(a: ProfileAnalysis): RevisionResults {
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
  };
}

/**
 * A plain-language comparison of two analysed profiles for the vehicle's
 * owner. Every sentence comes from a computed difference; wording is hedged
 * and makes no promise about power, economy or mileage.
 */
import type { ProfileAnalysis } from './analysis';
import type { CheckId, CheckResult } from './checks';
import { requireObject } from './errors';

export interface ProfileDifferences {
  /** Candidate − current, crank degrees at 0.050 in. */
  intakeDuration050: number;
  exhaustDuration050: number;
  /** Candidate − current, inches of valve lift. */
  intakeValveLift: number;
  exhaustValveLift: number;
  /** Candidate − current, crank degrees at 0.050 in. */
  overlap050: number;
  /** Candidate − current, cam degrees. */
  lsa: number;
  /** Candidate − current, crank degrees (negative = candidate installed earlier). */
  icl: number;
  /** Candidate − current dynamic compression ratio. */
  dynamicCompression: number;
  /** Candidate − current smallest PTV clearance, inches, when both were swept. */
  ptvIntake: number | null;
  ptvExhaust: number | null;
}

export type OwnerTopic = 'timing' | 'lift' | 'overlap' | 'installed' | 'compression' | 'fit';

export interface OwnerPoint {
  topic: OwnerTopic;
  text: string;
}

export interface OwnerComparison {
  headline: string;
  points: OwnerPoint[];
  cautions: string[];
  differences: ProfileDifferences;
}

export interface OwnerComparisonInput {
  current: ProfileAnalysis;
  candidate: ProfileAnalysis;
  /** How to call each profile in the text; defaults "current" and "proposed". */
  currentName?: string;
  candidateName?: string;
}

/** The cautions every owner summary carries. */
export const OWNER_CAUTIONS: readonly string[] = [
  'These figures are predictions from the cam sheet. The shop still measures piston-to-valve clearance and spring coil bind on your engine before it runs under power.',
  "The shop follows the engine maker's service manual for torque figures and for parts that must be replaced rather than reused.",
  'A cam that differs from the factory profile can affect emissions compliance for road vehicles in some places. Check the rules where the vehicle is registered.',
];

const CHECK_WORDS: Record<CheckId, string> = {
  coilBind: 'valve spring room at full lift',
  retainerToSeal: 'room between the spring retainer and valve seal',
  ptvIntake: 'intake valve clearance to the piston',
  ptvExhaust: 'exhaust valve clearance to the piston',
  hydraulicPreload: 'lifter preload',
  dynamicCompression: 'effective compression',
  degreeing: 'cam timing as installed',
  wornLobe: 'lobe wear',
  pressureAngle: 'how hard the lobe pushes the lifter sideways',
  undercut: 'whether the lobe shape can be ground',
  grindingWheel: 'whether the grinding wheel fits the lobe shape',
  finishingStock: 'whether the new lobe fits inside the old cam',
  cleanup: 'whether the grind goes deep enough to clean up the damage',
  largestCut: 'how deep the grind may go into the hardened surface',
};

/** Differences between two analyses (candidate − current). */
export function profileDifferences(current: ProfileAnalysis, candidate: ProfileAnalysis): ProfileDifferences {
  const ptv = (a: number | undefined, b: number | undefined): number | null => (a === undefined || b === undefined ? null : b - a);
  return {
    intakeDuration050: candidate.intake.duration050 - current.intake.duration050,
    exhaustDuration050: candidate.exhaust.duration050 - current.exhaust.duration050,
    intakeValveLift: candidate.intake.valveLift - current.intake.valveLift,
    exhaustValveLift: candidate.exhaust.valveLift - current.exhaust.valveLift,
    overlap050: candidate.events.at050.overlap - current.events.at050.overlap,
    lsa: candidate.lsa - current.lsa,
    icl: candidate.icl - current.icl,
    dynamicCompression: candidate.compression.dynamic.ratio - current.compression.dynamic.ratio,
    ptvIntake: ptv(current.ptv.intake?.minClearance, candidate.ptv.intake?.minClearance),
    ptvExhaust: ptv(current.ptv.exhaust?.minClearance, candidate.ptv.exhaust?.minClearance),
  };
}

function degrees(v: number): string {
  const r = Math.round(Math.abs(v));
  return `${r}°`;
}

function inches(v: number): string {
  return `${Math.abs(v).toFixed(3)} in`;
}

function listWords(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1] ?? ''}`;
}

function checkWords(checks: readonly CheckResult[], status: 'watch' | 'fail'): string[] {
  const seen = new Set<string>();
  for (const c of checks)
    if (c.status === status) seen.add(`${CHECK_WORDS[c.id]}${c.subject === 'intake' || c.subject === 'exhaust' ? ` (${c.subject})` : ''}`);
  return [...seen];
}

/**
 * One sentence for the owner on how a profile fares in the shop's fit checks,
 * and what is still to be measured on the engine; `name` is what the text calls the cam.
 * `on` says whether the checks were worked out from the numbers (an analysis) or run
 * on the engine with what the tech measured (a fit-check run).
 */
export function ownerFitText(results: Pick<ProfileAnalysis, 'checks' | 'skipped'>, name: string, on: 'numbers' | 'engine' = 'numbers'): string {
  const fails = checkWords(results.checks, 'fail');
  const watches = checkWords(results.checks, 'watch');
  const notMeasured = results.skipped.filter((s) => s.note.startsWith('not measured')).map((s) => CHECK_WORDS[s.id]);
  const checks = on === 'engine' ? "the shop's fit checks on the engine" : "the shop's fit checks";
  let fit: string;
  if (fails.length)
    fit = `${checks.charAt(0).toUpperCase()}${checks.slice(1)} flag ${listWords(fails)} on the ${name} cam; the shop will change parts or the profile before fitting it.`;
  else if (watches.length) fit = `The ${name} cam passes ${checks}, with ${listWords(watches)} close to the limit, so the shop will check those on the engine.`;
  else if (results.checks.length === 0) fit = `None of ${checks} could be worked out for the ${name} cam yet.`;
  else fit = `The ${name} cam passes all of ${checks} that could be worked out${on === 'engine' ? ' from what was measured' : ' from the numbers'}.`;
  if (notMeasured.length) fit += ` Still to be measured on the engine: ${listWords([...new Set(notMeasured)])}.`;
  return fit;
}

/**
 * Compare two analysed profiles in plain words for the owner. Small
 * differences (under 1° or 0.005 in) are reported as "about the same".
 */
export function compareProfilesForOwner(input: OwnerComparisonInput): OwnerComparison {
  requireObject('input', input);
  const { current, candidate } = input;
  const cur = input.currentName?.trim() || 'current';
  const cand = input.candidateName?.trim() || 'proposed';
  const d = profileDifferences(current, candidate);
  const points: OwnerPoint[] = [];

  // timing
  const avgDuration = (d.intakeDuration050 + d.exhaustDuration050) / 2;
  if (Math.abs(d.intakeDuration050) < 1 && Math.abs(d.exhaustDuration050) < 1) {
    points.push({ topic: 'timing', text: `The ${cand} cam holds the valves open for about the same time as the ${cur} one.` });
  } else {
    const parts: string[] = [];
    if (Math.abs(d.intakeDuration050) >= 1) {
      parts.push(`the intake valve open about ${degrees(d.intakeDuration050)} ${d.intakeDuration050 > 0 ? 'longer' : 'shorter'}`);
    }
    if (Math.abs(d.exhaustDuration050) >= 1) {
      parts.push(`the exhaust valve ${parts.length ? '' : 'open '}about ${degrees(d.exhaustDuration050)} ${d.exhaustDuration050 > 0 ? 'longer' : 'shorter'}`);
    }
    const tendency =
      avgDuration > 0
        ? 'Longer timing tends to shift where the engine feels strongest a little higher in the rev range.'
        : avgDuration < 0
          ? 'Shorter timing tends to shift where the engine feels strongest a little lower in the rev range.'
          : '';
    points.push({
      topic: 'timing',
      text: `Compared with the ${cur} cam, the ${cand} one holds ${listWords(parts)} (crankshaft degrees, at the trade's standard checking point). ${tendency}`.trim(),
    });
  }

  // lift
  const liftParts: string[] = [];
  for (const [name, delta, base] of [
    ['intake', d.intakeValveLift, current.intake.valveLift],
    ['exhaust', d.exhaustValveLift, current.exhaust.valveLift],
  ] as const) {
    if (Math.abs(delta) >= 0.005) {
      liftParts.push(`the ${name} valve ${inches(delta)} (about ${Math.round((Math.abs(delta) / base) * 100)}%) ${delta > 0 ? 'further' : 'less far'}`);
    }
  }
  points.push({
    topic: 'lift',
    text: liftParts.length ? `It opens ${listWords(liftParts)}.` : `It opens the valves about as far as the ${cur} cam.`,
  });

  // overlap
  if (Math.abs(d.overlap050) >= 1) {
    points.push({
      topic: 'overlap',
      text:
        d.overlap050 > 0
          ? `Both valves are open together around the top of the stroke for about ${degrees(d.overlap050)} more. That can make the idle a little less smooth and may lower engine vacuum slightly.`
          : `Both valves are open together around the top of the stroke for about ${degrees(d.overlap050)} less. That usually keeps the idle smooth and engine vacuum steady.`,
    });
  }

  // installed position
  if (Math.abs(d.icl) >= 1) {
    points.push({
      topic: 'installed',
      text: `It is installed about ${degrees(d.icl)} ${d.icl < 0 ? 'earlier (advanced)' : 'later (retarded)'} than the ${cur} cam, which is the builder's choice for how the engine will be used.`,
    });
  }

  // compression
  const fromCr = current.compression.dynamic.ratio.toFixed(1);
  const toCr = candidate.compression.dynamic.ratio.toFixed(1);
  points.push({
    topic: 'compression',
    text:
      Math.abs(d.dynamicCompression) < 0.05
        ? `The effective compression while running stays about the same (${toCr} to 1).`
        : `The effective compression while running goes from about ${fromCr} to ${toCr} to 1. ${
            d.dynamicCompression < 0 ? 'Lower tends to be more tolerant of ordinary fuel.' : 'Higher can call for the fuel grade your shop recommends.'
          }`,
  });

  points.push({ topic: 'fit', text: ownerFitText(candidate, cand) });

  const bigger = avgDuration >= 1 || d.intakeValveLift >= 0.005 || d.exhaustValveLift >= 0.005;
  const smaller = avgDuration <= -1 || d.intakeValveLift <= -0.005 || d.exhaustValveLift <= -0.005;
  const headline =
    bigger && !smaller
      ? `The ${cand} cam is a little larger than the ${cur} one: it opens the valves longer or further.`
      : smaller && !bigger
        ? `The ${cand} cam is a little milder than the ${cur} one: it opens the valves for less time or less far.`
        : bigger && smaller
          ? `The ${cand} cam trades some timing for lift compared with the ${cur} one.`
          : `The ${cand} cam is very close to the ${cur} one.`;

  return { headline, points, cautions: [...OWNER_CAUTIONS], differences: d };
}

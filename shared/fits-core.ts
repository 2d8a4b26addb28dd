import type { CheckResult, CheckStatus } from '@/calc/checks';
import type { PushrodAdvice } from '@/calc/regrind';

import type { FeasibilityResults } from './sheets';

/** The answer to "can this cam be ground from the old one?": yes, watch, no, or not worked out. */
export type CoreVerdict = CheckStatus | 'not-run';

/** The checks that decide whether the core will do (the lifter side only informs). */
const DECIDING = ['finishingStock', 'cleanup', 'largestCut', 'undercut', 'grindingWheel', 'pressureAngle'] as const;
/** Without these two the answer is not known. */
const NEEDED = ['finishingStock', 'cleanup'] as const;

/** What each check is called on the panel. */
export const CORE_CHECK_TITLES: Record<string, string> = {
  finishingStock: 'Metal left to finish the lobe',
  cleanup: 'Cut cleans up the damage',
  largestCut: 'Cut within the hardened layer',
  pressureAngle: 'Pressure angle on the roller',
  undercut: 'Lobe radius (no undercut)',
  grindingWheel: 'Concave flank against the wheel',
  hydraulicPreload: 'Lifter preload after the cut',
};

const inches = (v: number) => `${v.toFixed(3)} in`;
const signed = (v: number) => `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(3)} in`;

/** The pushrod advice in words, the same wherever it is shown (fit checks, "fits the core?"). */
export function pushrodAdviceText(a: PushrodAdvice): string {
  const sum =
    a.lifterDrop > 0
      ? `the checking pushrod's ${inches(a.checkingLength)} at zero lash, + ${inches(a.lifterDrop)} the lifter drops with the smaller base circle, + ${inches(a.targetPreload)} preload`
      : `the checking pushrod's ${inches(a.checkingLength)} at zero lash on the reground cam + ${inches(a.targetPreload)} preload`;
  const change =
    a.change === null || a.currentLength === null
      ? ''
      : Math.abs(a.change) < 0.0005
        ? `; the ${inches(a.currentLength)} pushrods in the engine already give it`
        : `; ${a.change > 0 ? 'lengthen' : 'shorten'} the ${inches(a.currentLength)} pushrods by ${inches(Math.abs(a.change))}`;
  return `Pushrods ${inches(a.length)} long for ${inches(a.targetPreload)} preload: ${sum}${change}.`;
}

/** Where on the lobe a cam angle from its centre falls, in the builder's words. */
export function flankOf(at: number): string {
  if (Math.abs(at) <= 2) return 'at the nose';
  return `${Math.abs(at).toFixed(0)}° cam ${at < 0 ? 'before the nose, opening flank' : 'after the nose, closing flank'}`;
}

export type CoreView = {
  verdict: CoreVerdict;
  /** One plain sentence: does it fit, at what cut, and why not. */
  headline: string;
  /** Whether the owner's words should say the old cam will do. */
  fromOldCam: 'yes' | 'no' | 'unknown';
  /** The tightest lobe, its margin and where. */
  tightest: { lobe: 'intake' | 'exhaust'; margin: number; at: number } | null;
  /** Figures in words, each with a stable key. */
  figures: { key: string; label: string; value: string }[];
  /** What the cut does to the lifters, or why that is not known. */
  lifter: string;
  /** The deciding checks and the lifter check. */
  checks: CheckResult[];
  /** What is missing for the answer, in words. */
  missing: string[];
};

function worst(checks: readonly CheckResult[]): CheckStatus {
  return checks.some((c) => c.status === 'fail') ? 'fail' : checks.some((c) => c.status === 'watch') ? 'watch' : 'pass';
}

/**
 * The "fits the core?" panel's words from calc's stored or served feasibility. Nothing here
 * computes a figure: each is calc's, rounded for reading. `undefined` = the sheet was saved
 * before the job had a core.
 */
export function coreView(f: FeasibilityResults | undefined, jobMissing?: readonly string[]): CoreView {
  if (!f) {
    return {
      verdict: 'not-run',
      headline: jobMissing?.length
        ? `Not worked out: ${jobMissing.join('; ')}.`
        : "Not worked out yet: the job had no core when this was saved. Upload the old cam's lobe table and record the stock base circle, then save again.",
      fromOldCam: 'unknown',
      tightest: null,
      figures: [],
      lifter: 'Not worked out.',
      checks: [],
      missing: ["the old cam's lobe table", 'the stock base circle'],
    };
  }
  const deciding = f.checks.filter((c) => (DECIDING as readonly string[]).includes(c.id));
  const checks = [...deciding, ...f.checks.filter((c) => c.id === 'hydraulicPreload')];
  const missing = [
    ...f.coreMissing,
    ...f.skipped.filter((s) => (DECIDING as readonly string[]).includes(s.id)).map((s) => `${CORE_CHECK_TITLES[s.id] ?? s.id}: ${s.note}`),
  ];
  const ran = new Set(deciding.map((c) => c.id));
  const known = NEEDED.every((id) => ran.has(id));

  const lobes = (['intake', 'exhaust'] as const).flatMap((lobe) => {
    const e = f[lobe].envelope;
    return e ? [{ lobe, margin: e.minMargin, at: e.minAt }] : [];
  });
  const tightest = lobes.reduce<CoreView['tightest']>((t, l) => (t === null || l.margin < t.margin ? l : t), null);

  const figures: CoreView['figures'] = [];
  if (f.cut !== null) figures.push({ key: 'cut', label: 'Base-circle cut (on the diameter)', value: inches(f.cut) });
  if (f.cleanup) {
    figures.push({ key: 'cleanup', label: `Cut that cleans up the damage (${f.cleanup.limitingLobe} lobe)`, value: inches(f.cleanup.cleanupCut) });
    figures.push({ key: 'largestLift', label: 'Largest lobe lift at this cut', value: inches(f.cleanup.largestLift) });
  }
  if (tightest) figures.push({ key: 'margin', label: `Tightest point (${tightest.lobe} lobe, ${flankOf(tightest.at)})`, value: signed(tightest.margin) });
  figures.push({ key: 'finishingStock', label: 'Finishing stock wanted', value: inches(f.limits.finishingStock.min) });
  for (const lobe of ['intake', 'exhaust'] as const) {
    const p = f[lobe].pressureAngle;
    if (p)
      figures.push({
        key: `pressureAngle-${lobe}`,
        label: `Largest pressure angle, ${lobe}`,
        value: `${Math.max(p.rise.value, p.fall.value).toFixed(1)}° (limit ${f.limits.pressureAngle.max}°)`,
      });
    const c = f[lobe].curvature;
    if (c)
      figures.push({ key: `radius-${lobe}`, label: `Smallest lobe radius, ${lobe}`, value: `${inches(c.minSurface.value)}${c.undercut ? ' (undercut)' : ''}` });
  }

  const l = f.lifter;
  const lifter = l
    ? `The lifters sit ${inches(l.lifterDrop)} lower. With the stock pushrods preload falls to ${inches(l.preloadLeft)}${l.stockPushrodsOk ? '' : ', below the least the lifter wants'}. Stock pushrods allow a cut of up to ${inches(l.largestCutStockPushrods)}. ${
        l.pushrod ? pushrodAdviceText(l.pushrod) : 'Pushrod length: record the checking pushrod at zero lash, the target preload and which cam it was read on.'
      }`
    : 'Not worked out: record the preload with the old cam and the pushrod length (hydraulic lifters).';

  const cut = f.cut === null ? null : inches(f.cut);
  let verdict: CoreVerdict;
  let headline: string;
  if (!known) {
    verdict = 'not-run';
    headline = `Not worked out: ${missing.length ? missing.join('; ') : 'the core is not known'}.`;
  } else {
    verdict = worst(deciding);
    const stock = deciding.filter((c) => c.id === 'finishingStock' && c.status === 'fail');
    const cleanupFail = deciding.find((c) => c.id === 'cleanup' && c.status === 'fail');
    const tooDeep = deciding.find((c) => c.id === 'largestCut' && c.status === 'fail');
    const other = deciding.filter((c) => c.status === 'fail' && !['finishingStock', 'cleanup', 'largestCut'].includes(c.id));
    if (verdict === 'fail') {
      const why: string[] = [];
      if (stock.length && tightest) {
        why.push(
          tightest.margin < 0
            ? `the new ${tightest.lobe} lobe stands ${inches(-tightest.margin)} outside the old one ${flankOf(tightest.at)}`
            : `only ${inches(tightest.margin)} of metal is left on the ${tightest.lobe} lobe ${flankOf(tightest.at)}, under the ${inches(f.limits.finishingStock.min)} wanted`,
        );
      }
      if (cleanupFail && f.cleanup) why.push(`the cut does not clean up the damage (it needs at least ${inches(f.cleanup.cleanupCut)})`);
      if (tooDeep) why.push(`the cut is deeper than the hardened layer allows (${inches(tooDeep.limit)})`);
      for (const c of other) why.push(`${(CORE_CHECK_TITLES[c.id] ?? c.id).toLowerCase()} fails on the ${c.subject} lobe`);
      headline = `Cannot be ground from the old cam at a ${cut} cut: ${why.join('; ')}. It needs a new core.`;
    } else {
      const spare = tightest ? `, with ${inches(tightest.margin)} of metal at the tightest point` : '';
      headline = `Can be ground from the old cam at a ${cut} cut${spare}${verdict === 'watch' ? '; some figures are close to their limits' : ''}.`;
    }
  }
  const fromOldCam = verdict === 'not-run' ? 'unknown' : verdict === 'fail' ? 'no' : 'yes';
  return { verdict, headline, fromOldCam, tightest, figures, lifter, checks, missing };
}

/** Whether the option can be made from the owner's own camshaft, and the words the owner reads. */
export type OwnerCoreAnswer = { answer: 'old-cam' | 'new-core' | 'unknown'; text: string };

/**
 * "Fits the core?" for the owner, in plain words from the revision's stored feasibility:
 * the old camshaft can be reground into this option, or it needs a new core, or the shop
 * has not checked yet. Names no measurement, finding or note.
 */
export function ownerCoreText(f: FeasibilityResults | undefined, title: string): OwnerCoreAnswer {
  const view = coreView(f);
  if (view.fromOldCam === 'yes') {
    return {
      answer: 'old-cam',
      text: `${title}: can be ground from your own old camshaft. The shop grinds the damaged surface away and shapes the new lobes inside the old ones; the grinder confirms it on the machine before grinding.`,
    };
  }
  if (view.fromOldCam === 'no') {
    return {
      answer: 'new-core',
      text: `${title}: cannot be ground from your old camshaft, because the new lobes need metal the old cam does not have. It needs a new core (a new blank camshaft to grind), which can change the price and the wait.`,
    };
  }
  return { answer: 'unknown', text: `${title}: the shop has not yet checked whether your old camshaft can be ground to this one.` };
}

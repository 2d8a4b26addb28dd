/**
 * The fit checks a tech runs against a spec sheet revision: predicted PTV from
 * the measured baseline, each measured spring at the revision's valve lift,
 * lifter preload after the regrind, the degreed-in ICL, and the measured lobes.
 * Pure: the route loads the records and stores what this returns. Calc's
 * refusals pass through as CalcInputError with calc's field paths (the PTV
 * baselines, springs and lobes already carry the measurement's own path); the
 * route declares how they read in the request's terms.
 */
import { analyzeLiftTable, tableMaxLifts, type LiftTableAnalysis, type WornLobeResult } from '@/calc/measured';
import { PTV_SWEEP } from '@/calc/analysis';
import { checkDegreeing, checkWornLobes } from '@/calc/checks';
import { checkMinimum, resolveCheckLimits, worstStatus, type CheckLimitOverrides, type CheckResult, type SkippedCheck } from '@/calc/checks';
import { CHECKING_HEIGHT_050 } from '@/calc/constants';
import { degreeFromReadings } from '@/calc/degree';
import { isCalcInputError } from '@/calc/errors';
import { CYCLE_GRID } from '@/calc/lift-curve';
import { ptvSweep } from '@/calc/ptv';
import { retainerToSealMargin, springCheck } from '@/calc/springs';
import { analyzeRecords } from '@/shared/analysis';
import { pushrodAdviceOf, regrindFromPushrod } from '@/shared/job-core';
import type { EngineSpec } from '@/shared/engine';
import type { FitCheckPtv, FitCheckRun, MeasurementData } from '@/shared/measurements';
import type { ProfileSpec } from '@/shared/profile';

export type FitCheckInput = {
  engine: EngineSpec;
  spec: ProfileSpec;
  measured: Partial<MeasurementData>;
  limits: CheckLimitOverrides;
};

export type FitCheckResults = FitCheckRun['results'];

/** A spring named "3E" or "7I" is checked at that valve's lift; anything else (a head, "all") at the larger. */
function springValve(where: string): 'intake' | 'exhaust' | 'both' {
  if (/\d\s*I$/i.test(where.trim())) return 'intake';
  if (/\d\s*E$/i.test(where.trim())) return 'exhaust';
  return 'both';
}

export function runFitChecks({ engine, spec, measured, limits: overrides }: FitCheckInput): FitCheckResults {
  const limits = resolveCheckLimits(overrides);
  const checks: CheckResult[] = [];
  const skipped: SkippedCheck[] = [];

  const pushrod = measured.pushrod;
  const regrind = regrindFromPushrod(pushrod);
  const analysis = analyzeRecords(engine, spec, { regrind, limits: overrides });
  const valveLift = { intake: analysis.intake.valveLift, exhaust: analysis.exhaust.valveLift };

  // Predicted piston-to-valve clearance: every baseline reading is swept; the smallest prediction governs.
  const ptv: FitCheckResults['ptv'] = { intake: null, exhaust: null };
  const baseline = measured['ptv-baseline'];
  for (const valve of ['intake', 'exhaust'] as const) {
    const id = valve === 'intake' ? 'ptvIntake' : 'ptvExhaust';
    if (!baseline) {
      skipped.push({ id, subject: valve, note: 'not measured: record a PTV baseline with the old cam (clay or checking springs)' });
      continue;
    }
    // A blank old-cam lift is not measured, never zero: the valve's check does not run and names each reading that lacks it.
    const readings = baseline[valve].filter((r): r is typeof r & { valveLift: number } => r.valveLift !== null);
    if (readings.length < baseline[valve].length) {
      const lacking = baseline[valve].flatMap((r, i) => (r.valveLift === null ? [`${valve} reading ${i + 1} (at ${r.crankAngle}° ATDC)`] : []));
      skipped.push({ id, subject: valve, note: `not measured: the old cam's valve lift for ${lacking.join(', ')}` });
      continue;
    }
    let best: FitCheckPtv | null = null;
    readings.forEach((reading, i) => {
      const sweep = ptvSweep(
        {
          stroke: engine.stroke,
          rodLength: engine.rodLength,
          valveAngle: engine.valveAngle,
          baseline: reading,
          curve: { start: CYCLE_GRID.start, step: CYCLE_GRID.step, lift: analysis[valve].curve.lift },
          from: PTV_SWEEP.from,
          to: PTV_SWEEP.to,
        },
        `ptv-baseline.${valve}.${i}`,
      );
      if (!best || sweep.minClearance < best.minClearance) {
        best = { ...sweep, clearance: Array.from(sweep.clearance), baseline: { ...reading } };
      }
    });
    const governing = best as FitCheckPtv | null;
    if (!governing) continue;
    ptv[valve] = governing;
    checks.push(
      checkMinimum(
        { id, subject: valve, value: governing.minClearance, unit: 'in', what: `Predicted piston-to-valve clearance, ${valve}` },
        valve === 'intake' ? limits.ptvIntake : limits.ptvExhaust,
      ),
    );
  }

  // Each measured spring at the revision's max valve lift.
  const springs: FitCheckResults['springs'] = [];
  if (!measured.springs) {
    const note = 'not measured: record installed height, seat load, rate, coil-bind height and retainer-to-seal';
    skipped.push({ id: 'coilBind', subject: 'springs', note }, { id: 'retainerToSeal', subject: 'springs', note });
  } else {
    measured.springs.springs.forEach((s, i) => {
      const valve = springValve(s.where);
      const lift = valve === 'both' ? Math.max(valveLift.intake, valveLift.exhaust) : valveLift[valve];
      const prefix = `springs.springs.${i}`;
      const sc = springCheck({ ...s, valveLift: lift }, prefix);
      const r2s = retainerToSealMargin({ retainerToSeal: s.retainerToSeal, valveLift: lift }, prefix).clearanceAtMaxLift;
      springs.push({
        where: s.where,
        valveLift: lift,
        openLoad: sc.openLoad,
        openHeight: sc.openHeight,
        coilBindMargin: sc.coilBindMargin,
        retainerToSealMargin: r2s,
      });
      checks.push(
        checkMinimum({ id: 'coilBind', subject: s.where, value: sc.coilBindMargin, unit: 'in', what: 'Coil-bind margin at max lift' }, limits.coilBind),
        checkMinimum({ id: 'retainerToSeal', subject: s.where, value: r2s, unit: 'in', what: 'Retainer-to-seal clearance at max lift' }, limits.retainerToSeal),
      );
    });
  }

  // Preload after the regrind (the analysis skips it for solid lifters or missing numbers).
  checks.push(...analysis.checks.filter((c) => c.id === 'hydraulicPreload'));
  for (const s of analysis.skipped.filter((c) => c.id === 'hydraulicPreload')) {
    skipped.push(
      pushrod && pushrod.originalPreload === null && s.note.startsWith('not measured')
        ? { ...s, note: 'not measured: record the preload with the old cam' }
        : s,
    );
  }

  // The pushrod length for the target preload on this revision's base circle.
  const pushrodAdvice = pushrodAdviceOf(pushrod, spec.baseCircle);

  // Degreeing: true TDC from the piston stops, then the ICL from the equal-lift flank readings.
  let degree: FitCheckResults['degree'] = null;
  const readings = measured.degree;
  if (!readings) {
    skipped.push({ id: 'degreeing', subject: 'intake', note: 'not measured: record the piston-stop and flank readings at cam install' });
  } else {
    degree = degreeFromReadings({ ...readings, sheetIcl: spec.icl });
    checks.push(checkDegreeing(degree, overrides));
  }

  // Measured lobes: each table analysed; worn lobes against their own kind.
  let lobes: FitCheckResults['lobes'] = null;
  if (!measured.lobes) {
    skipped.push({ id: 'wornLobe', subject: 'lobes', note: 'not measured: upload a lobe table (CSV)' });
  } else {
    const analyses: { id: string; table: LiftTableAnalysis }[] = [];
    for (const lobe of measured.lobes.lobes) {
      const kind = lobe.id.endsWith('I') ? spec.intake : spec.exhaust;
      const top = Math.max(...lobe.points.map((p) => p.lift));
      const heights = [...new Set([kind.advertisedHeight, CHECKING_HEIGHT_050])].filter((h) => h < top).sort((a, b) => a - b);
      try {
        analyses.push({ id: lobe.id, table: analyzeLiftTable({ points: lobe.points, heights }) });
      } catch (error) {
        if (!isCalcInputError(error)) throw error;
        skipped.push({ id: 'wornLobe', subject: lobe.id, note: `table not analysed: ${error.message}` });
      }
    }
    const found = checkWornLobes(tableMaxLifts(measured.lobes.lobes), overrides);
    checks.push(...found.checks);
    skipped.push(...found.unjudged.map((u) => ({ id: 'wornLobe' as const, subject: u.id, note: u.note })));
    const worn: WornLobeResult | null = found.result.lobes.length > 0 ? found.result : null;
    lobes = { analyses, worn };
  }

  return {
    status: worstStatus(checks),
    checks,
    skipped,
    ptv,
    springs,
    preload: analysis.preload,
    pushrod: pushrodAdvice,
    degree,
    lobes,
  };
}

import type { CoreInput, GrindingInput, RegrindInput } from '@/calc/analysis';
import type { CheckLimits } from '@/calc/checks';
import { CHECKING_HEIGHT_050 } from '@/calc/constants';
import { isCalcInputError } from '@/calc/errors';
import { analyzeLiftTable, findWornLobesByKind, lobeKind, tableMaxLifts } from '@/calc/measured';
import { pushrodCheckInput, pushrodForPreload, type PushrodAdvice } from '@/calc/regrind';

import type { LifterTypeName } from './engine';
import type { MeasurementData } from './measurements';

/** The checking height the core's lobes are read at below 0.050 in, inches of tappet lift (the usual advertised height). */
export const CORE_ADVERTISED_HEIGHT = 0.006;

/** What the job's measurements and the shop's settings give the feasibility part of an analysis. */
export type JobCore = {
  /** The core the candidate is ground from, or null with `missing` saying what is lacking. */
  core: CoreInput | null;
  grinding: GrindingInput;
  /** Preload with the old cam, for what the cut does to the lifters. */
  regrind: RegrindInput | undefined;
  /** Where the core's lobes come from, in words, e.g. "measured lobe table: 14 sound lobes, 3E damaged 0.012 in". */
  from: string | null;
  /** What is lacking for the core, in words (empty when the core is known). */
  missing: string[];
};

const median = (values: readonly number[]): number => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
};

type KindCore = { lobe: CoreInput['intake']; centerline: number; damageDepth: number; sound: number; damaged: { id: string; depth: number }[] };

/**
 * One kind's core lobe from the measured table: the sound lobes' median durations at
 * 0.050 in and at CORE_ADVERTISED_HEIGHT, their median max lift and centreline, and the
 * deepest damage of any lobe of that kind (calc's findWornLobesByKind, the same finding the
 * fit checks report). Null with the reason when the table cannot describe the lobe.
 */
function kindCore(data: MeasurementData['lobes'], kind: 'intake' | 'exhaust', threshold: number): KindCore | string {
  const lobes = data.lobes.filter((l) => lobeKind(l.id) === kind);
  if (lobes.length === 0) return `no ${kind} lobe in the lobe table`;
  const wear = findWornLobesByKind({ lobes: tableMaxLifts(lobes), threshold });
  const worn = new Set(wear.worn);
  const sound = lobes.filter((l) => !worn.has(l.id));
  const read = sound.flatMap((l) => {
    try {
      const t = analyzeLiftTable({ points: l.points, heights: [CORE_ADVERTISED_HEIGHT, CHECKING_HEIGHT_050] });
      const adv = t.durations.find((d) => d.height === CORE_ADVERTISED_HEIGHT)?.duration;
      const d050 = t.durations.find((d) => d.height === CHECKING_HEIGHT_050)?.duration;
      return adv === undefined || d050 === undefined ? [] : [{ adv, d050, lift: t.maxLift, centerline: t.centerline }];
    } catch (error) {
      if (isCalcInputError(error)) return [];
      throw error;
    }
  });
  if (read.length === 0) return `no sound ${kind} lobe in the lobe table could be read at ${CORE_ADVERTISED_HEIGHT} and ${CHECKING_HEIGHT_050} in`;
  const damaged = wear.lobes.filter((l) => l.damageDepth > 0 && worn.has(l.id)).map((l) => ({ id: l.id, depth: l.damageDepth }));
  return {
    lobe: {
      duration050: median(read.map((r) => r.d050)),
      advertisedDuration: median(read.map((r) => r.adv)),
      advertisedHeight: CORE_ADVERTISED_HEIGHT,
      lobeLift: median(read.map((r) => r.lift)),
    },
    centerline: median(read.map((r) => r.centerline)),
    damageDepth: damaged.reduce((m, d) => Math.max(m, d.depth), 0),
    sound: read.length,
    damaged,
  };
}

/** Calc's preload input from the pushrod readings; none without the preload measured with the old cam. Inches. */
export function regrindFromPushrod(pushrod: MeasurementData['pushrod'] | undefined): RegrindInput | undefined {
  return pushrod && pushrod.originalPreload !== null
    ? {
        originalPreload: pushrod.originalPreload,
        stockBaseCircle: pushrod.stockBaseCircle,
        plungerTravel: pushrod.plungerTravel,
        ...(pushrod.currentLength !== null ? { pushrodLength: pushrod.currentLength } : {}),
        ...(pushrod.checkedOn !== null
          ? { pushrodCheck: { checkingLength: pushrod.checkingLength, targetPreload: pushrod.targetPreload, checkedOn: pushrod.checkedOn } }
          : {}),
      }
    : undefined;
}

/**
 * The pushrod advice for a sheet revision from the pushrod readings, by calc's one
 * function (pushrodForPreload, the same one "fits the core?" uses): the checking
 * pushrod at zero lash, the target preload and, when it was read on the old cam,
 * the base-circle cut from the stock to the sheet's base circle. Inches. What it
 * lacks is named, never taken as zero.
 */
export function pushrodAdviceOf(
  pushrod: MeasurementData['pushrod'] | undefined,
  regrindBaseCircle: number | null,
): { advice: PushrodAdvice | null; missing: string | null } {
  if (!pushrod) return { advice: null, missing: 'record the checking pushrod at zero lash and the target preload (pushrod and preload)' };
  if (pushrod.checkedOn === null) return { advice: null, missing: 'say which cam the checking pushrod was read on (pushrod and preload)' };
  let cut = 0;
  if (pushrod.checkedOn === 'old-cam') {
    if (regrindBaseCircle === null) return { advice: null, missing: "give the sheet's regrind base circle: the checking pushrod was read on the old cam" };
    cut = pushrod.stockBaseCircle - regrindBaseCircle;
    if (cut < 0) return { advice: null, missing: "the sheet's base circle is larger than the stock one: check both" };
  }
  const check = { checkingLength: pushrod.checkingLength, targetPreload: pushrod.targetPreload, checkedOn: pushrod.checkedOn };
  return { advice: pushrodForPreload(pushrodCheckInput(check, cut, pushrod.currentLength ?? undefined), 'pushrod'), missing: null };
}

/**
 * The core and grinding numbers for a job: the core is the job's measured lobe table
 * (the sound lobes give its shape and phasing, the worn-lobe finding gives each kind's
 * damage depth) with the stock base circle from the pushrod measurement; the grinding
 * numbers are the shop's settings. A blank setting stays out (calc then says NOT RUN and
 * names it), never zero. Inches and crank degrees; the table's angles are from overlap TDC.
 */
export function jobCore({ measured, limits, lifterType }: { measured: Partial<MeasurementData>; limits: CheckLimits; lifterType: LifterTypeName }): JobCore {
  const roller = lifterType === 'hydraulic-roller' || lifterType === 'solid-roller';
  const grinding: GrindingInput = {};
  if (roller && limits.rollerDiameter.value !== null) grinding.rollerDiameter = limits.rollerDiameter.value;
  if (limits.wheelRadius.value !== null) grinding.wheelDiameter = 2 * limits.wheelRadius.value;
  if (limits.cleanupAllowance.value !== null) grinding.cleanupAllowance = limits.cleanupAllowance.value;
  if (limits.largestCut.value !== null) grinding.largestCut = limits.largestCut.value;

  const pushrod = measured.pushrod;
  const regrind = regrindFromPushrod(pushrod);

  const missing: string[] = [];
  const table = measured.lobes;
  if (!table) missing.push("upload the core's lobe table (CSV)");
  if (!pushrod) missing.push('record the stock base circle (pushrod and preload)');
  if (!table || !pushrod) return { core: null, grinding, regrind, from: null, missing };

  const intake = kindCore(table, 'intake', limits.wornLobe.max);
  const exhaust = kindCore(table, 'exhaust', limits.wornLobe.max);
  if (typeof intake === 'string') missing.push(intake);
  if (typeof exhaust === 'string') missing.push(exhaust);
  if (typeof intake === 'string' || typeof exhaust === 'string') return { core: null, grinding, regrind, from: null, missing };

  const icl = intake.centerline;
  const ecl = -exhaust.centerline;
  const lsa = (icl + ecl) / 2;
  if (!(icl >= 80 && icl <= 140 && lsa >= 90 && lsa <= 130)) {
    missing.push(`read the lobe table from overlap TDC: its centrelines give ICL ${icl.toFixed(1)}° and lobe separation ${lsa.toFixed(1)}°`);
    return { core: null, grinding, regrind, from: null, missing };
  }
  const damaged = [...intake.damaged, ...exhaust.damaged];
  const core: CoreInput = {
    intake: intake.lobe,
    exhaust: exhaust.lobe,
    lsa,
    icl,
    baseCircle: pushrod.stockBaseCircle,
    damageDepth: { intake: intake.damageDepth, exhaust: exhaust.damageDepth },
  };
  const damage = damaged.length ? `, damaged ${damaged.map((d) => `${d.id} ${d.depth.toFixed(3)} in`).join(', ')}` : ', no damaged lobe';
  return {
    core,
    grinding,
    regrind,
    from: `measured lobe table: ${intake.sound + exhaust.sound} sound lobes${damage}`,
    missing,
  };
}

/**
 * Regrind geometry: grinding a lobe back to a smaller base circle drops the
 * lifter, which takes preload off a hydraulic lifter with fixed rockers.
 */
import { CalcInputError, fieldPath, requireFinite, requireInRange, requireObject, requirePositive, requireThat } from './errors';

/** Unchecked kernel of pushrodChangeForRegrind. */
export function pushrodChangeRaw(baseCircleReduction: number): number {
  return baseCircleReduction / 2;
}

/**
 * Pushrod length increase, inches, that restores lifter preload after the
 * base circle DIAMETER shrinks by `baseCircleReduction` inches. The lifter
 * rides on the base-circle radius, so it drops by half the diameter change.
 */
export function pushrodChangeForRegrind(input: { baseCircleReduction: number }): number {
  requireObject('input', input);
  const reduction = requireFinite('baseCircleReduction', input.baseCircleReduction);
  requireThat(reduction >= 0, 'baseCircleReduction', 'must be 0 or more: a regrind cannot grow the base circle', reduction);
  requireThat(reduction < 1, 'baseCircleReduction', 'must be under 1 in: check it is a diameter change, not a diameter', reduction);
  return pushrodChangeRaw(reduction);
}

/** Which cam the checking pushrod was read on: the old (stock) cam, or the reground cam that will run. */
export type CheckedOn = 'old-cam' | 'reground-cam';

export interface PushrodInput {
  /** Adjustable checking pushrod set to zero lash (lifter plunger at the top of its travel, no free play), inches. */
  checkingLength: number;
  /** Preload wanted: how far the pushrod should push the plunger down from zero lash, inches. */
  targetPreload: number;
  /**
   * Base-circle diameter lost between the cam the checking pushrod was read on and the
   * cam that will run, inches: the regrind's cut when read on the old cam, 0 when read on the reground one.
   */
  baseCircleReduction: number;
  /** Pushrod length in the engine now, inches (optional). */
  currentLength?: number;
}

export interface PushrodAdvice {
  /** The checking length at zero lash it starts from, inches. */
  checkingLength: number;
  /** The preload it aims at, inches. */
  targetPreload: number;
  /** How far the lifter sits lower on the cam that will run than where the checking pushrod was read, inches. */
  lifterDrop: number;
  /** Pushrod length that gives the target preload on the cam that will run, inches. */
  length: number;
  /** length − the pushrod in the engine, inches (positive = longer), when that length is known. */
  change: number | null;
  /** The pushrod in the engine, inches, or null. */
  currentLength: number | null;
}

/** pushrodForPreload's input from a checking-pushrod reading and the regrind's base-circle cut (diameter, inches). */
export function pushrodCheckInput(
  check: { checkingLength: number; targetPreload: number; checkedOn: CheckedOn },
  cut: number,
  currentLength?: number,
): PushrodInput {
  return {
    checkingLength: check.checkingLength,
    targetPreload: check.targetPreload,
    baseCircleReduction: check.checkedOn === 'old-cam' ? cut : 0,
    ...(currentLength === undefined ? {} : { currentLength }),
  };
}

/**
 * Pushrod length for a target preload on a hydraulic lifter with fixed rockers:
 * length = checking length at zero lash + lifter drop + target preload, where
 * the lifter drop is half the base-circle diameter lost since the checking
 * pushrod was read (the lifter rides on the base-circle radius). At zero lash
 * every extra inch of pushrod pushes the plunger down an inch, so the preload
 * is the pushrod length beyond the zero-lash length (the rocker is fixed, so
 * the rocker ratio does not enter). Argument shape: PushrodInput (inches).
 */
export function pushrodForPreload(input: PushrodInput, prefix?: string): PushrodAdvice {
  requireObject(prefix ?? 'input', input);
  const checkingLength = requireInRange(fieldPath(prefix, 'checkingLength'), input.checkingLength, { min: 0, max: 20, minOpen: true, unit: 'in' });
  const targetPreload = requireInRange(fieldPath(prefix, 'targetPreload'), input.targetPreload, { min: 0, max: 0.25, unit: 'in' });
  const reduction = requireInRange(fieldPath(prefix, 'baseCircleReduction'), input.baseCircleReduction, { min: 0, max: 1, maxOpen: true, unit: 'in' });
  const current = input.currentLength === undefined ? null : requirePositive(fieldPath(prefix, 'currentLength'), input.currentLength, 'in');
  const lifterDrop = pushrodChangeRaw(reduction);
  const length = checkingLength + lifterDrop + targetPreload;
  return { checkingLength, targetPreload, lifterDrop, length, change: current === null ? null : length - current, currentLength: current };
}

export interface PreloadInput {
  /** Lifter preload with the original cam, inches of plunger travel. */
  originalPreload: number;
  /** Original (stock) base-circle diameter, inches. */
  stockBaseCircle: number;
  /** Regrind base-circle diameter, inches. */
  regrindBaseCircle: number;
  /** Current pushrod length, inches (optional). */
  pushrodLength?: number;
  /** Total plunger travel of the lifter, inches (optional, from the lifter maker). */
  plungerTravel?: number;
}

export interface PreloadResult {
  /** Base-circle diameter reduction, inches. */
  baseCircleReduction: number;
  /** How far the lifter drops, inches. */
  lifterDrop: number;
  /** Preload with the regrind and the same pushrods, inches; ≤ 0 means lash, not preload. */
  newPreload: number;
  /** Pushrod length increase that restores the original preload, inches. */
  pushrodIncrease: number;
  /** Pushrod length that restores it, inches, when the current length is given. */
  restoredPushrodLength: number | null;
  /** Plunger travel left below the new preload (all of it when there is lash), inches, when plungerTravel is given. */
  plungerTravelLeft: number | null;
  /** True when the new preload sits inside the plunger's travel (above 0, below bottoming). */
  withinPlungerTravel: boolean | null;
}

/** Preload after a regrind and the pushrod change that restores it. */
export function preloadAfterRegrind(input: PreloadInput, prefix?: string): PreloadResult {
  requireObject(prefix ?? 'input', input);
  const original = requireFinite(fieldPath(prefix, 'originalPreload'), input.originalPreload);
  requireThat(original >= 0 && original < 0.25, fieldPath(prefix, 'originalPreload'), 'must be between 0 and 0.25 in', original);
  const stock = requirePositive(fieldPath(prefix, 'stockBaseCircle'), input.stockBaseCircle, 'in');
  const regrind = requirePositive(fieldPath(prefix, 'regrindBaseCircle'), input.regrindBaseCircle, 'in');
  if (!(regrind <= stock)) {
    throw new CalcInputError(fieldPath(prefix, 'regrindBaseCircle'), `must not exceed stockBaseCircle (${stock} in): grinding only removes metal`, regrind);
  }
  const pushrod = input.pushrodLength === undefined ? null : requirePositive(fieldPath(prefix, 'pushrodLength'), input.pushrodLength, 'in');
  const travel = input.plungerTravel === undefined ? null : requirePositive(fieldPath(prefix, 'plungerTravel'), input.plungerTravel, 'in');
  if (travel !== null) {
    if (!(original <= travel)) throw new CalcInputError(fieldPath(prefix, 'originalPreload'), `must not exceed plungerTravel (${travel} in)`, original);
  }
  const baseCircleReduction = stock - regrind;
  const lifterDrop = pushrodChangeRaw(baseCircleReduction);
  const newPreload = original - lifterDrop;
  return {
    baseCircleReduction,
    lifterDrop,
    newPreload,
    pushrodIncrease: lifterDrop,
    restoredPushrodLength: pushrod === null ? null : pushrod + lifterDrop,
    plungerTravelLeft: travel === null ? null : travel - Math.max(0, newPreload),
    withinPlungerTravel: travel === null ? null : newPreload > 0 && newPreload < travel,
  };
}

// ---------------------------------------------------------------------------
// Cleanup: how deep must the cut go, and what lift does it leave room for?

export interface CleanupLobe {
  /** Caller's label, e.g. "3E". */
  id: string;
  /**
   * The lobe's undamaged lift, inches of tappet lift: the stock spec's lobe
   * lift, or the measured max lift of an undamaged sibling.
   */
  lobeLift: number;
  /** How far the damage reaches below the lobe's surface, inches (findWornLobes' damageDepth; 0 = sound). */
  damageDepth: number;
}

export interface CleanupInput {
  lobes: readonly CleanupLobe[];
  /** Metal the shop removes below the deepest damage so the new surface is clean, inches on the radius. */
  cleanupAllowance: number;
  /** Base-circle cut on the diameter to report the largest lift at, inches; default: the cleanup cut. */
  cut?: number;
  /**
   * Largest cut on the diameter the hardened layer allows, inches, as the shop
   * or grinder enters it (it depends on the core's case depth, so it is not a constant).
   */
  largestCut?: number;
}

export interface CleanupResult {
  /** Smallest base-circle cut on the diameter that cleans up every lobe, inches: 2 × max(damage + allowance). */
  cleanupCut: number;
  /** The lobe that sets it. */
  limitingLobe: string;
  /** The cut the largest lift is reported at, inches on the diameter. */
  cut: number;
  /**
   * Largest lobe lift that fits inside every lobe at that cut, inches: the
   * candidate's nose must stay the allowance under the deepest damage,
   * Rb − cut/2 + L ≤ Rb + L_core − damage − allowance, so L ≤ L_core + cut/2 − damage − allowance
   * (the nose bound; regrindEnvelope checks the flanks).
   */
  largestLift: number;
  /** The lobe that sets the largest lift. */
  largestLiftLobe: string;
  /** The entered largest cut, inches, or null. */
  largestCut: number | null;
  /** Whether the cleanup cut is within the entered largest cut; null without one. */
  cleanupWithinLimit: boolean | null;
}

/**
 * Cleanup of a damaged core: the smallest base-circle cut that cleans up every
 * lobe, the largest lobe lift that fits inside the core at a given cut, and the
 * entered hardened-layer limit. Argument shape: CleanupInput (inches).
 */
export function regrindCleanup(input: CleanupInput, prefix?: string): CleanupResult {
  requireObject(prefix ?? 'input', input);
  const lobesField = fieldPath(prefix, 'lobes');
  if (!Array.isArray(input.lobes) || input.lobes.length < 1 || input.lobes.length > 64) {
    throw new CalcInputError(lobesField, 'needs 1 to 64 lobes', input.lobes);
  }
  const allowance = requireInRange(fieldPath(prefix, 'cleanupAllowance'), input.cleanupAllowance, { min: 0, max: 0.25, unit: 'in' });
  const lobes = input.lobes.map((l, i) => {
    const f = `${lobesField}[${i}]`;
    requireObject(f, l);
    return {
      id: String(l.id),
      lobeLift: requireInRange(`${f}.lobeLift`, l.lobeLift, { min: 0, max: 2, minOpen: true, unit: 'in' }),
      damageDepth: requireInRange(`${f}.damageDepth`, l.damageDepth, { min: 0, max: 0.5, unit: 'in' }),
    };
  });
  let need = -Infinity;
  let limitingLobe = '';
  for (const l of lobes) {
    const d = l.damageDepth + allowance;
    if (d > need) {
      need = d;
      limitingLobe = l.id;
    }
  }
  const cleanupCut = 2 * need;
  const cut = input.cut === undefined ? cleanupCut : requireInRange(fieldPath(prefix, 'cut'), input.cut, { min: 0, max: 1, unit: 'in' });
  let largestLift = Infinity;
  let largestLiftLobe = '';
  for (const l of lobes) {
    const lift = l.lobeLift + cut / 2 - l.damageDepth - allowance;
    if (lift < largestLift) {
      largestLift = lift;
      largestLiftLobe = l.id;
    }
  }
  const largestCut = input.largestCut === undefined ? null : requireInRange(fieldPath(prefix, 'largestCut'), input.largestCut, { min: 0, max: 1, unit: 'in' });
  return {
    cleanupCut,
    limitingLobe,
    cut,
    largestLift,
    largestLiftLobe,
    largestCut,
    cleanupWithinLimit: largestCut === null ? null : cleanupCut <= largestCut + 1e-12,
  };
}

// ---------------------------------------------------------------------------
// The lifter side of the cut

export interface LifterCutInput {
  /** Base-circle cut on the diameter, inches. */
  cut: number;
  /** Hydraulic lifter preload with the original cam, inches of plunger travel. */
  originalPreload: number;
  /** Smallest preload the shop accepts, inches (the preload check's minimum). */
  minimumPreload: number;
  /** Current pushrod length, inches (optional). */
  pushrodLength?: number;
  /** The lifter's total plunger travel, inches (optional, from the lifter maker). */
  plungerTravel?: number;
  /** Checking pushrod at zero lash, inches, the preload wanted and which cam it was read on: with all three, the pushrod advice (pushrodForPreload). */
  pushrodCheck?: { checkingLength: number; targetPreload: number; checkedOn: CheckedOn };
}

export interface LifterCutResult {
  /** How far the lifter drops, inches: half the cut (it rides on the base-circle radius). */
  lifterDrop: number;
  /** Preload left with the stock pushrods, inches; ≤ 0 means lash. */
  preloadLeft: number;
  /** Pushrod length that restores the original preload, inches (null without the current length). */
  restoredPushrodLength: number | null;
  /** Pushrod length increase that restores it, inches. */
  pushrodIncrease: number;
  /**
   * Largest cut on the diameter the stock pushrods allow, inches: the plunger
   * extends by the lifter drop, so preload falls to the minimum at cut = 2 × (original − minimum).
   */
  largestCutStockPushrods: number;
  /** Whether this cut leaves at least the minimum preload with stock pushrods. */
  stockPushrodsOk: boolean;
  /** Plunger travel left below the preload (null without plungerTravel), inches. */
  plungerTravelLeft: number | null;
  /** The pushrod length for the target preload (pushrodForPreload), or null without the checking pushrod reading. */
  pushrod: PushrodAdvice | null;
}

/**
 * What a base-circle cut does to a hydraulic lifter (built on preloadAfterRegrind):
 * the lifter drop, the preload left, the pushrod length that restores it and the
 * largest cut the plunger's travel allows with stock pushrods. Argument shape:
 * LifterCutInput (inches).
 */
export function lifterSideOfCut(input: LifterCutInput, prefix?: string): LifterCutResult {
  requireObject(prefix ?? 'input', input);
  const cut = requireInRange(fieldPath(prefix, 'cut'), input.cut, { min: 0, max: 0.99, maxOpen: false, unit: 'in' });
  const minimum = requireInRange(fieldPath(prefix, 'minimumPreload'), input.minimumPreload, { min: 0, max: 0.25, unit: 'in' });
  // a nominal 1 in base circle: only the reduction matters
  const p = preloadAfterRegrind(
    {
      originalPreload: input.originalPreload,
      stockBaseCircle: 1,
      regrindBaseCircle: 1 - cut,
      pushrodLength: input.pushrodLength,
      plungerTravel: input.plungerTravel,
    },
    prefix,
  );
  const largestCutStockPushrods = Math.max(0, 2 * (p.newPreload + p.lifterDrop - minimum));
  return {
    lifterDrop: p.lifterDrop,
    preloadLeft: p.newPreload,
    restoredPushrodLength: p.restoredPushrodLength,
    pushrodIncrease: p.pushrodIncrease,
    largestCutStockPushrods,
    stockPushrodsOk: p.newPreload >= minimum - 1e-12,
    plungerTravelLeft: p.plungerTravelLeft,
    pushrod: input.pushrodCheck ? pushrodForPreload(pushrodCheckInput(input.pushrodCheck, cut, input.pushrodLength), fieldPath(prefix, 'pushrodCheck')) : null,
  };
}

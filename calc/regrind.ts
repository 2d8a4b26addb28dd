/**
 * Regrind geometry: grinding a lobe back to a smaller base circle drops the
 * lifter, which takes preload off a hydraulic lifter with fixed rockers.
 */
import { fieldPath, requireFinite, requirePositive, requireThat } from './errors';

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
  const reduction = requireFinite('baseCircleReduction', input.baseCircleReduction);
  requireThat(reduction >= 0, 'baseCircleReduction', 'must be 0 or more: a regrind cannot grow the base circle', reduction);
  requireThat(reduction < 1, 'baseCircleReduction', 'must be under 1 in: check it is a diameter change, not a diameter', reduction);
  return pushrodChangeRaw(reduction);
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
  const original = requireFinite(fieldPath(prefix, 'originalPreload'), input.originalPreload);
  requireThat(original >= 0 && original < 0.25, fieldPath(prefix, 'originalPreload'), 'must be between 0 and 0.25 in', original);
  const stock = requirePositive(fieldPath(prefix, 'stockBaseCircle'), input.stockBaseCircle, 'in');
  const regrind = requirePositive(fieldPath(prefix, 'regrindBaseCircle'), input.regrindBaseCircle, 'in');
  requireThat(
    regrind <= stock,
    fieldPath(prefix, 'regrindBaseCircle'),
    `must not exceed stockBaseCircle (${stock} in): grinding only removes metal`,
    regrind,
  );
  const pushrod = input.pushrodLength === undefined ? null : requirePositive(fieldPath(prefix, 'pushrodLength'), input.pushrodLength, 'in');
  const travel = input.plungerTravel === undefined ? null : requirePositive(fieldPath(prefix, 'plungerTravel'), input.plungerTravel, 'in');
  if (travel !== null) {
    requireThat(original <= travel, fieldPath(prefix, 'originalPreload'), `must not exceed plungerTravel (${travel} in)`, original);
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

/**
 * Valve events from durations, lobe separation and intake centreline.
 *
 * Conventions (crank degrees): the crank angle θ is 0 at the overlap TDC
 * (the TDC between exhaust and intake strokes), positive after it. The intake
 * lobe peaks at θ = ICL, the exhaust lobe at θ = −ECL. LSA is quoted in cam
 * degrees, so the two lobe centres are 2·LSA crank degrees apart.
 * IVO is °BTDC, IVC °ABDC, EVO °BBDC, EVC °ATDC; a negative value means the
 * event falls on the other side of that dead centre.
 */
import { fieldPath, requireFinite, requireInRange, requireNonNegative, requirePositive, requireThat, requireObject } from './errors';

export interface ValveEventsInput {
  /** Intake duration at one checking height, crank degrees. */
  intakeDuration: number;
  /** Exhaust duration at the same checking height, crank degrees. */
  exhaustDuration: number;
  /** Lobe separation angle, cam degrees. */
  lsa: number;
  /** Intake centreline, crank degrees ATDC. */
  icl: number;
}

export interface ValveEvents {
  /** Intake opens, crank degrees BTDC. */
  ivoBtdc: number;
  /** Intake closes, crank degrees ABDC. */
  ivcAbdc: number;
  /** Exhaust opens, crank degrees BBDC. */
  evoBbdc: number;
  /** Exhaust closes, crank degrees ATDC. */
  evcAtdc: number;
  /** Exhaust centreline, crank degrees BTDC. */
  ecl: number;
  /** Overlap (both valves open around TDC), crank degrees; negative means a gap. */
  overlap: number;
  /** Advance = LSA − ICL, crank degrees; positive is advanced, negative retarded. */
  advance: number;
}

/** Check a duration at a checking height: more than 0 and less than 360 crank degrees. */
export function requireDuration(field: string, value: unknown): number {
  return requireInRange(field, value, { min: 0, max: 360, minOpen: true, maxOpen: true, unit: 'crank degrees' });
}

/** Check a lobe separation angle: more than 0 and less than 180 cam degrees. */
export function requireLsa(field: string, value: unknown): number {
  return requireInRange(field, value, { min: 0, max: 180, minOpen: true, maxOpen: true, unit: 'cam degrees' });
}

/** Check an intake centreline: on the intake stroke, more than 0 and less than 180 °ATDC. */
export function requireIcl(field: string, value: unknown): number {
  return requireInRange(field, value, { min: 0, max: 180, minOpen: true, maxOpen: true, unit: '°ATDC' });
}

/** Unchecked kernel of valveEvents; inputs must already be valid. */
export function valveEventsRaw(intakeDuration: number, exhaustDuration: number, lsa: number, icl: number): ValveEvents {
  const ecl = 2 * lsa - icl;
  const hi = intakeDuration / 2;
  const he = exhaustDuration / 2;
  const ivoBtdc = hi - icl;
  const evcAtdc = he - ecl;
  return {
    ivoBtdc,
    ivcAbdc: icl + hi - 180,
    evoBbdc: ecl + he - 180,
    evcAtdc,
    ecl,
    overlap: ivoBtdc + evcAtdc,
    advance: lsa - icl,
  };
}

/**
 * Valve events at one checking height from the two durations, the LSA and
 * the installed intake centreline. All results in crank degrees.
 */
export function valveEvents(input: ValveEventsInput, prefix?: string): ValveEvents {
  requireObject(prefix ?? 'input', input);
  const di = requireDuration(fieldPath(prefix, 'intakeDuration'), input.intakeDuration);
  const de = requireDuration(fieldPath(prefix, 'exhaustDuration'), input.exhaustDuration);
  const lsa = requireLsa(fieldPath(prefix, 'lsa'), input.lsa);
  const icl = requireIcl(fieldPath(prefix, 'icl'), input.icl);
  return valveEventsRaw(di, de, lsa, icl);
}

export interface EventTimingInput {
  ivoBtdc: number;
  ivcAbdc: number;
  evoBbdc: number;
  evcAtdc: number;
}

export interface EventTiming {
  /** Crank degrees. */
  intakeDuration: number;
  /** Crank degrees. */
  exhaustDuration: number;
  /** Crank degrees ATDC. */
  icl: number;
  /** Crank degrees BTDC. */
  ecl: number;
  /** Cam degrees. */
  lsa: number;
}

/**
 * The inverse of valveEvents: durations, centrelines and LSA from the four
 * opening and closing points (for a card that lists events, not durations).
 */
export function timingFromEvents(input: EventTimingInput): EventTiming {
  requireObject('input', input);
  const ivo = requireFinite('ivoBtdc', input.ivoBtdc);
  const ivc = requireFinite('ivcAbdc', input.ivcAbdc);
  const evo = requireFinite('evoBbdc', input.evoBbdc);
  const evc = requireFinite('evcAtdc', input.evcAtdc);
  const intakeDuration = requireDuration('ivcAbdc', ivo + 180 + ivc);
  const exhaustDuration = requireDuration('evoBbdc', evo + 180 + evc);
  // Intake opens at θ = −IVO and closes at θ = 180 + IVC; the centre is the midpoint.
  const icl = (180 + ivc - ivo) / 2;
  // Exhaust opens at θ = −180 − EVO and closes at θ = EVC; ECL is the midpoint, measured BTDC.
  const ecl = (180 + evo - evc) / 2;
  return { intakeDuration, exhaustDuration, icl, ecl, lsa: (icl + ecl) / 2 };
}

export interface ValveLiftInput {
  /** Lobe (tappet) lift, inches. */
  lobeLift: number;
  /** Rocker ratio, e.g. 1.6. */
  rockerRatio: number;
  /** Valve lash, inches at the valve; 0 for hydraulic lifters. */
  lash: number;
}

/** Unchecked kernel of valveLift. */
export function valveLiftRaw(lobeLift: number, rockerRatio: number, lash: number): number {
  return lobeLift * rockerRatio - lash;
}

/** Net valve lift, inches: lobe lift × rocker ratio − lash. */
export function valveLift(input: ValveLiftInput, prefix?: string): number {
  requireObject(prefix ?? 'input', input);
  const lobe = requirePositive(fieldPath(prefix, 'lobeLift'), input.lobeLift, 'in');
  const ratio = requireInRange(fieldPath(prefix, 'rockerRatio'), input.rockerRatio, { min: 0.5, max: 3, unit: '' });
  const lash = requireNonNegative(fieldPath(prefix, 'lash'), input.lash, 'in');
  const net = valveLiftRaw(lobe, ratio, lash);
  requireThat(net > 0, fieldPath(prefix, 'lash'), `must be less than lobe lift × rocker ratio (${(lobe * ratio).toFixed(4)} in)`, lash);
  return net;
}

/**
 * The full analysis of a cam profile on an engine: valve events at both
 * checking heights, synthesised intake and exhaust lift curves and the piston
 * curve (0.5° steps with velocity and acceleration), piston-to-valve sweep,
 * static and dynamic compression, spring checks, regrind preload and the
 * check results. Inputs are plain JSON; units are inches, cc, crank degrees,
 * lbf and lbf/in throughout.
 */
import {
  checkMaximum,
  checkMinimum,
  checkRange,
  resolveCheckLimits,
  worstStatus,
  type CheckLimitOverrides,
  type CheckLimits,
  type CheckResult,
  type CheckStatus,
  type SkippedCheck,
} from './checks';
import { CC_PER_CUBIC_INCH, CHECKING_HEIGHT_050, CURVE_STEP_DEG, RAD_PER_DEG } from './constants';
import { CalcInputError, requireInRange, requireInteger, requireNonNegative, requirePositive } from './errors';
import { type DegreeResult } from './degree';
import { requireIcl, requireLsa, valveEventsRaw, type ValveEvents } from './events';
import {
  checkCompressionInput,
  dynamicCompressionRaw,
  requireCrank,
  sweptVolumeRaw,
  type Displacement,
  type DynamicCompression,
  type StaticCompression,
} from './geometry';
import {
  createCurveBuffers,
  CYCLE_GRID,
  DEFAULT_MOTION_LAW,
  requireLobeSpec,
  sampleValveCurveRaw,
  synthesizeLobeRaw,
  type CurveBuffers,
  type CurveGrid,
  type LiftCurve,
  type LobeShape,
} from './lift-curve';
import { findWornLobes, type LobeMaxLift, type WornLobeResult } from './measured';
import { requireMotionLaw, type MotionLawName } from './motion';
import { baselineOffsetRaw, ptvSweepRaw, requireBaseline, requireValveAngle, type PtvBaseline, type PtvSweep } from './ptv';
import { preloadAfterRegrind, type PreloadResult } from './regrind';
import { requireSpring, springCheckRaw, type SpringCheck } from './springs';

// ---------------------------------------------------------------------------
// Input (JSON-friendly)

export type LifterType = 'hydraulic-roller' | 'solid-roller' | 'hydraulic-flat' | 'solid-flat';

export const LIFTER_TYPES: readonly LifterType[] = ['hydraulic-roller', 'solid-roller', 'hydraulic-flat', 'solid-flat'];

export interface SpringInput {
  /** Load at installed height, lbf. */
  seatLoad: number;
  /** Rate, lbf/in. */
  rate: number;
  /** Installed height, inches. */
  installedHeight: number;
  /** Coil-bind (solid) height, inches. */
  coilBindHeight: number;
  /** Retainer-to-seal clearance with the valve closed, inches. */
  retainerToSeal: number;
}

export interface EngineInput {
  /** Inches. */
  bore: number;
  /** Inches. */
  stroke: number;
  /** Centre to centre, inches. */
  rodLength: number;
  /** Head chamber volume, cc. */
  chamberCc: number;
  /** Inches. */
  gasketBore: number;
  /** Compressed, inches. */
  gasketThickness: number;
  /** Inches; positive = piston below the deck at TDC. */
  deckClearance: number;
  /** cc; positive = dish or reliefs, negative = dome. */
  pistonCc: number;
  cylinders: number;
  /** Valve angle from the bore axis, degrees; default 0. */
  valveAngle?: number;
  rockerRatioIntake: number;
  rockerRatioExhaust: number;
  lifterType: LifterType;
  spring: SpringInput;
}

export interface LobeInput {
  /** Crank degrees at 0.050 in tappet lift. */
  duration050: number;
  /** Crank degrees at advertisedHeight. */
  advertisedDuration: number;
  /** Inches of tappet lift, below 0.050. */
  advertisedHeight: number;
  /** Inches. */
  lobeLift: number;
  /** Inches at the valve; must be 0 for hydraulic lifters. */
  lash: number;
}

export interface ProfileInput {
  intake: LobeInput;
  exhaust: LobeInput;
  /** Cam degrees. */
  lsa: number;
  /** Installed intake centreline, crank degrees ATDC. */
  icl: number;
  /** Regrind base-circle diameter, inches (optional). */
  baseCircle?: number;
}

export interface PtvBaselineInput {
  intake?: PtvBaseline;
  exhaust?: PtvBaseline;
}

export interface RegrindInput {
  /** Preload with the original cam, inches. */
  originalPreload: number;
  /** Original base-circle diameter, inches. */
  stockBaseCircle: number;
  /** Current pushrod length, inches (optional). */
  pushrodLength?: number;
  /** Lifter plunger travel, inches (optional). */
  plungerTravel?: number;
}

export interface AnalysisInput {
  engine: EngineInput;
  profile: ProfileInput;
  /** Measured PTV baseline with the old cam; without it the PTV checks are skipped. */
  ptvBaseline?: PtvBaselineInput;
  /** Preload data for a regrind on hydraulic lifters. */
  regrind?: RegrindInput;
  /** The shop's own check limits. */
  limits?: CheckLimitOverrides;
  /** Motion law for the synthesised flanks; default poly345. */
  law?: MotionLawName;
}

// ---------------------------------------------------------------------------
// Output

export interface PistonCurve extends CurveGrid {
  /** Inches below TDC. */
  depth: Float64Array;
  /** Inches per crank degree. */
  velocity: Float64Array;
  /** Inches per crank degree². */
  acceleration: Float64Array;
}

export interface LobeAnalysis {
  /** Sheet duration at 0.050 in tappet lift, crank degrees. */
  duration050: number;
  /** Sheet advertised duration, crank degrees. */
  advertisedDuration: number;
  /** Advertised checking height, inches of tappet lift. */
  advertisedHeight: number;
  /** Inches. */
  lobeLift: number;
  rockerRatio: number;
  /** Inches. */
  lash: number;
  /** Net valve lift, inches. */
  valveLift: number;
  /** Crank angle of max lift, degrees ATDC overlap (exhaust is negative: BTDC). */
  centerline: number;
  /** Synthesised seat-to-seat tappet event, crank degrees. */
  seatToSeat: number;
  /** Largest valve velocity, inches per crank degree. */
  peakVelocity: number;
  /** Largest positive (opening) valve acceleration, inches per crank degree². */
  peakAcceleration: number;
  /** Largest negative (nose) valve acceleration, inches per crank degree² (a negative number). */
  peakDeceleration: number;
  curve: LiftCurve;
  spring: SpringCheck & { retainerToSealClearance: number };
}

export interface EventsAtHeight extends ValveEvents {
  /** Intake checking height, inches of tappet lift. */
  intakeHeight: number;
  /** Exhaust checking height, inches of tappet lift. */
  exhaustHeight: number;
}

export interface ProfileAnalysis {
  law: MotionLawName;
  /** Lobe separation angle, cam degrees (as given). */
  lsa: number;
  /** Installed intake centreline, crank degrees ATDC (as given). */
  icl: number;
  events: { at050: EventsAtHeight; advertised: EventsAtHeight };
  intake: LobeAnalysis;
  exhaust: LobeAnalysis;
  piston: PistonCurve;
  displacement: Displacement;
  compression: {
    static: StaticCompression;
    dynamic: DynamicCompression & { ivcAbdc: number; convention: string };
  };
  ptv: { intake: PtvSweep | null; exhaust: PtvSweep | null };
  preload: PreloadResult | null;
  limits: CheckLimits;
  checks: CheckResult[];
  skipped: SkippedCheck[];
  /** The worst check status. */
  status: CheckStatus;
}

// ---------------------------------------------------------------------------
// Validation

interface CheckedLobe {
  shape: LobeShape;
  rockerRatio: number;
  lash: number;
}

interface CheckedInput {
  engine: EngineInput & { valveAngle: number };
  lsa: number;
  icl: number;
  intake: CheckedLobe;
  exhaust: CheckedLobe;
  clearanceCc: number;
  law: MotionLawName;
}

function requireObject(field: string, value: unknown): void {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new CalcInputError(field, 'is required and must be an object', value);
  }
}

function isHydraulic(t: LifterType): boolean {
  return t === 'hydraulic-roller' || t === 'hydraulic-flat';
}

function checkLobe(lobe: LobeInput, rocker: number, hydraulic: boolean, law: MotionLawName, prefix: string): CheckedLobe {
  requireObject(prefix, lobe);
  const spec = requireLobeSpec(lobe, prefix);
  const lash = requireNonNegative(`${prefix}.lash`, lobe.lash, 'in');
  if (hydraulic && lash !== 0) throw new CalcInputError(`${prefix}.lash`, 'must be 0 with hydraulic lifters', lash);
  if (!(rocker * spec.lobeLift - lash > 0)) {
    throw new CalcInputError(`${prefix}.lash`, 'must be less than lobe lift × rocker ratio', lash);
  }
  return { shape: synthesizeLobeRaw(spec, law, prefix), rockerRatio: rocker, lash };
}

function checkInput(input: AnalysisInput): CheckedInput {
  requireObject('input', input);
  requireObject('engine', input.engine);
  requireObject('profile', input.profile);
  const e = input.engine;
  const p = input.profile;
  const law = requireMotionLaw('law', input.law ?? DEFAULT_MOTION_LAW);
  const { clearanceCc } = checkCompressionInput(e, 'engine');
  requireCrank(e, 'engine');
  requireInteger('engine.cylinders', e.cylinders, 1);
  const valveAngle = requireValveAngle('engine.valveAngle', e.valveAngle);
  const ri = requireInRange('engine.rockerRatioIntake', e.rockerRatioIntake, { min: 0.5, max: 3 });
  const rx = requireInRange('engine.rockerRatioExhaust', e.rockerRatioExhaust, { min: 0.5, max: 3 });
  if (!LIFTER_TYPES.includes(e.lifterType)) {
    throw new CalcInputError('engine.lifterType', `must be one of ${LIFTER_TYPES.join(', ')}`, e.lifterType);
  }
  requireObject('engine.spring', e.spring);
  requireSpring(e.spring, 'engine.spring');
  requirePositive('engine.spring.retainerToSeal', e.spring.retainerToSeal, 'in');
  const lsa = requireLsa('profile.lsa', p.lsa);
  const icl = requireIcl('profile.icl', p.icl);
  if (p.baseCircle !== undefined) requirePositive('profile.baseCircle', p.baseCircle, 'in');
  const hydraulic = isHydraulic(e.lifterType);
  const intake = checkLobe(p.intake, ri, hydraulic, law, 'profile.intake');
  const exhaust = checkLobe(p.exhaust, rx, hydraulic, law, 'profile.exhaust');
  for (const [lobe, name] of [
    [intake, 'intake'],
    [exhaust, 'exhaust'],
  ] as const) {
    const lift = lobe.rockerRatio * lobe.shape.lobeLift - lobe.lash;
    if (!(lift < e.spring.installedHeight)) {
      throw new CalcInputError(
        `profile.${name}.lobeLift`,
        `gives ${lift.toFixed(3)} in valve lift, more than the spring's installed height (${e.spring.installedHeight} in)`,
        lobe.shape.lobeLift,
      );
    }
  }
  return { engine: { ...e, valveAngle }, lsa, icl, intake, exhaust, clearanceCc, law };
}

// ---------------------------------------------------------------------------
// Piston curve on the cycle grid (precomputed trig, mirrored halves)

const HALF_STEPS = Math.round(180 / CURVE_STEP_DEG); // samples 0..180° inclusive
const SIN = new Float64Array(HALF_STEPS + 1);
const COS = new Float64Array(HALF_STEPS + 1);
for (let j = 0; j <= HALF_STEPS; j++) {
  SIN[j] = Math.sin(j * CURVE_STEP_DEG * RAD_PER_DEG);
  COS[j] = Math.cos(j * CURVE_STEP_DEG * RAD_PER_DEG);
}
const FULL_TURN = 2 * HALF_STEPS;

/** Unchecked: exact slider-crank depth, velocity and acceleration on CYCLE_GRID. */
function samplePistonCycleRaw(stroke: number, rodLength: number, out: PistonCurve): PistonCurve {
  const r = stroke / 2;
  const r2 = r * r;
  const l2 = rodLength * rodLength;
  const k1 = RAD_PER_DEG;
  const k2 = RAD_PER_DEG * RAD_PER_DEG;
  const { depth, velocity, acceleration, start, step, count } = out;
  // first half turn, 0..180°, written at the grid index of +θ
  const zero = Math.round(-start / step);
  if (step !== CURVE_STEP_DEG || zero !== FULL_TURN || count !== 2 * FULL_TURN + 1) {
    throw new RangeError('samplePistonCycleRaw needs the cycle grid');
  }
  for (let j = 0; j <= HALF_STEPS; j++) {
    const s = SIN[j] ?? 0;
    const c = COS[j] ?? 0;
    const q = Math.sqrt(l2 - r2 * s * s);
    const i = zero + j;
    depth[i] = rodLength + r - r * c - q;
    velocity[i] = (r * s + (r2 * s * c) / q) * k1;
    acceleration[i] = (r * c + (r2 * (c * c - s * s)) / q + (r2 * r2 * s * s * c * c) / (q * q * q)) * k2;
  }
  // 180..360°: depth and acceleration are even about 180°, velocity odd.
  for (let m = HALF_STEPS + 1; m <= FULL_TURN && zero + m < count; m++) {
    const src = zero + FULL_TURN - m;
    depth[zero + m] = depth[src] ?? 0;
    velocity[zero + m] = -(velocity[src] ?? 0);
    acceleration[zero + m] = acceleration[src] ?? 0;
  }
  // before TDC: one full turn earlier is the same motion
  depth.copyWithin(0, FULL_TURN, 2 * FULL_TURN);
  velocity.copyWithin(0, FULL_TURN, 2 * FULL_TURN);
  acceleration.copyWithin(0, FULL_TURN, 2 * FULL_TURN);
  return out;
}

/** Piston depth, velocity and acceleration over the whole cycle grid (−360…+360°, 0.5° steps). */
export function pistonCurve(input: { stroke: number; rodLength: number }): PistonCurve {
  const { stroke, rodLength } = requireCrank(input);
  const n = CYCLE_GRID.count;
  return samplePistonCycleRaw(stroke, rodLength, {
    ...CYCLE_GRID,
    depth: new Float64Array(n),
    velocity: new Float64Array(n),
    acceleration: new Float64Array(n),
  });
}

// ---------------------------------------------------------------------------
// Workspace

/** Reusable buffers for analyzeProfile, so a tight loop allocates no curves. */
export interface AnalysisWorkspace {
  intake: CurveBuffers;
  exhaust: CurveBuffers;
  piston: { depth: Float64Array; velocity: Float64Array; acceleration: Float64Array };
  ptvIntake: Float64Array;
  ptvExhaust: Float64Array;
}

/** The sweep through overlap used by the analysis, crank degrees ATDC. */
export const PTV_SWEEP = { from: -90, to: 90 } as const;
const PTV_I0 = Math.round((PTV_SWEEP.from - CYCLE_GRID.start) / CYCLE_GRID.step);
const PTV_I1 = Math.round((PTV_SWEEP.to - CYCLE_GRID.start) / CYCLE_GRID.step);

/** Fresh buffers for one analysis at a time. */
export function createAnalysisWorkspace(): AnalysisWorkspace {
  const n = CYCLE_GRID.count;
  return {
    intake: createCurveBuffers(n),
    exhaust: createCurveBuffers(n),
    piston: { depth: new Float64Array(n), velocity: new Float64Array(n), acceleration: new Float64Array(n) },
    ptvIntake: new Float64Array(PTV_I1 - PTV_I0 + 1),
    ptvExhaust: new Float64Array(PTV_I1 - PTV_I0 + 1),
  };
}

// ---------------------------------------------------------------------------
// Analysis

/** Check wording, built once (the rule text cache keys on these strings). */
const WHAT = {
  intake: {
    coilBind: 'Coil-bind margin at max intake lift',
    retainerToSeal: 'Retainer-to-seal clearance at max intake lift',
    ptv: 'Piston-to-valve clearance, intake',
  },
  exhaust: {
    coilBind: 'Coil-bind margin at max exhaust lift',
    retainerToSeal: 'Retainer-to-seal clearance at max exhaust lift',
    ptv: 'Piston-to-valve clearance, exhaust',
  },
} as const;

function lobeAnalysis(lobe: CheckedLobe, centerline: number, spring: SpringInput, out: CurveBuffers): LobeAnalysis {
  const curve = sampleValveCurveRaw(lobe.shape, centerline, lobe.rockerRatio, lobe.lash, CYCLE_GRID, out);
  const valveLift = curve.maxLift;
  const s = springCheckRaw(spring, valveLift);
  return {
    duration050: lobe.shape.duration050,
    advertisedDuration: lobe.shape.advertisedDuration,
    advertisedHeight: lobe.shape.advertisedHeight,
    lobeLift: lobe.shape.lobeLift,
    rockerRatio: lobe.rockerRatio,
    lash: lobe.lash,
    valveLift,
    centerline,
    seatToSeat: lobe.shape.seatToSeat,
    peakVelocity: curve.peakVelocity,
    peakAcceleration: curve.peakAcceleration,
    peakDeceleration: curve.peakDeceleration,
    curve,
    spring: {
      openLoad: s.openLoad,
      openHeight: s.openHeight,
      coilBindMargin: s.coilBindMargin,
      retainerToSealClearance: spring.retainerToSeal - valveLift,
    },
  };
}

function withHeights(e: ValveEvents, intakeHeight: number, exhaustHeight: number): EventsAtHeight {
  return {
    ivoBtdc: e.ivoBtdc,
    ivcAbdc: e.ivcAbdc,
    evoBbdc: e.evoBbdc,
    evcAtdc: e.evcAtdc,
    ecl: e.ecl,
    overlap: e.overlap,
    advance: e.advance,
    intakeHeight,
    exhaustHeight,
  };
}

/**
 * Analyse a cam profile on an engine. Throws CalcInputError naming the first
 * bad field (dotted path, e.g. `profile.intake.duration050`).
 *
 * Pass `options.workspace` (from createAnalysisWorkspace) to reuse curve
 * buffers: the returned curves then live in the workspace and are
 * overwritten by the next call that uses it.
 */
export function analyzeProfile(input: AnalysisInput, options?: { workspace?: AnalysisWorkspace }): ProfileAnalysis {
  const c = checkInput(input);
  const limits = resolveCheckLimits(input.limits);
  const ws = options?.workspace ?? createAnalysisWorkspace();
  const e = c.engine;
  const ip = input.profile;

  const at050 = withHeights(
    valveEventsRaw(c.intake.shape.duration050, c.exhaust.shape.duration050, c.lsa, c.icl),
    CHECKING_HEIGHT_050,
    CHECKING_HEIGHT_050,
  );
  const advertised = withHeights(
    valveEventsRaw(c.intake.shape.advertisedDuration, c.exhaust.shape.advertisedDuration, c.lsa, c.icl),
    c.intake.shape.advertisedHeight,
    c.exhaust.shape.advertisedHeight,
  );

  const intake = lobeAnalysis(c.intake, c.icl, e.spring, ws.intake);
  const exhaust = lobeAnalysis(c.exhaust, -at050.ecl, e.spring, ws.exhaust);
  const piston = samplePistonCycleRaw(e.stroke, e.rodLength, {
    start: CYCLE_GRID.start,
    step: CYCLE_GRID.step,
    count: CYCLE_GRID.count,
    depth: ws.piston.depth,
    velocity: ws.piston.velocity,
    acceleration: ws.piston.acceleration,
  });

  const sweptCc = sweptVolumeRaw(e.bore, e.stroke);
  const displacementCc = sweptCc * e.cylinders;
  const displacement: Displacement = {
    cc: displacementCc,
    liters: displacementCc / 1000,
    cubicInches: displacementCc / CC_PER_CUBIC_INCH,
    perCylinderCc: sweptCc,
  };
  const staticCr: StaticCompression = { ratio: (sweptCc + c.clearanceCc) / c.clearanceCc, clearanceCc: c.clearanceCc, sweptCc };
  const ivc = advertised.ivcAbdc;
  if (!(ivc > -90 && ivc < 180)) {
    throw new CalcInputError('profile.icl', `puts intake closing at ${ivc.toFixed(1)}° ABDC, outside the intake and compression strokes`, c.icl);
  }
  const dyn = dynamicCompressionRaw(e.bore, e.stroke, e.rodLength, c.clearanceCc, ivc);
  const convention =
    `IVC taken at the advertised checking height (${c.intake.shape.advertisedHeight} in tappet lift), ` +
    `${ivc.toFixed(1)}° ABDC; trapped volume from the exact slider-crank piston position at IVC`;

  const checks: CheckResult[] = [];
  const skipped: SkippedCheck[] = [];

  // springs
  for (const [name, lobe] of [
    ['intake', intake],
    ['exhaust', exhaust],
  ] as const) {
    checks.push(
      checkMinimum(
        { id: 'coilBind', subject: name, value: lobe.spring.coilBindMargin, unit: 'in', what: WHAT[name].coilBind },
        limits.coilBind,
      ),
      checkMinimum(
        {
          id: 'retainerToSeal',
          subject: name,
          value: lobe.spring.retainerToSealClearance,
          unit: 'in',
          what: WHAT[name].retainerToSeal,
        },
        limits.retainerToSeal,
      ),
    );
  }

  // piston to valve
  const cosAngle = Math.cos(e.valveAngle * RAD_PER_DEG);
  const sweep = (name: 'intake' | 'exhaust', lobe: LobeAnalysis, out: Float64Array): PtvSweep | null => {
    const raw = input.ptvBaseline?.[name];
    const id = name === 'intake' ? 'ptvIntake' : 'ptvExhaust';
    if (raw === undefined || raw === null) {
      skipped.push({ id, subject: name, note: 'not measured: record a PTV baseline with the old cam to run this check' });
      return null;
    }
    requireObject(`ptvBaseline.${name}`, raw);
    const b = requireBaseline(raw, `ptvBaseline.${name}`);
    const offset = baselineOffsetRaw(e.stroke, e.rodLength, cosAngle, b);
    const r = ptvSweepRaw(lobe.curve.lift, piston.depth, CYCLE_GRID.start, CYCLE_GRID.step, PTV_I0, PTV_I1, cosAngle, offset, out);
    checks.push(
      checkMinimum(
        { id, subject: name, value: r.minClearance, unit: 'in', what: WHAT[name].ptv },
        name === 'intake' ? limits.ptvIntake : limits.ptvExhaust,
      ),
    );
    return r;
  };
  const ptv = { intake: sweep('intake', intake, ws.ptvIntake), exhaust: sweep('exhaust', exhaust, ws.ptvExhaust) };

  // dynamic compression
  checks.push(
    checkMaximum(
      { id: 'dynamicCompression', subject: 'engine', value: dyn.ratio, unit: ':1', what: 'Dynamic compression' },
      limits.dynamicCompression,
    ),
  );

  // regrind preload
  let preload: PreloadResult | null = null;
  if (!isHydraulic(e.lifterType)) {
    skipped.push({ id: 'hydraulicPreload', subject: 'lifters', note: 'solid lifters: set lash instead of preload' });
  } else if (input.regrind === undefined || ip.baseCircle === undefined) {
    skipped.push({
      id: 'hydraulicPreload',
      subject: 'lifters',
      note: 'not measured: give the original preload, the stock base circle and the regrind base circle',
    });
  } else {
    requireObject('regrind', input.regrind);
    preload = preloadAfterRegrind({ ...input.regrind, regrindBaseCircle: ip.baseCircle }, 'regrind');
    checks.push(
      checkRange(
        { id: 'hydraulicPreload', subject: 'lifters', value: preload.newPreload, unit: 'in', what: 'Lifter preload with the regrind' },
        limits.hydraulicPreload,
      ),
    );
  }

  return {
    law: c.law,
    lsa: c.lsa,
    icl: c.icl,
    events: { at050, advertised },
    intake,
    exhaust,
    piston,
    displacement,
    compression: {
      static: staticCr,
      dynamic: { ratio: dyn.ratio, effectiveStroke: dyn.effectiveStroke, trappedSweptCc: dyn.trappedSweptCc, ivcAbdc: ivc, convention },
    },
    ptv,
    preload,
    limits,
    checks,
    skipped,
    status: worstStatus(checks),
  };
}

// ---------------------------------------------------------------------------
// JSON

type Jsonify<T> = T extends Float64Array
  ? number[]
  : T extends (infer U)[]
    ? Jsonify<U>[]
    : T extends object
      ? { [K in keyof T]: Jsonify<T[K]> }
      : T;

/** ProfileAnalysis with every curve as a plain number array. */
export type ProfileAnalysisJson = Jsonify<ProfileAnalysis>;

function toJson(value: unknown): unknown {
  if (value instanceof Float64Array) return Array.from(value);
  if (Array.isArray(value)) return value.map(toJson);
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) out[k] = toJson(v);
    return out;
  }
  return value;
}

/** A deep copy safe for JSON.stringify (curves become number arrays). */
export function analysisToJson(analysis: ProfileAnalysis): ProfileAnalysisJson {
  return toJson(analysis) as ProfileAnalysisJson;
}

// ---------------------------------------------------------------------------
// Checks that use measurements outside the profile analysis

/** Check a degreed-in cam against the sheet (|measured ICL − sheet ICL|). */
export function checkDegreeing(result: DegreeResult, overrides?: CheckLimitOverrides): CheckResult {
  const limits = resolveCheckLimits(overrides);
  return checkMaximum(
    { id: 'degreeing', subject: 'intake', value: Math.abs(result.difference), unit: '°', what: 'Installed ICL difference from the sheet' },
    limits.degreeing,
  );
}

/** Run worn-lobe detection with the shop's threshold and return one check per lobe. */
export function checkWornLobes(
  lobes: readonly LobeMaxLift[],
  overrides?: CheckLimitOverrides,
): { result: WornLobeResult; checks: CheckResult[] } {
  const limits = resolveCheckLimits(overrides);
  const result = findWornLobes({ lobes, threshold: limits.wornLobe.max });
  const checks = result.lobes.map((row) =>
    checkMaximum(
      { id: 'wornLobe', subject: row.id, value: Math.max(0, row.shortfall), unit: 'in', what: 'Max lift below the median of its siblings' },
      limits.wornLobe,
    ),
  );
  return { result, checks };
}

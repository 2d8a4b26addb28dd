/**
 * The full analysis of a cam profile on an engine: valve events at both
 * checking heights, synthesised intake and exhaust lift curves and the piston
 * curve (0.5° steps with velocity and acceleration), piston-to-valve sweep,
 * static and dynamic compression, spring checks, regrind preload and the
 * check results. Inputs are plain JSON; units are inches, cc, crank degrees,
 * lbf and lbf/in throughout.
 */
import {
  checkMaximumRaw,
  checkMinimumRaw,
  checkRangeRaw,
  resolveCheckLimits,
  worstStatus,
  type CheckLimitOverrides,
  type CheckLimits,
  type CheckResult,
  type CheckStatus,
  type MaximumRule,
  type MinimumRule,
  type SkippedCheck,
} from './checks';
import { CC_PER_CUBIC_INCH, CHECKING_HEIGHT_050, CURVE_STEP_DEG, RAD_PER_DEG } from './constants';
import { ENVELOPE_CRITERION, symmetricCurvatureRaw, symmetricPressureAngleRaw, type FlankPeak, type SymmetricFlank } from './cam-geometry';
import { CalcInputError, requireInRange, requireInteger, requireNonNegative, requireObject, requirePositive } from './errors';
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
  createLobeTable,
  CYCLE_GRID,
  fillTurnLiftRaw,
  lobeTableRaw,
  LOBE_LAW,
  offsetAtLiftRaw,
  requireLobeSpec,
  sampleValveCurveRaw,
  synthesizeLobeRaw,
  type CurveBuffers,
  type CurveGrid,
  type LiftCurve,
  type LobeLawName,
  type LobeShape,
  type LobeSpec,
} from './lift-curve';
import { baselineOffsetRaw, ptvSweepRaw, requireBaseline, requireValveAngle, type PtvBaseline, type PtvSweep } from './ptv';
import { lifterSideOfCut, preloadAfterRegrind, regrindCleanup, type CheckedOn, type CleanupResult, type LifterCutResult, type PreloadResult } from './regrind';
import { requireSpring, springCheckRaw, type SpringCheck } from './springs';

const DEG_PER_RAD = 180 / Math.PI;

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
  /** The checking pushrod at zero lash, the preload wanted and which cam it was read on (optional): gives the pushrod advice. */
  pushrodCheck?: { checkingLength: number; targetPreload: number; checkedOn: CheckedOn };
}

/** The core the candidate is ground from: its stock sheet (the lobes before wear) and base circle. */
export interface CoreInput {
  /** The core's stock intake lobe, as its sheet gives it (crank degrees, inches of tappet lift). */
  intake: LobeSpec;
  /** The core's stock exhaust lobe. */
  exhaust: LobeSpec;
  /** The core's lobe separation, cam degrees. */
  lsa: number;
  /** The core's intake centreline, crank degrees ATDC. */
  icl: number;
  /** The core's base-circle diameter, inches. */
  baseCircle: number;
  /** Deepest damage on each kind of lobe, inches (findWornLobes' damageDepth); absent = sound. */
  damageDepth?: { intake?: number; exhaust?: number };
}

/** The shop's and the grinder's numbers for grinding (inches; product settings). */
export interface GrindingInput {
  /** Lifter roller diameter, inches (roller lifters; needed for pressure angle and curvature). */
  rollerDiameter?: number;
  /** Grinding wheel diameter, inches: a concave flank tighter than its radius cannot be ground. */
  wheelDiameter?: number;
  /** Metal removed below the deepest damage so the new surface is clean, inches on the radius. */
  cleanupAllowance?: number;
  /** Largest base-circle cut on the diameter the hardened layer allows, inches, as entered. */
  largestCut?: number;
}

export interface AnalysisInput {
  engine: EngineInput;
  profile: ProfileInput;
  /** Measured PTV baseline with the old cam; without it the PTV checks are skipped. */
  ptvBaseline?: PtvBaselineInput;
  /** Preload data for a regrind on hydraulic lifters. */
  regrind?: RegrindInput;
  /** The core the profile is ground from; without it the envelope is skipped. */
  core?: CoreInput;
  /** Follower and grinding numbers. */
  grinding?: GrindingInput;
  /** The shop's own check limits. */
  limits?: CheckLimitOverrides;
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

/** Cam geometry of one candidate lobe (cam degrees from the lobe centre, negative = opening flank). */
export interface LobeGeometry {
  /** Pressure angle peaks on the rise and the fall, degrees (roller only). */
  pressureAngle: { rise: FlankPeak; fall: FlankPeak } | null;
  /** Curvature extremes, inches. */
  curvature: {
    follower: 'roller' | 'flat';
    /** Smallest convex pitch radius (roller). */
    minPitch: FlankPeak | null;
    /** Smallest convex surface radius; ≤ 0 = undercut. */
    minSurface: FlankPeak;
    /** Tightest concave surface radius, or null when no flank is concave. */
    concave: FlankPeak | null;
    undercut: boolean;
    /** A concave flank tighter than the wheel's radius; null without a wheel diameter. */
    wheelTooLarge: boolean | null;
  } | null;
  /** Material margin against the core's lobe, inches on the radius (null without a core). */
  envelope: {
    /** Cam degrees of margin[0] from the candidate's lobe centre (−180: the whole turn). */
    start: number;
    /** Cam degrees between samples. */
    step: number;
    margin: Float64Array;
    /** Smallest margin, inches, and its cam angle from the candidate's lobe centre. */
    minMargin: number;
    minAt: number;
    /** Candidate centreline minus the core's, cam degrees. */
    phase: number;
    inside: boolean;
    finishingStock: number;
    status: 'pass' | 'fail';
  } | null;
}

export interface Feasibility {
  /** Base-circle cut on the diameter, inches (core or stock base circle minus the profile's), or null. */
  cut: number | null;
  /** Base-circle diameter of the candidate, inches, or null. */
  baseCircle: number | null;
  intake: LobeGeometry;
  exhaust: LobeGeometry;
  /** Cleanup of the core's damage (needs the core's damage depth and the cleanup allowance). */
  cleanup: CleanupResult | null;
  /** What the cut does to the lifters (hydraulic, with the regrind preload data). */
  lifter: LifterCutResult | null;
  /** How the envelope is judged. */
  criterion: string;
}

export interface ProfileAnalysis {
  law: LobeLawName;
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
    /** Intake closing at one reference valve lift for every sheet (DYNAMIC_CR_REFERENCE). */
    dynamic: DynamicCompression & {
      ivcAbdc: number;
      /** Reference valve lift, inches (lash included for solid lifters). */
      referenceLift: number;
      convention: string;
      source: string;
      /** The common figure beside it: intake closing at 0.050 in tappet lift plus 15°. */
      at050Plus15: DynamicCompression & { ivcAbdc: number; convention: string; source: string };
    };
  };
  feasibility: Feasibility;
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
}

function isHydraulic(t: LifterType): boolean {
  return t === 'hydraulic-roller' || t === 'hydraulic-flat';
}

function checkLobe(lobe: LobeInput, rocker: number, hydraulic: boolean, prefix: string): CheckedLobe {
  requireObject(prefix, lobe);
  const spec = requireLobeSpec(lobe, prefix);
  const lash = requireNonNegative(`${prefix}.lash`, lobe.lash, 'in');
  if (hydraulic && lash !== 0) throw new CalcInputError(`${prefix}.lash`, 'must be 0 with hydraulic lifters', lash);
  if (!(rocker * spec.lobeLift - lash > 0)) {
    throw new CalcInputError(`${prefix}.lash`, 'must be less than lobe lift × rocker ratio', lash);
  }
  return { shape: synthesizeLobeRaw(spec, prefix), rockerRatio: rocker, lash };
}

function checkInput(input: AnalysisInput): CheckedInput {
  requireObject('input', input);
  requireObject('engine', input.engine);
  requireObject('profile', input.profile);
  const e = input.engine;
  const p = input.profile;
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
  const intake = checkLobe(p.intake, ri, hydraulic, 'profile.intake');
  const exhaust = checkLobe(p.exhaust, rx, hydraulic, 'profile.exhaust');
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
  return { engine: { ...e, valveAngle }, lsa, icl, intake, exhaust, clearanceCc };
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
// sin θ·cos θ, sin²θ and cos²θ − sin²θ on the same half turn
const SIN_COS = new Float64Array(HALF_STEPS + 1);
const SIN2 = new Float64Array(HALF_STEPS + 1);
const COS2_SIN2 = new Float64Array(HALF_STEPS + 1);
for (let j = 0; j <= HALF_STEPS; j++) {
  const s = SIN[j] ?? 0;
  const c = COS[j] ?? 0;
  SIN_COS[j] = s * c;
  SIN2[j] = s * s;
  COS2_SIN2[j] = c * c - s * s;
}

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
  const r4 = r2 * r2;
  for (let j = 0; j <= HALF_STEPS; j++) {
    const sc = SIN_COS[j] ?? 0;
    const q = Math.sqrt(l2 - r2 * (SIN2[j] ?? 0));
    const iq = 1 / q;
    const i = zero + j;
    depth[i] = rodLength + r - r * (COS[j] ?? 0) - q;
    velocity[i] = (r * (SIN[j] ?? 0) + r2 * sc * iq) * k1;
    acceleration[i] = (r * (COS[j] ?? 0) + r2 * (COS2_SIN2[j] ?? 0) * iq + r4 * sc * sc * iq * iq * iq) * k2;
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
  requireObject('input', input);
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
  /** The valve curves; each also keeps its lobe's flank table, which the cam geometry reads. */
  intake: CurveBuffers;
  exhaust: CurveBuffers;
  piston: { depth: Float64Array; velocity: Float64Array; acceleration: Float64Array };
  ptvIntake: Float64Array;
  ptvExhaust: Float64Array;
  /** The core's tappet lift on CAM_GRID, inches, in the candidate's frame. */
  coreLift: { intake: Float64Array; exhaust: Float64Array };
  marginIntake: Float64Array;
  marginExhaust: Float64Array;
  /** The last core lobes fitted, kept while the core's sheet repeats (one core, several candidates). */
  cores: { intake: LobeShape | null; exhaust: LobeShape | null };
}

/** The core's lobe shape, reused from the workspace when its sheet is the same as last time. */
function coreShape(ws: AnalysisWorkspace, name: 'intake' | 'exhaust', spec: LobeSpec): LobeShape {
  const last = ws.cores[name];
  if (
    last !== null &&
    last.duration050 === spec.duration050 &&
    last.advertisedDuration === spec.advertisedDuration &&
    last.advertisedHeight === spec.advertisedHeight &&
    last.lobeLift === spec.lobeLift
  ) {
    return last;
  }
  const shape = synthesizeLobeRaw(spec, `core.${name}`);
  ws.cores[name] = shape;
  return shape;
}

/**
 * The grid cam geometry and the envelope use: a whole cam turn in 1 cam-degree
 * steps, in cam degrees from the candidate lobe's centre (index 180 is the nose).
 */
export const CAM_GRID: CurveGrid = { start: -180, step: 1, count: 360 };
const CAM_CENTRE = 180;
/** Crank degrees per cam degree. */
const CRANK_PER_CAM = 2;

/**
 * The candidate lobe's flank as cam geometry reads it: `reach` cam degrees
 * from the nose at 1° steps. It is the valve curve's own table (0.5 crank
 * degree = every fourth entry is a cam degree) when the valve curve sampled
 * one; otherwise the table is filled at 1 cam degree.
 */
function camFlank(shape: LobeShape, reach: number, buffers: CurveBuffers): SymmetricFlank {
  const valveStep = CYCLE_GRID.step;
  const last = buffers.table ?? createLobeTable(reach + 1);
  const stride = CRANK_PER_CAM / valveStep;
  const table =
    last.shape === shape && last.step === valveStep
      ? lobeTableRaw(shape, valveStep, reach * stride + 1, last)
      : lobeTableRaw(shape, CRANK_PER_CAM, reach + 1, last);
  buffers.table = table;
  return {
    lift: table.lift,
    speed: table.velocity,
    acceleration: table.acceleration,
    count: table.count,
    stride: table.step === valveStep ? stride : 1,
    // crank-degree derivatives ×2 and ×4 per cam degree
    velocityScale: CRANK_PER_CAM,
    accelerationScale: CRANK_PER_CAM * CRANK_PER_CAM,
  };
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
    coreLift: { intake: new Float64Array(CAM_GRID.count), exhaust: new Float64Array(CAM_GRID.count) },
    marginIntake: new Float64Array(CAM_GRID.count),
    marginExhaust: new Float64Array(CAM_GRID.count),
    cores: { intake: null, exhaust: null },
  };
}

// ---------------------------------------------------------------------------
// Analysis

/**
 * Where dynamic compression takes intake closing: one valve lift for every
 * sheet, so two sheets' figures compare whatever heights their makers quote.
 */
export const DYNAMIC_CR_REFERENCE = Object.freeze({
  /** Valve lift, inches (rocker ratio and lash included). */
  valveLift: 0.006,
  source: 'the 0.006 in checking height of SAE J604 (from memory), taken at the valve so that rocker ratio and lash count',
});

const DYNAMIC_CR_WHAT = `Dynamic compression, intake closing at ${DYNAMIC_CR_REFERENCE.valveLift} in valve lift`;

const DYNAMIC_CR_CONVENTION =
  `IVC taken at ${DYNAMIC_CR_REFERENCE.valveLift} in valve lift, the same for every sheet: the intake lobe's closing point at ` +
  `(${DYNAMIC_CR_REFERENCE.valveLift} in + lash) / rocker ratio of tappet lift; trapped volume from the exact slider-crank ` +
  'piston position at IVC';

/**
 * Rules built from a number the input carries (the wheel radius, the cleanup
 * cut, the entered largest cut), shared while the number repeats so the rule
 * wording is built once per value.
 */
const DERIVED_RULES = new Map<string, Map<number, MinimumRule | MaximumRule>>();

function derivedRule(kind: 'min' | 'max', limit: number, source: string): MinimumRule | MaximumRule {
  let bySource = DERIVED_RULES.get(source);
  if (bySource === undefined) {
    bySource = new Map();
    DERIVED_RULES.set(source, bySource);
  }
  let rule = bySource.get(limit);
  if (rule === undefined) {
    if (bySource.size > 512) bySource.clear();
    rule = kind === 'min' ? { min: limit, watchBand: 0, source } : { max: limit, watchBand: 0, source };
    bySource.set(limit, rule);
  }
  return rule;
}

const WHEEL_SOURCE = "the grinding wheel's radius: a wheel cannot grind a concave flank tighter than itself";
const CLEANUP_SOURCE = "the deepest damage plus the shop's cleanup allowance, on the radius";
const LARGEST_CUT_SOURCE = "entered by the shop or grinder for this core's hardened layer";

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

const NO_GEOMETRY: LobeGeometry = Object.freeze({ pressureAngle: null, curvature: null, envelope: null });

const WHAT_GEOMETRY = {
  intake: {
    pressureAngle: 'Largest pressure angle, intake lobe',
    undercut: 'Smallest convex cam radius, intake lobe',
    wheel: 'Tightest concave flank radius, intake lobe',
    stock: 'Smallest material margin to the core, intake lobe',
  },
  exhaust: {
    pressureAngle: 'Largest pressure angle, exhaust lobe',
    undercut: 'Smallest convex cam radius, exhaust lobe',
    wheel: 'Tightest concave flank radius, exhaust lobe',
    stock: 'Smallest material margin to the core, exhaust lobe',
  },
} as const;

function optionalInRange(field: string, value: unknown, min: number, max: number): number | null {
  return value === undefined || value === null ? null : requireInRange(field, value, { min, max, minOpen: min === 0, unit: 'in' });
}

/** What lobeGeometry needs from feasibilityOf, built once per analysis. */
interface GeometryContext {
  ws: AnalysisWorkspace;
  limits: CheckLimits;
  checks: CheckResult[];
  skipped: SkippedCheck[];
  /** Notes about what is missing only once the caller asks about the core or the grinding at all. */
  asked: boolean;
  grinding: GrindingInput | undefined;
  roller: boolean;
  rollerDiameter: number | null;
  wheelDiameter: number | null;
  /** Candidate base-circle diameter, inches. */
  baseCircle: number | null;
  /** Base-circle cut on the diameter, inches. */
  cut: number | null;
}

function skip(ctx: GeometryContext, entry: SkippedCheck): void {
  if (ctx.asked) ctx.skipped.push(entry);
}

/**
 * Pressure angle, curvature and the envelope of one candidate lobe. Every
 * sample comes from the lobe's one flank table (the valve curve's), read on
 * CAM_GRID in cam degrees from the candidate's nose.
 */
function lobeGeometry(
  ctx: GeometryContext,
  name: 'intake' | 'exhaust',
  lobe: CheckedLobe,
  centreCam: number,
  coreLobe: LobeShape | null,
  coreCentre: number,
): LobeGeometry {
  const { baseCircle, grinding, roller, rollerDiameter, wheelDiameter, cut, limits, checks, ws } = ctx;
  if (baseCircle === null) {
    if (name === 'intake') skip(ctx, { id: 'finishingStock', subject: 'core', note: 'not measured: give the regrind base circle' });
    return NO_GEOMETRY;
  }
  if (grinding === undefined && coreLobe === null) return NO_GEOMETRY;
  const shape = lobe.shape;
  const { start, step, count } = CAM_GRID;
  // the event plus one base-circle sample each side (the base circle's curvature counts too)
  const halfCam = shape.halfEvent / CRANK_PER_CAM;
  const from = Math.max(0, Math.ceil(CAM_CENTRE - halfCam) - 1);
  const to = Math.min(count - 1, Math.floor(CAM_CENTRE + halfCam) + 1);
  // the event is shorter than half a turn, so [from, to] is symmetric about the nose
  const reach = Math.max(CAM_CENTRE - from, to - CAM_CENTRE);
  const flank = camFlank(shape, reach, name === 'intake' ? ws.intake : ws.exhaust);
  const nose = start + CAM_CENTRE * step;
  const rb = baseCircle / 2;
  let pressure: LobeGeometry['pressureAngle'] = null;
  let curvature: LobeGeometry['curvature'] = null;
  if (grinding === undefined) {
    // no follower numbers asked for: no geometry
  } else if (roller && rollerDiameter === null) {
    skip(ctx, { id: 'pressureAngle', subject: name, note: 'not measured: give the lifter roller diameter' });
  } else {
    const rr = roller ? (rollerDiameter ?? 0) / 2 : 0;
    if (roller) {
      const p = symmetricPressureAngleRaw(flank, reach, nose, step, rb + rr);
      pressure = {
        rise: { value: Math.atan(p.riseTan) * DEG_PER_RAD, at: p.riseAt },
        fall: { value: Math.atan(p.fallTan) * DEG_PER_RAD, at: p.fallAt },
      };
      checks.push(
        checkMaximumRaw(
          { id: 'pressureAngle', subject: name, value: Math.max(pressure.rise.value, pressure.fall.value), unit: '°', what: WHAT_GEOMETRY[name].pressureAngle },
          limits.pressureAngle,
        ),
      );
    }
    const x = symmetricCurvatureRaw(flank, reach, nose, step, rb, rr);
    const concave = x.concaveCurvature > 0 ? { value: 1 / x.concaveCurvature, at: x.concaveAt } : null;
    curvature = {
      follower: roller ? 'roller' : 'flat',
      minPitch: roller ? { value: x.minPitch, at: x.minPitchAt } : null,
      minSurface: { value: x.minSurface, at: x.minSurfaceAt },
      concave,
      undercut: x.undercut,
      wheelTooLarge: wheelDiameter === null ? null : concave !== null && concave.value < wheelDiameter / 2,
    };
    checks.push(checkMinimumRaw({ id: 'undercut', subject: name, value: x.minSurface, unit: 'in', what: WHAT_GEOMETRY[name].undercut }, limits.undercut));
    if (concave !== null && wheelDiameter !== null) {
      checks.push(
        checkMinimumRaw(
          { id: 'grindingWheel', subject: name, value: concave.value, unit: 'in', what: WHAT_GEOMETRY[name].wheel },
          derivedRule('min', wheelDiameter / 2, WHEEL_SOURCE) as MinimumRule,
        ),
      );
    }
  }
  let envelope: LobeGeometry['envelope'] = null;
  if (coreLobe !== null && cut !== null) {
    const coreLift = ws.coreLift[name];
    // index j is j − 180 cam degrees from the candidate's centre, so centreCam − coreCentre + j − 180 from the core's
    const phase = centreCam - coreCentre;
    fillTurnLiftRaw(coreLobe, CAM_CENTRE - phase, CRANK_PER_CAM * CAM_GRID.step, coreLift);
    const margin = name === 'intake' ? ws.marginIntake : ws.marginExhaust;
    const { lift: tl, count: tn, stride } = flank;
    let minMargin = Infinity;
    let minI = 0;
    const half = cut / 2;
    for (let i = 0; i < count; i++) {
      const d = i < CAM_CENTRE ? CAM_CENTRE - i : i - CAM_CENTRE;
      const j = d * stride;
      const m = half + (coreLift[i] ?? 0) - (j < tn ? (tl[j] ?? 0) : 0);
      margin[i] = m;
      if (m < minMargin) {
        minMargin = m;
        minI = i;
      }
    }
    const stock = limits.finishingStock.min;
    envelope = {
      start,
      step,
      margin,
      minMargin,
      minAt: minI - CAM_CENTRE,
      phase,
      inside: minMargin >= -1e-12,
      finishingStock: stock,
      status: minMargin >= stock - 1e-12 ? 'pass' : 'fail',
    };
    checks.push(checkMinimumRaw({ id: 'finishingStock', subject: name, value: minMargin, unit: 'in', what: WHAT_GEOMETRY[name].stock }, limits.finishingStock));
  } else if (name === 'intake') {
    skip(ctx, {
      id: 'finishingStock',
      subject: 'core',
      note: "not measured: give the core's stock lobes and base circle, and the regrind base circle",
    });
  }
  return { pressureAngle: pressure, curvature, envelope };
}

/**
 * The core question of a regrind: does the candidate fit inside the core at
 * this cut, can the lobes be ground and followed, and what does the cut do to
 * the lifters? Adds its checks and skipped notes to the lists.
 */
function feasibilityOf(
  input: AnalysisInput,
  c: CheckedInput,
  limits: CheckLimits,
  ws: AnalysisWorkspace,
  checks: CheckResult[],
  skipped: SkippedCheck[],
): Feasibility {
  const e = c.engine;
  const roller = e.lifterType === 'hydraulic-roller' || e.lifterType === 'solid-roller';
  const g = input.grinding;
  if (g !== undefined) requireObject('grinding', g);
  const rollerDiameter = optionalInRange('grinding.rollerDiameter', g?.rollerDiameter, 0, 4);
  const wheelDiameter = optionalInRange('grinding.wheelDiameter', g?.wheelDiameter, 0, 60);
  const allowance =
    g?.cleanupAllowance === undefined ? null : requireInRange('grinding.cleanupAllowance', g.cleanupAllowance, { min: 0, max: 0.25, unit: 'in' });
  const largestCut = g?.largestCut === undefined ? null : requireInRange('grinding.largestCut', g.largestCut, { min: 0, max: 1, unit: 'in' });
  const baseCircle = input.profile.baseCircle ?? null;
  const asked = input.core !== undefined || g !== undefined;

  // the core, when given
  const core = input.core;
  let coreIntake: LobeShape | null = null;
  let coreExhaust: LobeShape | null = null;
  let coreIcl = 0;
  let coreEcl = 0;
  let coreBase: number | null = null;
  if (core !== undefined) {
    requireObject('core', core);
    coreIntake = coreShape(ws, 'intake', requireLobeSpec(core.intake, 'core.intake'));
    coreExhaust = coreShape(ws, 'exhaust', requireLobeSpec(core.exhaust, 'core.exhaust'));
    const lsa = requireLsa('core.lsa', core.lsa);
    coreIcl = requireIcl('core.icl', core.icl);
    coreEcl = 2 * lsa - coreIcl;
    coreBase = requireInRange('core.baseCircle', core.baseCircle, { min: 0, max: 6, minOpen: true, unit: 'in' });
  }
  const stockBase = coreBase ?? input.regrind?.stockBaseCircle ?? null;
  let cut: number | null = null;
  if (stockBase !== null && baseCircle !== null) {
    cut = stockBase - baseCircle;
    if (!(cut >= -1e-12)) {
      throw new CalcInputError('profile.baseCircle', `must not exceed the core's base circle (${stockBase} in): grinding only removes metal`, baseCircle);
    }
    cut = Math.max(0, cut);
  }

  const ctx: GeometryContext = { ws, limits, checks, skipped, asked, grinding: g, roller, rollerDiameter, wheelDiameter, baseCircle, cut };
  const ecl = 2 * c.lsa - c.icl;
  const intake = lobeGeometry(ctx, 'intake', c.intake, c.icl / 2, coreIntake, coreIcl / 2);
  const exhaust = lobeGeometry(ctx, 'exhaust', c.exhaust, -ecl / 2, coreExhaust, -coreEcl / 2);

  // cleanup of the damage
  let cleanup: CleanupResult | null = null;
  const damage = core?.damageDepth;
  if (core !== undefined && coreIntake !== null && coreExhaust !== null && damage !== undefined && allowance !== null && cut !== null) {
    requireObject('core.damageDepth', damage);
    cleanup = regrindCleanup(
      {
        lobes: [
          { id: 'intake', lobeLift: coreIntake.lobeLift, damageDepth: damage.intake ?? 0 },
          { id: 'exhaust', lobeLift: coreExhaust.lobeLift, damageDepth: damage.exhaust ?? 0 },
        ],
        cleanupAllowance: allowance,
        cut,
        largestCut: largestCut ?? undefined,
      },
      'core',
    );
    checks.push(
      checkMinimumRaw(
        { id: 'cleanup', subject: cleanup.limitingLobe, value: cut, unit: 'in', what: 'Base-circle cut against the cut that cleans up the damage' },
        derivedRule('min', cleanup.cleanupCut, CLEANUP_SOURCE) as MinimumRule,
      ),
    );
  } else {
    skip(ctx, { id: 'cleanup', subject: 'core', note: "not measured: give the core's damage depth and the cleanup allowance" });
  }
  if (largestCut !== null && cut !== null) {
    checks.push(
      checkMaximumRaw(
        { id: 'largestCut', subject: 'core', value: cut, unit: 'in', what: 'Base-circle cut against the largest the hardened layer allows' },
        derivedRule('max', largestCut, LARGEST_CUT_SOURCE) as MaximumRule,
      ),
    );
  } else {
    skip(ctx, { id: 'largestCut', subject: 'core', note: 'not entered: the shop or grinder gives the largest cut the hardened layer allows' });
  }

  // the lifter side
  let lifter: LifterCutResult | null = null;
  const r = input.regrind;
  if (cut !== null && r !== undefined && isHydraulic(e.lifterType)) {
    lifter = lifterSideOfCut(
      {
        cut,
        originalPreload: r.originalPreload,
        minimumPreload: Math.max(0, limits.hydraulicPreload.min),
        pushrodLength: r.pushrodLength,
        plungerTravel: r.plungerTravel,
        ...(r.pushrodCheck ? { pushrodCheck: r.pushrodCheck } : {}),
      },
      'regrind',
    );
  }

  return { cut, baseCircle, intake, exhaust, cleanup, lifter, criterion: ENVELOPE_CRITERION };
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

  const at050 = withHeights(valveEventsRaw(c.intake.shape.duration050, c.exhaust.shape.duration050, c.lsa, c.icl), CHECKING_HEIGHT_050, CHECKING_HEIGHT_050);
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
  // Dynamic compression: intake closing at one reference valve lift for every sheet.
  const refTappet = (DYNAMIC_CR_REFERENCE.valveLift + c.intake.lash) / c.intake.rockerRatio;
  if (!(refTappet < c.intake.shape.lobeLift)) {
    throw new CalcInputError(
      'profile.intake.lobeLift',
      `never opens the valve past the ${DYNAMIC_CR_REFERENCE.valveLift} in reference lift`,
      c.intake.shape.lobeLift,
    );
  }
  const ivc = c.icl + offsetAtLiftRaw(c.intake.shape, refTappet) - 180;
  const ivc050 = at050.ivcAbdc + 15;
  for (const v of [ivc, ivc050]) {
    if (!(v > -90 && v < 180)) {
      throw new CalcInputError('profile.icl', `puts intake closing at ${v.toFixed(1)}° ABDC, outside the intake and compression strokes`, c.icl);
    }
  }
  const dyn = dynamicCompressionRaw(e.bore, e.stroke, e.rodLength, c.clearanceCc, ivc);
  const dyn050 = dynamicCompressionRaw(e.bore, e.stroke, e.rodLength, c.clearanceCc, ivc050);
  const convention = DYNAMIC_CR_CONVENTION;

  const checks: CheckResult[] = [];
  const skipped: SkippedCheck[] = [];

  // springs
  for (const [name, lobe] of [
    ['intake', intake],
    ['exhaust', exhaust],
  ] as const) {
    checks.push(
      checkMinimumRaw({ id: 'coilBind', subject: name, value: lobe.spring.coilBindMargin, unit: 'in', what: WHAT[name].coilBind }, limits.coilBind),
      checkMinimumRaw(
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
      checkMinimumRaw({ id, subject: name, value: r.minClearance, unit: 'in', what: WHAT[name].ptv }, name === 'intake' ? limits.ptvIntake : limits.ptvExhaust),
    );
    return r;
  };
  const ptv = { intake: sweep('intake', intake, ws.ptvIntake), exhaust: sweep('exhaust', exhaust, ws.ptvExhaust) };

  // dynamic compression
  checks.push(checkMaximumRaw({ id: 'dynamicCompression', subject: 'engine', value: dyn.ratio, unit: ':1', what: DYNAMIC_CR_WHAT }, limits.dynamicCompression));

  // regrind preload
  let preload: PreloadResult | null = null;
  if (!isHydraulic(e.lifterType)) {
    skipped.push({ id: 'hydraulicPreload', subject: 'lifters', note: 'solid lifters: set lash instead of preload', notApplicable: true });
  } else if (input.regrind === undefined || ip.baseCircle === undefined) {
    skipped.push({
      id: 'hydraulicPreload',
      subject: 'lifters',
      note: 'not measured: give the original preload, the stock base circle and the regrind base circle',
    });
  } else {
    requireObject('regrind', input.regrind);
    const r = input.regrind;
    preload = preloadAfterRegrind(
      {
        originalPreload: r.originalPreload,
        stockBaseCircle: r.stockBaseCircle,
        regrindBaseCircle: ip.baseCircle,
        pushrodLength: r.pushrodLength,
        plungerTravel: r.plungerTravel,
      },
      'regrind',
    );
    checks.push(
      checkRangeRaw(
        { id: 'hydraulicPreload', subject: 'lifters', value: preload.newPreload, unit: 'in', what: 'Lifter preload with the regrind' },
        limits.hydraulicPreload,
      ),
    );
  }

  const feasibility = feasibilityOf(input, c, limits, ws, checks, skipped);

  return {
    law: LOBE_LAW,
    lsa: c.lsa,
    icl: c.icl,
    events: { at050, advertised },
    intake,
    exhaust,
    piston,
    displacement,
    compression: {
      static: staticCr,
      dynamic: {
        ratio: dyn.ratio,
        effectiveStroke: dyn.effectiveStroke,
        trappedSweptCc: dyn.trappedSweptCc,
        ivcAbdc: ivc,
        referenceLift: DYNAMIC_CR_REFERENCE.valveLift,
        convention,
        source: DYNAMIC_CR_REFERENCE.source,
        at050Plus15: {
          ratio: dyn050.ratio,
          effectiveStroke: dyn050.effectiveStroke,
          trappedSweptCc: dyn050.trappedSweptCc,
          ivcAbdc: ivc050,
          convention: 'IVC at 0.050 in tappet lift plus 15°',
          source: 'common practice, no source',
        },
      },
    },
    feasibility,
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

type Jsonify<T> = T extends Float64Array ? number[] : T extends (infer U)[] ? Jsonify<U>[] : T extends object ? { [K in keyof T]: Jsonify<T[K]> } : T;

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

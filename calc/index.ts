/**
 * Lobewright calc kernel: cam, valvetrain and compression math.
 * Units inside: inches, cc, crank degrees (cam degrees for LSA), lbf, lbf/in.
 * Pure: no React, Expo, I/O or clock.
 */
export { CalcInputError, isCalcInputError } from './errors';
export { CC_PER_CUBIC_INCH, CHECKING_HEIGHT_050, CURVE_STEP_DEG } from './constants';
export {
  ccToCubicInches,
  cubicInchesToCc,
  DISPLAY_UNITS,
  inchesToMm,
  lbfPerInchToNPerMm,
  lbfToNewtons,
  mmToInches,
  newtonsToLbf,
  nPerMmToLbfPerInch,
  type UnitSystem,
} from './units';
export {
  timingFromEvents,
  valveEvents,
  valveLift,
  type EventTiming,
  type EventTimingInput,
  type ValveEvents,
  type ValveEventsInput,
  type ValveLiftInput,
} from './events';
export {
  displacement,
  dynamicCompression,
  pistonDepth,
  pistonMotion,
  staticCompression,
  sweptVolume,
  type CrankInput,
  type Displacement,
  type DynamicCompression,
  type DynamicCompressionInput,
  type PistonMotion,
  type StaticCompression,
  type StaticCompressionInput,
} from './geometry';
export { MOTION_LAWS, motionLaw, motionLawInverse, type MotionLawName, type MotionLawPoint } from './motion';
export {
  CYCLE_GRID,
  DEFAULT_MOTION_LAW,
  lobeLiftAt,
  RAMP_MAX,
  synthesizeLiftCurve,
  synthesizeLobe,
  type CurveGrid,
  type LiftCurve,
  type LobePoint,
  type LobeShape,
  type LobeSpec,
  type SynthesizeCurveInput,
} from './lift-curve';
export {
  analyzeLiftTable,
  durationAtHeight,
  findWornLobes,
  liftCurveFromTable,
  type LiftReading,
  type LiftTableAnalysis,
  type LiftTableDuration,
  type LiftTableInput,
  type LobeMaxLift,
  type WornLobeResult,
  type WornLobeRow,
} from './measured';
export { centerlineFromReadings, degreeCam, type CamCorrection, type DegreeResult, type EqualLiftReadings } from './degree';
export {
  helicalSpringRate,
  retainerToSealMargin,
  springCheck,
  type HelicalSpringInput,
  type RetainerToSealInput,
  type SpringCheck,
  type SpringCheckInput,
} from './springs';
export { preloadAfterRegrind, pushrodChangeForRegrind, type PreloadInput, type PreloadResult } from './regrind';
export { ptvSweep, type PtvBaseline, type PtvSweep, type PtvSweepInput, type SampledLift } from './ptv';
export {
  checkMaximum,
  checkMinimum,
  checkRange,
  DEFAULT_CHECK_LIMITS,
  resolveCheckLimits,
  SHOP_SOURCE,
  worstStatus,
  type CheckId,
  type CheckLimitOverrides,
  type CheckLimits,
  type CheckResult,
  type CheckStatus,
  type MaximumRule,
  type MinimumRule,
  type RangeRule,
  type SkippedCheck,
} from './checks';
export {
  checkDegreeing,
  checkWornLobes,
  analysisToJson,
  analyzeProfile,
  createAnalysisWorkspace,
  LIFTER_TYPES,
  pistonCurve,
  PTV_SWEEP,
  type AnalysisInput,
  type AnalysisWorkspace,
  type EngineInput,
  type EventsAtHeight,
  type LifterType,
  type LobeAnalysis,
  type LobeInput,
  type PistonCurve,
  type ProfileAnalysis,
  type ProfileAnalysisJson,
  type ProfileInput,
  type PtvBaselineInput,
  type RegrindInput,
  type SpringInput,
} from './analysis';
export {
  compareProfilesForOwner,
  OWNER_CAUTIONS,
  profileDifferences,
  type OwnerComparison,
  type OwnerComparisonInput,
  type OwnerPoint,
  type OwnerTopic,
  type ProfileDifferences,
} from './compare';
export { DEMO_ANALYSIS_INPUT, DEMO_ENGINE, DEMO_STOCK_REGRIND, DEMO_TOWING } from './demo';

/**
 * Demo data (invented for Lobewright's demo scenario; not a real engine,
 * cam or part). A 5.9 L pushrod V8 on hydraulic rollers, with a stock-spec
 * regrind and a mild towing profile. Used by tests, the bench and seeds.
 */
import type { AnalysisInput, CoreInput, EngineInput, GrindingInput, ProfileInput } from './analysis';

export const DEMO_ENGINE: EngineInput = {
  bore: 4.03,
  stroke: 3.6,
  rodLength: 6,
  chamberCc: 68,
  gasketBore: 4.1,
  gasketThickness: 0.04,
  deckClearance: 0.01,
  pistonCc: 5,
  cylinders: 8,
  valveAngle: 18,
  rockerRatioIntake: 1.6,
  rockerRatioExhaust: 1.6,
  lifterType: 'hydraulic-roller',
  spring: { seatLoad: 115, rate: 320, installedHeight: 1.8, coilBindHeight: 1.15, retainerToSeal: 0.64 },
};

export const DEMO_STOCK_REGRIND: ProfileInput = {
  intake: { duration050: 204, advertisedDuration: 262, advertisedHeight: 0.006, lobeLift: 0.305, lash: 0 },
  exhaust: { duration050: 210, advertisedDuration: 268, advertisedHeight: 0.006, lobeLift: 0.315, lash: 0 },
  lsa: 114,
  icl: 110,
  baseCircle: 1.2,
};

export const DEMO_TOWING: ProfileInput = {
  intake: { duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333, lash: 0 },
  exhaust: { duration050: 220, advertisedDuration: 278, advertisedHeight: 0.006, lobeLift: 0.34, lash: 0 },
  lsa: 112,
  icl: 108,
  baseCircle: 1.2,
};

/** A full analysis input: the towing profile with a PTV baseline and regrind preload data. */
export const DEMO_ANALYSIS_INPUT: AnalysisInput = {
  engine: DEMO_ENGINE,
  profile: DEMO_TOWING,
  ptvBaseline: {
    intake: { clearance: 0.29, crankAngle: 0, valveLift: 0 },
    exhaust: { clearance: 0.31, crankAngle: 0, valveLift: 0 },
  },
  regrind: { originalPreload: 0.045, stockBaseCircle: 1.24, pushrodLength: 7.4 },
};

/**
 * The demo's core: the engine's original cam, as its stock sheet describes it
 * (the stock regrind copies these lobes onto a smaller base circle). Cylinder
 * 3's exhaust lobe is galled 0.012 in deep (the demo lobe table).
 */
export const DEMO_CORE: CoreInput = {
  intake: { duration050: 204, advertisedDuration: 262, advertisedHeight: 0.006, lobeLift: 0.305 },
  exhaust: { duration050: 210, advertisedDuration: 268, advertisedHeight: 0.006, lobeLift: 0.315 },
  lsa: 114,
  icl: 110,
  baseCircle: 1.24,
  damageDepth: { exhaust: 0.012 },
};

/** The demo shop's grinding numbers (invented): roller, wheel, cleanup allowance and the largest cut. */
export const DEMO_GRINDING: GrindingInput = {
  rollerDiameter: 0.75,
  wheelDiameter: 14,
  cleanupAllowance: 0.005,
  largestCut: 0.06,
};

/** The towing profile judged against the demo core, with the grinding numbers. */
export const DEMO_FEASIBILITY_INPUT: AnalysisInput = { ...DEMO_ANALYSIS_INPUT, core: DEMO_CORE, grinding: DEMO_GRINDING };

import { engineSchema, springSchema, type EngineSpec, type LifterTypeName } from '@/shared/engine';
import { draftsFor, rangeOf, type NumberDraft, type NumberSpec } from '@/lib/number-draft';

const range = rangeOf;

const shape = engineSchema.shape;
const spring = springSchema.shape;

/** The engine's number fields in form order, with ranges taken from shared/engine's schema. */
export const engineNumberSpecs = {
  cylinders: { path: 'cylinders', label: 'Cylinders', quantity: null, unit: 'cyl', digits: 0, integer: true, ...range(shape.cylinders) },
  bore: { path: 'bore', label: 'Bore', quantity: 'length', unit: 'in', digits: 3, ...range(shape.bore) },
  stroke: { path: 'stroke', label: 'Stroke', quantity: 'length', unit: 'in', digits: 3, ...range(shape.stroke) },
  rodLength: {
    path: 'rodLength',
    label: 'Rod length',
    quantity: 'length',
    unit: 'in',
    digits: 3,
    hint: 'Centre to centre',
    ...range(shape.rodLength),
  },
  pistonCc: {
    path: 'pistonCc',
    label: 'Piston dome/dish',
    quantity: 'volume',
    unit: 'cc',
    digits: 1,
    hint: 'Dish and valve reliefs are positive, a dome is negative',
    ...range(shape.pistonCc),
  },
  deckClearance: {
    path: 'deckClearance',
    label: 'Deck clearance',
    quantity: 'length',
    unit: 'in',
    digits: 3,
    hint: 'Piston below the deck at TDC is positive',
    ...range(shape.deckClearance),
  },
  chamberCc: { path: 'chamberCc', label: 'Chamber volume', quantity: 'volume', unit: 'cc', digits: 1, ...range(shape.chamberCc) },
  gasketBore: {
    path: 'gasketBore',
    label: 'Head gasket bore',
    quantity: 'length',
    unit: 'in',
    digits: 3,
    hint: 'At least the cylinder bore',
    ...range(shape.gasketBore),
  },
  gasketThickness: {
    path: 'gasketThickness',
    label: 'Head gasket thickness',
    quantity: 'length',
    unit: 'in',
    digits: 3,
    hint: 'Compressed',
    ...range(shape.gasketThickness),
  },
  valveAngle: {
    path: 'valveAngle',
    label: 'Valve angle',
    quantity: null,
    unit: '°',
    digits: 0,
    hint: 'Valve stem to the bore axis',
    ...range(shape.valveAngle),
  },
  rockerRatioIntake: {
    path: 'rockerRatioIntake',
    label: 'Intake rocker ratio',
    quantity: null,
    unit: ':1',
    digits: 2,
    ...range(shape.rockerRatioIntake),
  },
  rockerRatioExhaust: {
    path: 'rockerRatioExhaust',
    label: 'Exhaust rocker ratio',
    quantity: null,
    unit: ':1',
    digits: 2,
    ...range(shape.rockerRatioExhaust),
  },
  seatLoad: {
    path: 'spring.seatLoad',
    label: 'Seat load',
    quantity: 'force',
    unit: 'lbf',
    digits: 0,
    hint: 'Load at the installed height, valve closed',
    ...range(spring.seatLoad),
  },
  rate: { path: 'spring.rate', label: 'Spring rate', quantity: 'rate', unit: 'lbf/in', digits: 0, ...range(spring.rate) },
  installedHeight: {
    path: 'spring.installedHeight',
    label: 'Installed height',
    quantity: 'length',
    unit: 'in',
    digits: 3,
    hint: 'Seat to retainer, valve closed',
    ...range(spring.installedHeight),
  },
  coilBindHeight: {
    path: 'spring.coilBindHeight',
    label: 'Coil-bind height',
    quantity: 'length',
    unit: 'in',
    digits: 3,
    hint: 'Solid height; must be below the installed height',
    ...range(spring.coilBindHeight),
  },
  retainerToSeal: {
    path: 'spring.retainerToSeal',
    label: 'Retainer-to-seal at seat',
    quantity: 'length',
    unit: 'in',
    digits: 3,
    hint: 'Clearance with the valve closed',
    ...range(spring.retainerToSeal),
  },
} as const satisfies Record<string, NumberSpec>;

export type EngineNumberKey = keyof typeof engineNumberSpecs;
export const engineNumberList: readonly NumberSpec[] = Object.values(engineNumberSpecs);

/** The engine form's values: number drafts plus the lifter type and firing order as chosen. */
export type EngineDraft = {
  cylinders: NumberDraft;
  bore: NumberDraft;
  stroke: NumberDraft;
  rodLength: NumberDraft;
  chamberCc: NumberDraft;
  gasketBore: NumberDraft;
  gasketThickness: NumberDraft;
  deckClearance: NumberDraft;
  pistonCc: NumberDraft;
  valveAngle: NumberDraft;
  rockerRatioIntake: NumberDraft;
  rockerRatioExhaust: NumberDraft;
  lifterType: LifterTypeName;
  firingOrder: string;
  spring: {
    seatLoad: NumberDraft;
    rate: NumberDraft;
    installedHeight: NumberDraft;
    coilBindHeight: NumberDraft;
    retainerToSeal: NumberDraft;
  };
};

/** Every path the engine form shows, for placing server errors. */
export const engineFieldPaths: readonly string[] = [...engineNumberList.map((s) => s.path), 'lifterType', 'firingOrder'];

/** The form's starting values: the saved engine, or blanks on hydraulic rollers when none is saved. */
export function engineDraftFrom(engine: EngineSpec | null | undefined): EngineDraft {
  return {
    ...(draftsFor(engineNumberList, engine) as Omit<EngineDraft, 'lifterType' | 'firingOrder'>),
    lifterType: engine?.lifterType ?? 'hydraulic-roller',
    firingOrder: engine?.firingOrder ?? '',
  };
}

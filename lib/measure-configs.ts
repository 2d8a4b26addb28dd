import type { MeasureConfig, MeasureNumber } from '@/lib/measure-fields';
import { rangeOf, type Quantity } from '@/lib/number-draft';
import { degreeSchema, ptvBaselineSchema, pushrodSchema, springsSchema } from '@/shared/measurements';

type Bounded = Parameters<typeof rangeOf>[0];
type Shown = { quantity: Quantity | null; unit: string; digits: number };

/** Lengths follow the unit toggle and save in inches; loads and rates too. Degrees keep their unit. */
const inches: Shown = { quantity: 'length', unit: 'in', digits: 3 };
const lbf: Shown = { quantity: 'force', unit: 'lbf', digits: 0 };
const lbfPerIn: Shown = { quantity: 'rate', unit: 'lbf/in', digits: 0 };
const degrees = (unit: string): Shown => ({ quantity: null, unit, digits: 0 });

/** A number field with its range from the shared schema, so the form and the server agree. */
function num(key: string, label: string, schema: Bounded, shown: Shown, more: Partial<MeasureNumber> = {}): MeasureNumber {
  return { key, label, ...shown, ...rangeOf(schema), ...more };
}

const ptv = ptvBaselineSchema.shape.intake.element.shape;
const ptvColumns = [
  num('crankAngle', 'Crank angle', ptv.crankAngle, degrees('° ATDC'), { hint: 'Before TDC is negative, e.g. −10' }),
  num('clearance', 'Clearance', ptv.clearance, inches),
  num('valveLift', 'Old cam valve lift there', ptv.valveLift, inches, { hint: 'Blank if not measured: PTV is then not run', optional: true }),
];

/** Piston-to-valve clearance with the old cam, per valve, at one or more crank angles. */
export const ptvConfig: MeasureConfig = {
  kind: 'ptv-baseline',
  choice: {
    key: 'method',
    label: 'How it was measured',
    choices: [
      { value: 'clay', label: 'Clay' },
      { value: 'checking-springs', label: 'Checking springs and indicator' },
    ],
  },
  groups: [
    { key: 'intake', title: 'Intake valve', rowName: 'Reading', columns: ptvColumns },
    { key: 'exhaust', title: 'Exhaust valve', rowName: 'Reading', columns: ptvColumns },
  ],
  blank: { method: 'clay', intake: [{ crankAngle: -10 }], exhaust: [{ crankAngle: 10 }] },
};

const spring = springsSchema.shape.springs.element.shape;

/** Valve springs as installed: per valve, per head, or one set for all. */
export const springsConfig: MeasureConfig = {
  kind: 'springs',
  groups: [
    {
      key: 'springs',
      title: 'Springs',
      rowName: 'Spring',
      columns: [
        { key: 'where', label: 'Which valve or head', text: true, hint: 'e.g. 3E or left head' },
        num('installedHeight', 'Installed height', spring.installedHeight, inches),
        num('seatLoad', 'Seat load', spring.seatLoad, lbf),
        num('rate', 'Spring rate', spring.rate, lbfPerIn),
        num('coilBindHeight', 'Coil-bind height', spring.coilBindHeight, inches),
        num('retainerToSeal', 'Retainer-to-seal at seat', spring.retainerToSeal, inches),
      ],
    },
  ],
  blank: { springs: [{ where: '' }] },
};

const pushrod = pushrodSchema.shape;

/** Checking pushrod, lifter plunger travel and preload. */
export const pushrodConfig: MeasureConfig = {
  kind: 'pushrod',
  choice: {
    key: 'checkedOn',
    label: 'Checking pushrod read on',
    choices: [
      { value: 'old-cam', label: 'The old cam' },
      { value: 'reground-cam', label: 'The reground cam' },
    ],
  },
  scalars: [
    num('checkingLength', 'Checking pushrod at zero lash', pushrod.checkingLength, inches),
    num('currentLength', 'Pushrod in the engine', pushrod.currentLength, inches, { hint: 'Blank if not known', optional: true }),
    num('plungerTravel', 'Lifter plunger travel', pushrod.plungerTravel, inches),
    num('targetPreload', 'Target preload', pushrod.targetPreload, inches),
    num('originalPreload', 'Preload with the old cam', pushrod.originalPreload, inches, { hint: 'Blank if not measured', optional: true }),
    num('stockBaseCircle', 'Stock base circle', pushrod.stockBaseCircle, inches),
  ],
  blank: {},
};

const degree = degreeSchema.shape;

/** Degree-wheel readings at cam install: piston stops and equal lift on both intake flanks. */
export const degreeConfig: MeasureConfig = {
  kind: 'degree',
  scalars: [
    num('stopBefore', 'Piston stop before TDC', degree.stopBefore, degrees('° BTDC')),
    num('stopAfter', 'Piston stop after TDC', degree.stopAfter, degrees('° ATDC')),
    num('checkingLift', 'Dial reading on both flanks', degree.checkingLift, inches, { hint: 'e.g. 0.050' }),
    num('openingAngle', 'Opening-flank angle', degree.openingAngle, degrees('° ATDC')),
    num('closingAngle', 'Closing-flank angle', degree.closingAngle, degrees('° ATDC')),
  ],
  blank: { checkingLift: 0.05 },
};

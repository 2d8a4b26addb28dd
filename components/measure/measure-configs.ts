import type { MeasureConfig } from '@/components/measure/measure-form';

const ptvColumns = [
  { key: 'crankAngle', label: 'Crank angle', unit: '° ATDC', hint: 'Before TDC is negative, e.g. −10' },
  { key: 'clearance', label: 'Clearance', unit: 'in' },
  { key: 'valveLift', label: 'Old cam valve lift there', unit: 'in', hint: 'Leave blank if not measured', blank: 'default' as const },
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
  blank: {
    choice: 'clay',
    scalars: {},
    rows: {
      intake: [{ crankAngle: '-10', clearance: '', valveLift: '' }],
      exhaust: [{ crankAngle: '10', clearance: '', valveLift: '' }],
    },
  },
};

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
        { key: 'installedHeight', label: 'Installed height', unit: 'in' },
        { key: 'seatLoad', label: 'Seat load', unit: 'lbf' },
        { key: 'rate', label: 'Spring rate', unit: 'lbf/in' },
        { key: 'coilBindHeight', label: 'Coil-bind height', unit: 'in' },
        { key: 'retainerToSeal', label: 'Retainer-to-seal at seat', unit: 'in' },
      ],
    },
  ],
  blank: {
    choice: '',
    scalars: {},
    rows: { springs: [{ where: '', installedHeight: '', seatLoad: '', rate: '', coilBindHeight: '', retainerToSeal: '' }] },
  },
};

/** Checking pushrod, lifter plunger travel and preload. */
export const pushrodConfig: MeasureConfig = {
  kind: 'pushrod',
  scalars: [
    { key: 'checkingLength', label: 'Checking pushrod at zero lash', unit: 'in' },
    { key: 'currentLength', label: 'Pushrod in the engine', unit: 'in', hint: 'Blank if not known', blank: 'null' },
    { key: 'plungerTravel', label: 'Lifter plunger travel', unit: 'in' },
    { key: 'targetPreload', label: 'Target preload', unit: 'in' },
    { key: 'originalPreload', label: 'Preload with the old cam', unit: 'in', hint: 'Blank if not measured', blank: 'null' },
    { key: 'stockBaseCircle', label: 'Stock base circle', unit: 'in' },
  ],
  blank: {
    choice: '',
    scalars: { checkingLength: '', currentLength: '', plungerTravel: '', targetPreload: '', originalPreload: '', stockBaseCircle: '' },
    rows: {},
  },
};

/** Degree-wheel readings at cam install: piston stops and equal lift on both intake flanks. */
export const degreeConfig: MeasureConfig = {
  kind: 'degree',
  scalars: [
    { key: 'stopBefore', label: 'Piston stop before TDC', unit: '° BTDC' },
    { key: 'stopAfter', label: 'Piston stop after TDC', unit: '° ATDC' },
    { key: 'checkingLift', label: 'Dial reading on both flanks', unit: 'in', hint: 'e.g. 0.050' },
    { key: 'openingAngle', label: 'Opening-flank angle', unit: '° ATDC' },
    { key: 'closingAngle', label: 'Closing-flank angle', unit: '° ATDC' },
  ],
  blank: {
    choice: '',
    scalars: { stopBefore: '', stopAfter: '', checkingLift: '0.050', openingAngle: '', closingAngle: '' },
    rows: {},
  },
};

import type { ProfileAnalysis } from '@/calc/analysis';
import { eventAngle, type EventSide } from '@/lib/event-angle';

/** Which way a change is worth pointing out to a builder: up, down, or no change at the shown precision. */
export type Trend = 'up' | 'down' | 'same';

export type CompareRow = {
  key: string;
  group: string;
  label: string;
  unit: string;
  digits: number;
  /** A valve event or centreline: the dead centre it counts from, and its cells name the side (never a negative figure). */
  side?: EventSide;
  value: (a: ProfileAnalysis) => number;
};

const events = (height: 'at050' | 'advertised', title: string): CompareRow[] => [
  { key: `${height}.ivo`, group: title, label: 'IVO', unit: '', side: 'BTDC', digits: 1, value: (a) => a.events[height].ivoBtdc },
  { key: `${height}.ivc`, group: title, label: 'IVC', unit: '', side: 'ABDC', digits: 1, value: (a) => a.events[height].ivcAbdc },
  { key: `${height}.evo`, group: title, label: 'EVO', unit: '', side: 'BBDC', digits: 1, value: (a) => a.events[height].evoBbdc },
  { key: `${height}.evc`, group: title, label: 'EVC', unit: '', side: 'ATDC', digits: 1, value: (a) => a.events[height].evcAtdc },
  { key: `${height}.overlap`, group: title, label: 'Overlap', unit: '°', digits: 1, value: (a) => a.events[height].overlap },
];

/** The rows of the side-by-side comparison, in the order a builder reads a cam card. */
export const compareRows: readonly CompareRow[] = [
  { key: 'dur050.i', group: 'Duration', label: 'Intake at 0.050 in', unit: '°', digits: 1, value: (a) => a.intake.duration050 },
  { key: 'dur050.e', group: 'Duration', label: 'Exhaust at 0.050 in', unit: '°', digits: 1, value: (a) => a.exhaust.duration050 },
  { key: 'adv.i', group: 'Duration', label: 'Intake advertised', unit: '°', digits: 1, value: (a) => a.intake.advertisedDuration },
  { key: 'adv.e', group: 'Duration', label: 'Exhaust advertised', unit: '°', digits: 1, value: (a) => a.exhaust.advertisedDuration },
  ...events('at050', 'Events at 0.050 in'),
  ...events('advertised', 'Events at advertised height'),
  { key: 'lsa', group: 'Centrelines', label: 'LSA', unit: '° cam', digits: 1, value: (a) => a.lsa },
  { key: 'icl', group: 'Centrelines', label: 'ICL', unit: '', side: 'ATDC', digits: 1, value: (a) => a.icl },
  { key: 'ecl', group: 'Centrelines', label: 'ECL', unit: '', side: 'BTDC', digits: 1, value: (a) => a.events.at050.ecl },
  { key: 'advance', group: 'Centrelines', label: 'Advance', unit: '°', digits: 1, value: (a) => a.events.at050.advance },
  { key: 'lobe.i', group: 'Lift', label: 'Intake lobe lift', unit: 'in', digits: 3, value: (a) => a.intake.lobeLift },
  { key: 'lobe.e', group: 'Lift', label: 'Exhaust lobe lift', unit: 'in', digits: 3, value: (a) => a.exhaust.lobeLift },
  { key: 'valve.i', group: 'Lift', label: 'Intake valve lift', unit: 'in', digits: 3, value: (a) => a.intake.valveLift },
  { key: 'valve.e', group: 'Lift', label: 'Exhaust valve lift', unit: 'in', digits: 3, value: (a) => a.exhaust.valveLift },
  { key: 'cr.static', group: 'Compression', label: 'Static CR', unit: ':1', digits: 2, value: (a) => a.compression.static.ratio },
  { key: 'cr.dynamic', group: 'Compression', label: 'Dynamic CR', unit: ':1', digits: 2, value: (a) => a.compression.dynamic.ratio },
  { key: 'open.i', group: 'Springs at max lift', label: 'Intake open load', unit: 'lbf', digits: 0, value: (a) => a.intake.spring.openLoad },
  { key: 'open.e', group: 'Springs at max lift', label: 'Exhaust open load', unit: 'lbf', digits: 0, value: (a) => a.exhaust.spring.openLoad },
  { key: 'bind.i', group: 'Springs at max lift', label: 'Intake coil-bind margin', unit: 'in', digits: 3, value: (a) => a.intake.spring.coilBindMargin },
  { key: 'bind.e', group: 'Springs at max lift', label: 'Exhaust coil-bind margin', unit: 'in', digits: 3, value: (a) => a.exhaust.spring.coilBindMargin },
  {
    key: 'seal.i',
    group: 'Springs at max lift',
    label: 'Intake retainer-to-seal',
    unit: 'in',
    digits: 3,
    value: (a) => a.intake.spring.retainerToSealClearance,
  },
  {
    key: 'seal.e',
    group: 'Springs at max lift',
    label: 'Exhaust retainer-to-seal',
    unit: 'in',
    digits: 3,
    value: (a) => a.exhaust.spring.retainerToSealClearance,
  },
];

/** A value as the table prints it: fixed decimals, a true minus sign. */
export function formatValue(value: number, digits: number): string {
  const text = value.toFixed(digits);
  return Number(text) === 0 ? (0).toFixed(digits) : text.replace('-', '−');
}

/** What a row's cell shows for one profile: an event on its side of the dead centre, any other figure as a number. */
export function cellText(row: CompareRow, a: ProfileAnalysis): string {
  const value = row.value(a);
  return row.side ? eventAngle(value, row.side, row.digits) : formatValue(value, row.digits);
}

/** The change from the first profile, rounded to the row's precision, with its direction. */
export function delta(base: number, value: number, digits: number): { text: string; trend: Trend } {
  const d = Number((value - base).toFixed(digits));
  if (d === 0) return { text: 'same', trend: 'same' };
  return { text: `${d > 0 ? '+' : '−'}${Math.abs(d).toFixed(digits)}`, trend: d > 0 ? 'up' : 'down' };
}

/**
 * The degree-wheel read-out in words, from calc's one path (degreeFromReadings):
 * the measurements screen shows it live as the tech types, and the fit checks
 * show the same words from the run they stored.
 */
import { degreeFromReadings, installedIcl, trueTdcOffsetRaw, type DegreeReading } from '@/calc/degree';
import { isCalcInputError } from '@/calc/errors';

const deg = (v: number) => `${v.toFixed(1).replace(/^-/, '−')}°`;

/** How a sheet revision is named beside its ICL, the same on every screen: "Towing regrind rev 2". */
export const revisionName = (title: string, number: number) => `${title} rev ${number}`;

/** The measured ICL, e.g. "104.0° ATDC". */
export const iclText = (d: Pick<DegreeReading, 'measuredIcl'>) => `${deg(d.measuredIcl)} ATDC`;

/** Where true TDC sits on the wheel and what the flank readings are corrected by. */
export function trueTdcText(offset: number): string {
  return offset === 0
    ? '0.0°: the pointer is on true TDC'
    : `${deg(Math.abs(offset))} ${offset > 0 ? 'ATDC' : 'BTDC'} on the wheel: the flank readings are corrected by it`;
}

/** The correction against the sheet, e.g. "4.0° earlier than Towing rev 2 (108.0°): retard the cam 4.0°." */
export function correctionText(d: DegreeReading, sheetName: string | null): string {
  const sheet = `${sheetName ?? 'the sheet'} (${deg(d.sheetIcl)})`;
  return d.correction === 'none'
    ? `Within ${d.tolerance}° of ${sheet}: no correction needed.`
    : `${deg(Math.abs(d.difference))} ${d.difference > 0 ? 'later' : 'earlier'} than ${sheet}: ${d.correction} the cam ${deg(d.correctionDegrees)}.`;
}

/** The readings as typed so far, crank degrees; null while blank or not a number. */
export type TypedReadings = {
  stopBefore: number | null;
  stopAfter: number | null;
  openingAngle: number | null;
  closingAngle: number | null;
};

export type DegreeReadoutView = {
  trueTdc: string;
  icl: string;
  /** Set when the flank angles cannot give a centreline. */
  problem: string | null;
  comparison: string | null;
  reading: DegreeReading | null;
};

/** The live read-out: true TDC from the stops, then the corrected ICL and the correction once all four readings are in. */
export function degreeReadout(typed: TypedReadings, sheet: { icl: number; name: string } | null): DegreeReadoutView {
  const { stopBefore, stopAfter, openingAngle, closingAngle } = typed;
  const stops = stopBefore !== null && stopAfter !== null;
  const trueTdc = stops ? trueTdcText(trueTdcOffsetRaw(stopBefore, stopAfter)) : 'Enter both piston stops';
  if (openingAngle === null || closingAngle === null) return { trueTdc, icl: 'Enter both flank angles', problem: null, comparison: null, reading: null };
  if (!stops) return { trueTdc, icl: 'Enter both piston stops first: the flanks are read from true TDC', problem: null, comparison: null, reading: null };
  try {
    const readings = { stopBefore, stopAfter, openingAngle, closingAngle };
    if (!sheet) return { trueTdc, icl: iclText(installedIcl(readings)), problem: null, comparison: null, reading: null };
    const reading = degreeFromReadings({ ...readings, sheetIcl: sheet.icl });
    return { trueTdc, icl: iclText(reading), problem: null, comparison: correctionText(reading, sheet.name), reading };
  } catch (error) {
    if (!isCalcInputError(error)) throw error;
    const problem =
      error.field === 'closingAngle'
        ? `The closing-flank angle ${error.message.replace(/^closingAngle:?\s*/, '').replace('openingAngle', 'the opening-flank angle')}`
        : 'Check the flank angles.';
    return { trueTdc, icl: problem, problem, comparison: null, reading: null };
  }
}

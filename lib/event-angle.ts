/** The dead centre a valve event or centreline is counted from, and which way. */
export type EventSide = 'BTDC' | 'ATDC' | 'BBDC' | 'ABDC';

const otherSide: Record<EventSide, EventSide> = { BTDC: 'ATDC', ATDC: 'BTDC', BBDC: 'ABDC', ABDC: 'BBDC' };

/** How every sheet and screen words event angles; the grinder's sheet prints it. */
export const EVENT_CONVENTION =
  'Event angles are crank degrees before or after the dead centre named, never negative: an intake that opens after TDC reads "ATDC".';

/**
 * A valve event or centreline in words, in crank degrees: a figure that is negative on one
 * side of a dead centre is that many degrees on the other ("−16° BTDC" reads "16.0° ATDC").
 * Zero at the shown precision keeps its side.
 */
export function eventAngle(degrees: number, side: EventSide, digits = 1): string {
  const shown = Number(degrees.toFixed(digits));
  const where = shown < 0 ? otherSide[side] : side;
  return `${Math.abs(shown).toFixed(digits)}° ${where}`;
}

/**
 * Measured lobes: a table of lift against crank angle from a degree wheel and
 * dial indicator. Angles in crank degrees (any consistent zero, usually ATDC
 * overlap), lift in inches (tappet or valve, as long as it is consistent).
 */
import { CHECKING_HEIGHT_050 } from './constants';
import { CalcInputError, fieldPath, requireInRange, requireNonNegative, requireObject, requirePositive } from './errors';
import { GRID_MAX, type CurveGrid, type LiftCurve, requireGrid } from './lift-curve';

export interface LiftReading {
  /** Crank degrees. */
  angle: number;
  /** Inches. */
  lift: number;
}

/** Validate a table and return its points sorted by angle. */
export function requireLiftTable(points: readonly LiftReading[], field = 'points'): LiftReading[] {
  if (!Array.isArray(points) || points.length < 3 || points.length > GRID_MAX) {
    throw new CalcInputError(field, `needs 3 to ${GRID_MAX} readings of angle and lift`, points);
  }
  const sorted = points.map((p: LiftReading, i) => {
    requireObject(`${field}[${i}]`, p);
    return {
      angle: requireInRange(`${field}[${i}].angle`, p.angle, { min: -1e4, max: 1e4, unit: 'degrees' }),
      lift: requireInRange(`${field}[${i}].lift`, p.lift, { min: -2, max: 2, unit: 'in' }),
    };
  });
  sorted.sort((x, y) => x.angle - y.angle);
  for (let i = 1; i < sorted.length; i++) {
    const prev = sorted[i - 1];
    const cur = sorted[i];
    if (prev && cur && cur.angle === prev.angle) {
      throw new CalcInputError(field, `has two readings at ${cur.angle}°; keep one per angle`, cur.angle);
    }
  }
  return sorted;
}

function peakIndex(points: readonly LiftReading[]): number {
  let best = 0;
  let max = -Infinity;
  points.forEach((p, i) => {
    if (p.lift > max) {
      max = p.lift;
      best = i;
    }
  });
  return best;
}

function at(points: readonly LiftReading[], i: number): LiftReading {
  const p = points[i];
  if (!p) throw new RangeError(`reading ${i} out of range`);
  return p;
}

interface Crossings {
  opening: number;
  closing: number;
}

/** Unchecked: crossings of `height` nearest the peak on each flank, linear interpolation. */
function crossingsRaw(points: readonly LiftReading[], peak: number, height: number, field: string): Crossings {
  let i = peak;
  while (i > 0 && at(points, i - 1).lift > height) i--;
  if (i === 0) {
    throw new CalcInputError(field, `the table never drops to ${height} in before the peak: add readings earlier`, height);
  }
  const a0 = at(points, i - 1);
  const a1 = at(points, i);
  const opening = a0.angle + ((height - a0.lift) * (a1.angle - a0.angle)) / (a1.lift - a0.lift);
  let j = peak;
  while (j < points.length - 1 && at(points, j + 1).lift > height) j++;
  if (j === points.length - 1) {
    throw new CalcInputError(field, `the table never drops to ${height} in after the peak: add readings later`, height);
  }
  const b0 = at(points, j);
  const b1 = at(points, j + 1);
  const closing = b0.angle + ((b0.lift - height) * (b1.angle - b0.angle)) / (b0.lift - b1.lift);
  return { opening, closing };
}

/**
 * Duration, crank degrees, at a checking height (inches) from a measured
 * table: the span between the crossings of that height on either side of
 * maximum lift, interpolated linearly between readings.
 */
export function durationAtHeight(points: readonly LiftReading[], height: number): number {
  const table = requireLiftTable(points);
  const h = requirePositive('height', height, 'in');
  const peak = peakIndex(table);
  const max = at(table, peak).lift;
  if (!(max > h)) throw new CalcInputError('height', `must be below the table's maximum lift (${max} in)`, h);
  const { opening, closing } = crossingsRaw(table, peak, h, 'points');
  return closing - opening;
}

export interface LiftTableDuration {
  /** Checking height, inches. */
  height: number;
  /** Crank degrees. */
  duration: number;
  /** Crank angle where lift rises through the height. */
  opening: number;
  /** Crank angle where lift falls through the height. */
  closing: number;
}

export interface LiftTableAnalysis {
  /** Highest reading, inches. */
  maxLift: number;
  /** Angle of the highest reading, crank degrees. */
  maxLiftAngle: number;
  /**
   * Lobe centreline, crank degrees in the table's own frame: the midpoint of
   * the equal-lift crossings `centerlineDrop` below max lift (the same method
   * as degreeing a cam in).
   */
  centerline: number;
  /** Height used for the centreline crossings, inches. */
  centerlineHeight: number;
  durations: LiftTableDuration[];
}

export interface LiftTableInput {
  points: readonly LiftReading[];
  /** Checking heights for durations, inches; defaults to [0.050]. */
  heights?: readonly number[];
  /** How far below max lift to take the centreline crossings, inches; default 0.050. */
  centerlineDrop?: number;
}

/** Max lift, centreline and durations at any heights from a measured table. */
export function analyzeLiftTable(input: LiftTableInput): LiftTableAnalysis {
  requireObject('input', input);
  const table = requireLiftTable(input.points);
  const peak = peakIndex(table);
  const top = at(table, peak);
  const heights = (input.heights ?? [CHECKING_HEIGHT_050]).map((h, i) => {
    const v = requirePositive(`heights[${i}]`, h, 'in');
    if (!(v < top.lift)) throw new CalcInputError(`heights[${i}]`, `must be below the table's maximum lift (${top.lift} in)`, v);
    return v;
  });
  const drop = requireNonNegative('centerlineDrop', input.centerlineDrop ?? CHECKING_HEIGHT_050, 'in');
  const centerlineHeight = top.lift - drop > 0 && drop > 0 ? top.lift - drop : top.lift / 2;
  const c = crossingsRaw(table, peak, centerlineHeight, 'points');
  return {
    maxLift: top.lift,
    maxLiftAngle: top.angle,
    centerline: (c.opening + c.closing) / 2,
    centerlineHeight,
    durations: heights.map((height) => {
      const x = crossingsRaw(table, peak, height, 'points');
      return { height, duration: x.closing - x.opening, opening: x.opening, closing: x.closing };
    }),
  };
}

/**
 * A measured table resampled onto a grid (linear between readings, zero
 * outside the table) with velocity and acceleration from central differences,
 * so it can be drawn and swept like a synthesised curve.
 */
export function liftCurveFromTable(input: { points: readonly LiftReading[]; grid: CurveGrid; rockerRatio?: number; lash?: number }): LiftCurve {
  requireObject('input', input);
  const table = requireLiftTable(input.points);
  const grid = requireGrid(input.grid, 'grid');
  const ratio = requirePositive('rockerRatio', input.rockerRatio ?? 1);
  const lash = requireNonNegative('lash', input.lash ?? 0, 'in');
  const { start, step, count } = grid;
  const lift = new Float64Array(count);
  const velocity = new Float64Array(count);
  const acceleration = new Float64Array(count);
  let j = 0;
  const first = at(table, 0);
  const last = at(table, table.length - 1);
  for (let i = 0; i < count; i++) {
    const angle = start + i * step;
    if (angle < first.angle || angle > last.angle) continue;
    while (j < table.length - 2 && at(table, j + 1).angle < angle) j++;
    const p0 = at(table, j);
    const p1 = at(table, j + 1);
    const raw = p0.lift + ((angle - p0.angle) * (p1.lift - p0.lift)) / (p1.angle - p0.angle);
    lift[i] = Math.max(0, raw * ratio - lash);
  }
  for (let i = 1; i < count - 1; i++) {
    const up = lift[i + 1] ?? 0;
    const dn = lift[i - 1] ?? 0;
    velocity[i] = (up - dn) / (2 * step);
    acceleration[i] = (up - 2 * (lift[i] ?? 0) + dn) / (step * step);
  }
  let peakVelocity = 0;
  let peakAcceleration = 0;
  let peakDeceleration = 0;
  for (let i = 0; i < count; i++) {
    peakVelocity = Math.max(peakVelocity, Math.abs(velocity[i] ?? 0));
    peakAcceleration = Math.max(peakAcceleration, acceleration[i] ?? 0);
    peakDeceleration = Math.min(peakDeceleration, acceleration[i] ?? 0);
  }
  const top = at(table, peakIndex(table));
  return {
    start,
    step,
    count,
    lift,
    velocity,
    acceleration,
    centerline: top.angle,
    maxLift: Math.max(0, top.lift * ratio - lash),
    peakVelocity,
    peakAcceleration,
    peakDeceleration,
  };
}

export interface LobeMaxLift {
  /** Caller's label, e.g. "3E" for cylinder 3 exhaust. */
  id: string;
  /** Measured max lift, inches. */
  maxLift: number;
}

export interface WornLobeRow extends LobeMaxLift {
  /** Median max lift of the other lobes, inches. */
  siblingMedian: number;
  /** siblingMedian − maxLift, inches (positive = lower than its siblings). */
  shortfall: number;
  /** The sheet's stock lobe lift minus maxLift, inches (positive = below stock); null without a stock lift. */
  stockShortfall: number | null;
  /**
   * How deep the damage reaches, inches: the larger of the two shortfalls, never
   * below 0. This is what the cleanup cut must remove (regrindCleanup).
   */
  damageDepth: number;
  /** True when either shortfall exceeds the threshold. */
  worn: boolean;
}

export interface WornLobeResult {
  lobes: WornLobeRow[];
  /** Ids of the worn lobes, in input order. */
  worn: string[];
  /** Threshold used, inches. */
  threshold: number;
  /** Stock lobe lift compared with, inches, or null. */
  stockLobeLift: number | null;
}

function median(values: number[]): number {
  const v = [...values].sort((a, b) => a - b);
  const mid = Math.floor(v.length / 2);
  const hi = v[mid] ?? 0;
  return v.length % 2 === 1 ? hi : ((v[mid - 1] ?? hi) + hi) / 2;
}

/** Most lobes one comparison takes (16 cylinders × 2 kinds, as the lobe table allows, with room). */
export const WORN_LOBES_MAX = 64;

/**
 * Flag lobes whose max lift is more than `threshold` inches below the median
 * of their siblings (the other lobes of the same kind on the same cam) or,
 * when `stockLobeLift` is given, below the sheet's stock lobe lift, so a cam
 * whose lobes are all worn is still caught. Argument:
 * `{ lobes: { id, maxLift }[], threshold, stockLobeLift? }`, inches of tappet lift.
 * With a stock lift one lobe is enough; without it at least two are needed.
 */
export function findWornLobes(input: { lobes: readonly LobeMaxLift[]; threshold: number; stockLobeLift?: number }, prefix?: string): WornLobeResult {
  requireObject(prefix ?? 'input', input);
  const threshold = requirePositive(fieldPath(prefix, 'threshold'), input.threshold, 'in');
  const stock =
    input.stockLobeLift === undefined
      ? null
      : requireInRange(fieldPath(prefix, 'stockLobeLift'), input.stockLobeLift, { min: 0, max: 2, minOpen: true, unit: 'in' });
  const least = stock === null ? 2 : 1;
  if (!Array.isArray(input.lobes) || input.lobes.length < least || input.lobes.length > WORN_LOBES_MAX) {
    throw new CalcInputError(
      fieldPath(prefix, 'lobes'),
      stock === null ? `needs 2 to ${WORN_LOBES_MAX} lobes to compare (or a stock lobe lift)` : `needs 1 to ${WORN_LOBES_MAX} lobes`,
      input.lobes,
    );
  }
  const lifts = input.lobes.map((l, i) => {
    requireObject(fieldPath(prefix, `lobes[${i}]`), l);
    return requireInRange(fieldPath(prefix, `lobes[${i}].maxLift`), l.maxLift, { min: 0, max: 2, minOpen: true, unit: 'in' });
  });
  const lobes = input.lobes.map((l, i) => {
    const maxLift = lifts[i] ?? 0;
    const others = lifts.filter((_, j) => j !== i);
    const siblingMedian = others.length > 0 ? median(others) : maxLift;
    const shortfall = siblingMedian - maxLift;
    const stockShortfall = stock === null ? null : stock - maxLift;
    const damageDepth = Math.max(0, shortfall, stockShortfall ?? 0);
    return {
      id: String(l.id),
      maxLift,
      siblingMedian,
      shortfall,
      stockShortfall,
      damageDepth,
      worn: shortfall > threshold || (stockShortfall !== null && stockShortfall > threshold),
    };
  });
  return { lobes, worn: lobes.filter((l) => l.worn).map((l) => l.id), threshold, stockLobeLift: stock };
}

/** A lobe's kind from its label: "3I" is cylinder 3's intake, "3E" its exhaust. */
export const lobeKind = (id: string): 'intake' | 'exhaust' => (id.endsWith('I') ? 'intake' : 'exhaust');

/** A measured lobe the worn-lobe comparison could not judge, and why. */
export interface UnjudgedLobe {
  id: string;
  note: string;
}

/**
 * Worn lobes on a whole cam: intakes compared with intakes, exhausts with exhausts
 * (`findWornLobes` per kind), and with the stock lobe lift when given. Without a stock
 * lift a kind with a single measured lobe has nothing to compare with; it is returned
 * in `unjudged` with the reason, never as a pass. The one grouping both the
 * measurements screen and the fit checks use. Inches of tappet lift.
 */
export function findWornLobesByKind(input: { lobes: readonly LobeMaxLift[]; threshold: number; stockLobeLift?: number }): WornLobeResult & {
  unjudged: UnjudgedLobe[];
} {
  requireObject('input', input);
  if (!Array.isArray(input.lobes)) throw new CalcInputError('lobes', 'must be a list of lobes', input.lobes);
  const threshold = requirePositive('threshold', input.threshold, 'in');
  const merged: WornLobeResult & { unjudged: UnjudgedLobe[] } = { lobes: [], worn: [], threshold, stockLobeLift: input.stockLobeLift ?? null, unjudged: [] };
  for (const kind of ['intake', 'exhaust'] as const) {
    const group = input.lobes.filter((l) => lobeKind(l.id) === kind);
    if (group.length === 0) continue;
    if (group.length < 2 && input.stockLobeLift === undefined) {
      merged.unjudged.push({ id: group[0]!.id, note: `only one ${kind} lobe measured: nothing to compare it with` });
      continue;
    }
    const found = findWornLobes({ lobes: group, threshold, stockLobeLift: input.stockLobeLift });
    merged.lobes.push(...found.lobes);
    merged.worn.push(...found.worn);
    merged.stockLobeLift = found.stockLobeLift;
  }
  return merged;
}

/** Each measured lobe's max lift: the highest reading in its table, inches. */
export function tableMaxLifts(lobes: readonly { id: string; points: readonly { lift: number }[] }[]): LobeMaxLift[] {
  return lobes.map((l) => ({ id: l.id, maxLift: Math.max(...l.points.map((p) => p.lift)) }));
}

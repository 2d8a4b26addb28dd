/**
 * Input errors for the calc kernel.
 *
 * Every public calc function checks its inputs and throws a CalcInputError
 * naming the offending field, so the server can answer 400 with
 * `{ error: { code: 'invalid_input', message, fields: { [field]: message } } }`.
 */
export class CalcInputError extends Error {
  /** Dotted path of the offending input, e.g. `engine.bore` or `profile.intake.duration050`. */
  readonly field: string;
  /** The value that was rejected (kept for logs; may be NaN or Infinity). */
  readonly value: unknown;

  constructor(field: string, message: string, value?: unknown) {
    super(`${field}: ${message}`);
    this.name = 'CalcInputError';
    this.field = field;
    this.value = value;
  }
}

/** True when `error` is a CalcInputError (also across module copies). */
export function isCalcInputError(error: unknown): error is CalcInputError {
  return error instanceof CalcInputError || (error instanceof Error && error.name === 'CalcInputError' && 'field' in error);
}

function describe(value: unknown): string {
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  return typeof value;
}

/**
 * Largest magnitude any calc input may have. Inputs are inches, cc, degrees,
 * lbf and lbf/in; nothing real comes near it, and products of a few such
 * numbers stay far inside double range, so no result overflows to Infinity.
 */
export const INPUT_MAGNITUDE_MAX = 1e9;

/** A finite number no larger than INPUT_MAGNITUDE_MAX in size, or throw. */
export function requireFinite(field: string, value: unknown): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new CalcInputError(field, `must be a finite number (got ${describe(value)})`, value);
  }
  if (value > INPUT_MAGNITUDE_MAX || value < -INPUT_MAGNITUDE_MAX) {
    throw new CalcInputError(field, `is too large (got ${value}; at most ${INPUT_MAGNITUDE_MAX} in size)`, value);
  }
  return value;
}

/** A finite number greater than zero, or throw. */
export function requirePositive(field: string, value: unknown, unit = ''): number {
  const v = requireFinite(field, value);
  if (v <= 0) throw new CalcInputError(field, `must be greater than 0${unit ? ` ${unit}` : ''} (got ${v})`, v);
  return v;
}

/** A finite number zero or greater, or throw. */
export function requireNonNegative(field: string, value: unknown, unit = ''): number {
  const v = requireFinite(field, value);
  if (v < 0) throw new CalcInputError(field, `must be 0${unit ? ` ${unit}` : ''} or more (got ${v})`, v);
  return v;
}

/**
 * A finite number inside a range. `open` bounds exclude the limit itself.
 * The message states the range and unit so a person knows what to fix.
 */
export function requireInRange(
  field: string,
  value: unknown,
  range: { min: number; max: number; minOpen?: boolean; maxOpen?: boolean; unit?: string },
): number {
  const v = requireFinite(field, value);
  const lowOk = range.minOpen ? v > range.min : v >= range.min;
  const highOk = range.maxOpen ? v < range.max : v <= range.max;
  if (!lowOk || !highOk) {
    const lo = range.minOpen ? `more than ${range.min}` : `at least ${range.min}`;
    const hi = range.maxOpen ? `less than ${range.max}` : `at most ${range.max}`;
    const unit = range.unit ? ` ${range.unit}` : '';
    throw new CalcInputError(field, `must be ${lo} and ${hi}${unit} (got ${v})`, v);
  }
  return v;
}

/** A whole number at least `min`, or throw. */
export function requireInteger(field: string, value: unknown, min: number): number {
  const v = requireFinite(field, value);
  if (!Number.isInteger(v) || v < min) {
    throw new CalcInputError(field, `must be a whole number of at least ${min} (got ${v})`, v);
  }
  return v;
}

/** Throw unless `condition` holds. */
export function requireThat(condition: boolean, field: string, message: string, value?: unknown): void {
  if (!condition) throw new CalcInputError(field, message, value);
}

/** Join a prefix and a field name into a dotted path. */
export function fieldPath(prefix: string | undefined, name: string): string {
  return prefix ? `${prefix}.${name}` : name;
}

/** A plain object (not null, not an array), or throw naming the field. */
export function requireObject(field: string, value: unknown): void {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new CalcInputError(field, `is required and must be an object (got ${describe(value)})`, value);
  }
}

/**
 * Every number in a result must be finite: huge inputs can overflow to
 * Infinity or NaN. Throws naming `field` (the input that was too large).
 */
export function requireFiniteResult(field: string, value: number): number {
  if (!Number.isFinite(value)) {
    throw new CalcInputError(field, 'is too large: the result would not be a finite number', value);
  }
  return value;
}

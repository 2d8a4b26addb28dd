/**
 * Number fields as a form holds them: the text the person typed, the unit it
 * was typed in, and the value in calc's units (inches, cc, lbf, lbf/in). The
 * value is the truth; the text is only ever shown in the unit it was typed in,
 * so switching units and back never rounds a value or rewrites what was typed.
 */

/** Quantities the unit toggle converts. Anything else (degrees, ratios, counts) has a fixed unit. */
export type Quantity = 'length' | 'volume' | 'force' | 'rate';

/** The part of the unit converter these helpers need (hooks/use-units builds one on mathjs). */
export type ShownUnits = {
  toShown: (quantity: Quantity, value: number) => number;
  fromShown: (quantity: Quantity, value: number) => number;
  label: (quantity: Quantity) => string;
  digits: (quantity: Quantity, calcDigits: number) => number;
};

/** What one number field holds while it is edited. `value` is in calc units: null when blank, NaN when not a number. */
export type NumberDraft = { text: string; unit: string; value: number | null };

/** How one number field is shown and checked. */
export type NumberSpec = {
  /** Dotted path in the record, e.g. `spring.seatLoad`. */
  path: string;
  label: string;
  /** Converted by the unit toggle; null keeps `unit` whatever the toggle says. */
  quantity: Quantity | null;
  /** calc's unit label (in, cc, lbf, lbf/in) or the fixed unit (°, :1). */
  unit: string;
  /** Decimal places in calc's unit. */
  digits: number;
  min: number;
  max: number;
  integer?: boolean;
  /** Blank is allowed and saves as null. */
  optional?: boolean;
  /** A line of guidance shown before the range. */
  hint?: string;
  /** Money: typed and shown in dollars (unit `$`, 2 digits, min and max in dollars), held in the record as whole cents. */
  money?: boolean;
};

const numberPattern = /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i;
/** Dollars and cents: digits with optional thousands commas, at most two decimals, never negative. */
const moneyPattern = /^(\d{1,3}(,\d{3})+|\d+)(\.\d{1,2})?$|^\.\d{1,2}$/;
/** A count such as an odometer reading: digits with optional thousands commas, no decimals, never negative. */
const countPattern = /^(\d{1,3}(,\d{3})+|\d+)$/;

/**
 * The one reader of typed numbers: null when blank, NaN when it is not a number.
 * Accepts a decimal comma and a typographic minus; with `money`, a leading `$`
 * and thousands commas instead, and at most two decimals ("$1,050.50"); with
 * `count`, a whole number with thousands commas ("123,400").
 */
export function parseNumberText(text: string, options: { money?: boolean; count?: boolean } = {}): number | null {
  const cleaned = text.trim().replace(/\s+/g, '').replace(/^−/, '-');
  if (cleaned === '') return null;
  if (options.count) return countPattern.test(cleaned) ? Number(cleaned.replace(/,/g, '')) : Number.NaN;
  if (options.money) {
    const amount = cleaned.replace(/^\$/, '');
    return moneyPattern.test(amount) ? Number(amount.replace(/,/g, '')) : Number.NaN;
  }
  const normalised = cleaned.includes('.') ? cleaned : cleaned.replace(',', '.');
  return numberPattern.test(normalised) ? Number(normalised) : Number.NaN;
}

/** Dollars as whole cents, rounded away from float noise (0.29 → 29). */
export const centsFromDollars = (dollars: number) => Math.round(dollars * 100);

/** Money typed by a person ("225", "$1,050.50") as whole cents; NaN when blank or not an amount of at most two decimals. */
export function centsFromText(text: string): number {
  const dollars = parseNumberText(text, { money: true });
  return dollars === null || Number.isNaN(dollars) ? Number.NaN : centsFromDollars(dollars);
}

/** Fixed decimals, without a negative zero. */
export function formatNumber(value: number, digits: number): string {
  const text = value.toFixed(Math.max(0, Math.min(10, digits)));
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** Like formatNumber, but drops trailing zeros (for ranges: "2 to 6 in", "50.8 to 152.4 mm"). */
export function formatCompact(value: number, digits: number): string {
  const text = formatNumber(value, digits);
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
}

/** The unit a field shows in right now. */
export function shownUnit(spec: NumberSpec, units: ShownUnits): string {
  return spec.quantity ? units.label(spec.quantity) : spec.unit;
}

function shownDigits(spec: NumberSpec, units: ShownUnits): number {
  return spec.quantity ? units.digits(spec.quantity, spec.digits) : spec.digits;
}

const toShown = (spec: NumberSpec, units: ShownUnits, value: number) => (spec.quantity ? units.toShown(spec.quantity, value) : value);

/** A draft for a saved value, written in calc's unit (money: whole cents, written in dollars). Shows more decimals only when the value has them. */
export function draftFromValue(spec: NumberSpec, saved: number | null | undefined): NumberDraft {
  if (saved == null) return { text: '', unit: spec.unit, value: null };
  const value = spec.money ? saved / 100 : saved;
  const fixed = formatNumber(value, spec.digits);
  const text = Number(fixed) === value ? fixed : String(Number(value.toPrecision(10)));
  return { text, unit: spec.unit, value };
}

/** A draft for text typed in the unit shown now. Float noise from the conversion is trimmed to 12 significant digits. */
export function draftFromText(spec: NumberSpec, text: string, units: ShownUnits): NumberDraft {
  const typed = parseNumberText(text, { money: spec.money });
  const unit = shownUnit(spec, units);
  if (typed === null || Number.isNaN(typed)) return { text, unit, value: typed };
  const value = spec.quantity ? units.fromShown(spec.quantity, typed) : typed;
  return { text, unit, value: Number(value.toPrecision(12)) };
}

/** The text to show: as typed when the unit has not changed since, otherwise the value converted and rounded for display. */
export function shownText(spec: NumberSpec, draft: NumberDraft, units: ShownUnits): string {
  const unit = shownUnit(spec, units);
  if (draft.unit === unit || draft.value === null || Number.isNaN(draft.value)) return draft.text;
  return formatNumber(toShown(spec, units, draft.value), shownDigits(spec, units));
}

function rangeEnds(spec: NumberSpec, units: ShownUnits) {
  const digits = shownDigits(spec, units);
  const end = (v: number) => formatCompact(toShown(spec, units, v), digits).replace(/^-/, '−');
  return { low: end(spec.min), high: end(spec.max), unit: shownUnit(spec, units) };
}

/** "2 to 6 in" in the unit shown now; money reads "$0 to $5000". */
export function rangeText(spec: NumberSpec, units: ShownUnits): string {
  const { low, high, unit } = rangeEnds(spec, units);
  return spec.money ? `$${low} to $${high}` : `${low} to ${high} ${unit}`;
}

/** The message for a value outside the field's range, in the unit shown now. */
export function rangeMessage(spec: NumberSpec, units: ShownUnits): string {
  const { low, high, unit } = rangeEnds(spec, units);
  return spec.money ? `${spec.label} must be between $${low} and $${high}` : `${spec.label} must be between ${low} and ${high} ${unit}`;
}

/** What is wrong with a draft on its own (blank, not a number, out of range), or null. */
export function checkDraft(spec: NumberSpec, draft: NumberDraft, units: ShownUnits): string | null {
  if (draft.value === null) return spec.optional ? null : `Enter the ${lowerFirst(spec.label)}${spec.money ? ' in dollars, like 485.00' : ''}`;
  if (Number.isNaN(draft.value)) {
    return spec.money ? `${spec.label} must be an amount in dollars, like 485.00` : `${spec.label} must be a number, in ${shownUnit(spec, units)}`;
  }
  if (spec.integer && !Number.isInteger(draft.value)) return `${spec.label} is a whole number`;
  if (draft.value < spec.min || draft.value > spec.max) return rangeMessage(spec, units);
  return null;
}

function lowerFirst(label: string) {
  return /^[A-Z][a-z]/.test(label) ? label[0]!.toLowerCase() + label.slice(1) : label;
}

type Bounded = { minValue?: number | null; maxValue?: number | null; unwrap?: () => unknown };

/** A field's range from its zod number schema (through `.default()`, `.nullable()` and `.optional()`), for a NumberSpec. */
export function rangeOf(schema: Bounded): { min: number; max: number } {
  let inner: Bounded = schema;
  while (typeof inner.unwrap === 'function') inner = inner.unwrap() as Bounded;
  return { min: inner.minValue ?? Number.NEGATIVE_INFINITY, max: inner.maxValue ?? Number.POSITIVE_INFINITY };
}

type Tree = { [key: string]: unknown };

/** Reads `a.b.c` from nested objects. */
export function getAt(tree: unknown, path: string): unknown {
  let node = tree;
  for (const key of path.split('.')) {
    if (typeof node !== 'object' || node === null) return undefined;
    node = (node as Tree)[key];
  }
  return node;
}

/** Writes `a.b.c` into nested objects, creating them as needed. */
export function setAt(tree: Tree, path: string, value: unknown): void {
  const keys = path.split('.');
  let node = tree;
  keys.slice(0, -1).forEach((key) => {
    const next = node[key];
    if (typeof next !== 'object' || next === null) node[key] = {};
    node = node[key] as Tree;
  });
  node[keys[keys.length - 1]!] = value;
}

/** Builds the drafts for a record (or blanks when there is none). */
export function draftsFor(specs: readonly NumberSpec[], record: unknown): Tree {
  const drafts: Tree = {};
  for (const spec of specs) {
    const value = getAt(record, spec.path);
    setAt(drafts, spec.path, draftFromValue(spec, typeof value === 'number' ? value : null));
  }
  return drafts;
}

type SafeParser<T> = {
  safeParse: (
    value: unknown,
  ) => { success: true; data: T } | { success: false; error: { issues: readonly { path: readonly PropertyKey[]; code: string; message: string }[] } };
};

export type DraftResult<T> = { values: T; errors: null } | { values: null; errors: Record<string, string> };

/**
 * Turns drafts into the record the schema takes. Each number field is checked
 * on its own, with messages in the unit shown; the schema then checks the
 * rest (text fields, and cross-field rules such as coil bind below installed
 * height), and every field keeps its first message.
 */
export function resolveDrafts<T>(specs: readonly NumberSpec[], drafts: unknown, others: Tree, schema: SafeParser<T>, units: ShownUnits): DraftResult<T> {
  const errors: Record<string, string> = {};
  const record: Tree = structuredClone(others);
  for (const spec of specs) {
    const draft = getAt(drafts, spec.path) as NumberDraft | undefined;
    const checked = draft ?? { text: '', unit: spec.unit, value: null };
    const problem = checkDraft(spec, checked, units);
    if (problem) errors[spec.path] = problem;
    // A failed field is left undefined, inside its parent object, so the schema still reaches its siblings.
    const value = problem || checked.value === null || !spec.money ? checked.value : centsFromDollars(checked.value);
    setAt(record, spec.path, problem ? undefined : value);
  }
  const parsed = schema.safeParse(record);
  if (parsed.success && Object.keys(errors).length === 0) return { values: parsed.data, errors: null };
  if (parsed.success) return { values: null, errors };
  const byPath = new Map(specs.map((spec) => [spec.path, spec]));
  for (const issue of parsed.error.issues) {
    const path = issue.path.map(String).join('.') || '(form)';
    const spec = byPath.get(path);
    const message = spec && (issue.code === 'too_small' || issue.code === 'too_big') ? rangeMessage(spec, units) : issue.message;
    errors[path] ??= message;
  }
  return { values: null, errors };
}

/**
 * Sorts a server 400's field messages onto the form: `engine.spring.rate`
 * with prefix `engine.` lands on `spring.rate`. Anything the form does not
 * show comes back as text for a notice.
 */
export function placeServerFields(fields: Record<string, string>, known: readonly string[], prefix = ''): { placed: Record<string, string>; other: string[] } {
  const placed: Record<string, string> = {};
  const other: string[] = [];
  for (const [field, message] of Object.entries(fields)) {
    const path = prefix && field.startsWith(prefix) ? field.slice(prefix.length) : field;
    if (known.includes(path)) placed[path] ??= message;
    else other.push(`${field}: ${message}`);
  }
  return { placed, other };
}

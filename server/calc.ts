import { isCalcInputError } from '@/calc/errors';

import { HttpError } from './http';

/**
 * Maps a calc field path (e.g. `profile.intake.lash`) onto the request's own
 * field path (e.g. `spec.intake.lash`). Returns the path unchanged when no
 * prefix matches.
 */
export type FieldRename = (calcField: string) => string;

/** Renames the first matching prefix; longer prefixes should come first. */
export function renamePrefixes(pairs: [from: string, to: string][]): FieldRename {
  return (field) => {
    for (const [from, to] of pairs) {
      if (field === from) return to;
      if (field.startsWith(`${from}.`)) return `${to}${field.slice(from.length)}`;
    }
    return field;
  };
}

/**
 * Runs a calc function; a CalcInputError becomes a 400 that names the field
 * in the request's terms, so the person knows what to fix.
 */
export function runCalc<T>(fn: () => T, rename: FieldRename = (f) => f): T {
  try {
    return fn();
  } catch (error) {
    if (!isCalcInputError(error)) throw error;
    const field = rename(error.field);
    const prefix = `${error.field}: `;
    const detail = error.message.startsWith(prefix) ? error.message.slice(prefix.length) : error.message;
    const sentence = detail.charAt(0).toUpperCase() + detail.slice(1);
    throw new HttpError(400, 'invalid_input', `${field}: ${detail}`, { [field]: sentence });
  }
}

import type { Response } from 'express';

import type { CalcInputError } from '@/calc/errors';

import { HttpError } from './http';

/**
 * Maps a calc field path (e.g. `profile.intake.lash`) onto the request's own
 * field path (e.g. `spec.intake.lash`). Returns the path unchanged when no
 * rule matches.
 */
export type FieldRename = (calcField: string) => string;

/**
 * Renames by the first matching rule; longer prefixes should come first. A string
 * renames that prefix (whole path segments only); a RegExp replaces its match, so a
 * rule can keep parts of the path (`/^ptv-baseline\.(\w+)\.(\d+)\.baseline/` → `ptv-baseline.$1.$2`).
 */
export function renamePrefixes(pairs: [from: string | RegExp, to: string][]): FieldRename {
  return (field) => {
    for (const [from, to] of pairs) {
      if (typeof from !== 'string') {
        if (from.test(field)) return field.replace(from, to);
        continue;
      }
      if (field === from) return to;
      if (field.startsWith(`${from}.`)) return `${to}${field.slice(from.length)}`;
    }
    return field;
  };
}

const RENAME_KEY = 'calcFields';

/**
 * Says how this request's calc errors name the request's fields; the error handler
 * applies it when calc refuses an input. Call it again when the naming changes
 * within one request (each profile of a list, say).
 */
export function declareCalcFields(res: Response, rename: FieldRename) {
  res.locals[RENAME_KEY] = rename;
}

/** The rename a route declared for this request; calc's own names when it declared none. */
export function declaredCalcFields(res: Response): FieldRename {
  const rename: unknown = res.locals[RENAME_KEY];
  return typeof rename === 'function' ? (rename as FieldRename) : (field) => field;
}

/** A CalcInputError as the 400 that names the field in the request's terms, so the person knows what to fix. */
export function calcInputAnswer(error: CalcInputError, rename: FieldRename): HttpError {
  const field = rename(error.field);
  const prefix = `${error.field}: `;
  const detail = error.message.startsWith(prefix) ? error.message.slice(prefix.length) : error.message;
  const sentence = detail.charAt(0).toUpperCase() + detail.slice(1);
  return new HttpError(400, 'invalid_input', `${field}: ${detail}`, Object.fromEntries([[field, sentence]]));
}

import type { NextFunction, Request, Response } from 'express';
import { z } from 'zod';

import { isCalcInputError } from '@/calc/errors';
import type { ApiErrorBody } from '@/shared/errors';

import { calcInputAnswer, declaredCalcFields } from './calc-fields';

/** An error the API answers with as-is: status, a stable code, a message that says what to fix. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

export const notFound = (what = 'Record') => new HttpError(404, 'not_found', `${what} not found`);
export const forbidden = (message = 'Your role in this shop cannot do that') => new HttpError(403, 'forbidden', message);
export const conflict = (message: string) => new HttpError(409, 'conflict', message);

/** A field's dotted path; an empty key shows as `""` so the name is never blank. */
/** A key that is empty or only spaces is named in JSON quotes (`""`, `" "`), so no field name is blank. */
const fieldPath = (path: PropertyKey[]) =>
  path.length ? path.map((p) => (typeof p === 'string' && p.trim() === '' ? JSON.stringify(p) : String(p))).join('.') : '(body)';

/** Turns zod issues into `{ "a.b": "message" }`, keeping the first message per field. */
export function fieldsFromZod(error: z.ZodError): Record<string, string> {
  // A Map, not an object: a client may send keys named `__proto__` or `constructor`.
  const fields = new Map<string, string>();
  const add = (key: string, message: string) => {
    if (!fields.has(key)) fields.set(key, message);
  };
  for (const issue of error.issues) {
    if (issue.code === 'unrecognized_keys') {
      for (const extra of issue.keys) add(fieldPath([...issue.path, extra]), 'Unknown field');
      continue;
    }
    add(fieldPath(issue.path), issue.message);
  }
  return Object.fromEntries(fields);
}

/** Control characters other than tab, line feed and carriage return: never part of a person's text (NUL and friends break exports and terminals). */
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;

/** No form we take nests deeper than a few levels; deeper input is refused by name instead of walked (a stack overflow is not an answer). */
const MAX_DEPTH = 32;

/** The path of every string in `value` that holds a control character, and of any value nested deeper than `MAX_DEPTH`. */
function controlCharacterFields(value: unknown, path: PropertyKey[] = [], out = new Map<string, string>()) {
  if (path.length > MAX_DEPTH) {
    out.set(fieldPath(path.slice(0, MAX_DEPTH)), `Nested more than ${MAX_DEPTH} levels deep`);
  } else if (typeof value === 'string') {
    if (CONTROL.test(value)) out.set(fieldPath(path), 'Remove the control characters (such as NUL) from this text');
  } else if (Array.isArray(value)) value.forEach((v, i) => controlCharacterFields(v, [...path, i], out));
  else if (value !== null && typeof value === 'object' && !(value instanceof Date)) {
    for (const [k, v] of Object.entries(value)) controlCharacterFields(v, [...path, k], out);
  }
  return out;
}

/** Parses `value` with `schema`, or throws a 400 that names every bad field (control characters in text included). */
export function parse<S extends z.ZodType>(schema: S, value: unknown): z.output<S> {
  const result = schema.safeParse(value ?? {});
  const fields = result.success ? Object.fromEntries(controlCharacterFields(result.data)) : fieldsFromZod(result.error);
  if (result.success && Object.keys(fields).length === 0) return result.data;
  const [first] = Object.entries(fields);
  const message = first ? `${first[0]}: ${first[1]}` : 'The request is not valid';
  throw new HttpError(400, 'invalid', message, fields);
}

export function sendError(res: Response, error: HttpError) {
  const body: ApiErrorBody = {
    error: { code: error.code, message: error.message, ...(error.fields ? { fields: error.fields } : {}) },
  };
  res.status(error.status).json(body);
}

/**
 * Express error handler: known errors keep their status; calc refusing an input is a 400 naming the field
 * as the route declared it (server/calc-fields.ts); a malformed body or path is a 400 naming it; everything else is a logged 500.
 */
export function errorHandler(error: unknown, _req: Request, res: Response, next: NextFunction) {
  if (res.headersSent) return next(error);
  if (error instanceof HttpError) return sendError(res, error);
  if (isCalcInputError(error)) return sendError(res, calcInputAnswer(error, declaredCalcFields(res)));
  const status = (error as { status?: unknown }).status;
  const type = (error as { type?: unknown }).type;
  if (type === 'entity.parse.failed') {
    return sendError(res, new HttpError(400, 'invalid_json', 'The body is not valid JSON', { '(body)': 'Not valid JSON' }));
  }
  if (error instanceof URIError && status === 400) {
    return sendError(res, new HttpError(400, 'invalid_path', `The address has a broken %-escape: ${error.message}`, { '(path)': error.message }));
  }
  if (type === 'entity.too.large') {
    return sendError(res, new HttpError(413, 'too_large', 'The body is too large'));
  }
  // The JSON parser's other refusals (a body it cannot decompress or decode) are about the body.
  if (status === 400 || status === 415) {
    const reason = (error as Error).message;
    return sendError(res, new HttpError(status, 'unreadable_body', `The body could not be read: ${reason}`, { '(body)': reason }));
  }
  if (typeof status === 'number' && status >= 400 && status < 500) {
    return sendError(res, new HttpError(status, 'bad_request', (error as Error).message));
  }
  console.error(error);
  return sendError(res, new HttpError(500, 'internal', 'Something went wrong on our side. Try again.'));
}

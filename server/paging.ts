import type { Request } from 'express';
import { z } from 'zod';

import { pageQuerySchema } from '@/shared/paging';

import { HttpError, parse } from './http';

/** Where a page starts: the sort key (milliseconds) and id of the last row of the page before. */
export type PageAfter = { at: number; id: string };
export type PageRequest = { limit: number; after: PageAfter | null };

const cursorSchema = z.tuple([z.number().int().min(0).max(8.64e15), z.string().min(1).max(100)]);

/** An opaque cursor: base64url of `[sortKeyMs, id]` of the last row served. */
export function encodeCursor(after: PageAfter): string {
  return Buffer.from(JSON.stringify([after.at, after.id]), 'utf8').toString('base64url');
}

export function decodeCursor(cursor: string): PageAfter {
  const bad = () =>
    new HttpError(400, 'invalid', 'cursor: This cursor is not one the server gave out; start again from the first page', {
      cursor: 'This cursor is not one the server gave out',
    });
  if (!/^[A-Za-z0-9_-]+$/.test(cursor)) throw bad();
  let value: unknown;
  try {
    value = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8'));
  } catch {
    throw bad();
  }
  const parsed = cursorSchema.safeParse(value);
  if (!parsed.success) throw bad();
  return { at: parsed.data[0], id: parsed.data[1] };
}

/** Reads `?limit=` and `?cursor=` (a 400 naming the field when either is bad). */
export function pageRequest(req: Request): PageRequest {
  const query = req.query as Record<string, unknown>;
  const { limit, cursor } = parse(pageQuerySchema, { limit: query.limit, cursor: query.cursor });
  return { limit, after: cursor === undefined ? null : decodeCursor(cursor) };
}

/**
 * Cuts the `limit + 1` rows a keyset query read into a page: the extra row only says there is more.
 * `key` gives each row's sort key and id, newest first.
 */
export function toPage<T>(rows: T[], limit: number, key: (row: T) => PageAfter): { rows: T[]; nextCursor: string | null } {
  if (rows.length <= limit) return { rows, nextCursor: null };
  const page = rows.slice(0, limit);
  return { rows: page, nextCursor: encodeCursor(key(page[page.length - 1]!)) };
}

import { z } from 'zod';

export const defaultPageLimit = 50;
export const maxPageLimit = 200;

/** `?limit=&cursor=` on a list: 50 rows unless asked, 200 at most; the cursor is the previous page's `nextCursor`, unchanged. */
export const pageQuerySchema = z.object({
  limit: z.coerce
    .number({ error: `Limit is a whole number from 1 to ${maxPageLimit}` })
    .int(`Limit is a whole number from 1 to ${maxPageLimit}`)
    .min(1, `Limit is a whole number from 1 to ${maxPageLimit}`)
    .max(maxPageLimit, `Ask for at most ${maxPageLimit} rows a page`)
    .default(defaultPageLimit),
  cursor: z.string({ error: 'Send the nextCursor of the previous page' }).max(200, 'This cursor is not one the server gave out').optional(),
});
export type PageQuery = z.output<typeof pageQuerySchema>;

/** One page of a list; `nextCursor` is null on the last page. */
export type Page<K extends string, T> = { [key in K]: T[] } & { nextCursor: string | null };

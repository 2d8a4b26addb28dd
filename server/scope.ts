import { and, eq } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';

import { notFound } from './http';

type Reader = Pick<Db, 'select'>;

/** The job with `id` in `shopId`, or a 404 (another shop's job looks the same as a missing one). */
export function requireJob(db: Reader, shopId: string, id: string) {
  const job = db
    .select({ id: schema.jobs.id, shopId: schema.jobs.shopId })
    .from(schema.jobs)
    .where(and(eq(schema.jobs.id, id), eq(schema.jobs.shopId, shopId)))
    .get();
  if (!job) throw notFound('Job');
  return job;
}

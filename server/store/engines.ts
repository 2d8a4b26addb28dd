import { and, eq } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { EngineRecord, EngineSpec } from '@/shared/engine';

import { conflict, HttpError } from '../http';
import { audit } from './audit';
import type { Actor, Reader } from './db';
import { requireJob } from './jobs';

type EngineRow = typeof schema.engines.$inferSelect;

export function toEngineRecord(row: EngineRow): EngineRecord {
  return { jobId: row.jobId, engine: row.spec, version: row.version, updatedAt: row.updatedAt.toISOString() };
}

/** The job's engine (null when none is saved yet); a 404 for another shop's job. */
export function loadEngine(db: Reader, shopId: string, jobId: string): EngineRecord | null {
  requireJob(db, shopId, jobId);
  const row = db
    .select()
    .from(schema.engines)
    .where(and(eq(schema.engines.jobId, jobId), eq(schema.engines.shopId, shopId)))
    .get();
  return row ? toEngineRecord(row) : null;
}

/** The job's engine spec, or a 409: a spec sheet is checked against it. */
export function requireEngine(db: Reader, shopId: string, jobId: string): EngineSpec {
  const row = db
    .select({ spec: schema.engines.spec })
    .from(schema.engines)
    .where(and(eq(schema.engines.jobId, jobId), eq(schema.engines.shopId, shopId)))
    .get();
  if (!row) throw new HttpError(409, 'engine_missing', "Save the job's engine first: a spec sheet is checked against it.");
  return row.spec;
}

/** Saves the job's engine at `version`; version 0 creates it. */
export function saveEngine(db: Db, who: Actor, jobId: string, version: number, engine: EngineSpec): { engine: EngineRecord; created: boolean } {
  const { row, created } = db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    const current = tx
      .select({ version: schema.engines.version })
      .from(schema.engines)
      .where(and(eq(schema.engines.jobId, jobId), eq(schema.engines.shopId, who.shopId)))
      .get();
    if (!current) {
      if (version !== 0) {
        throw conflict('This job has no engine saved yet, but your form was loaded from one. Reload and enter the engine again.');
      }
      const inserted = tx.insert(schema.engines).values({ jobId, shopId: who.shopId, spec: engine }).returning().get();
      audit(tx, { shopId: who.shopId, userId: who.userId, action: 'create', entity: 'engine', entityId: jobId });
      return { row: inserted, created: true };
    }
    if (current.version !== version) {
      throw conflict(
        `Someone saved this engine after you opened it (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
      );
    }
    const updated = tx
      .update(schema.engines)
      .set({ spec: engine, version: version + 1 })
      .where(and(eq(schema.engines.jobId, jobId), eq(schema.engines.version, version)))
      .returning()
      .get();
    if (!updated) throw conflict('This engine changed while saving. Reload and try again.');
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'update',
      entity: 'engine',
      entityId: jobId,
      detail: { version: updated.version },
    });
    return { row: updated, created: false };
  });
  return { engine: toEngineRecord(row), created };
}

import { Router } from 'express';
import { and, desc, eq, sql } from 'drizzle-orm';
import multer from 'multer';
import path from 'node:path';

import { schema } from '@/db';
import {
  lobeCsvLimits,
  lobesSchema,
  measurementCreateSchema,
  measurementDataSchemas,
  measurementKinds,
  measurementPatchSchema,
  type Measurement,
  type MeasurementKind,
} from '@/shared/measurements';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { conflict, HttpError, notFound, parse } from '../http';
import { requireJob } from '../scope';
import { parseLobeTable } from '../uploads/lobe-table';
import { requireMultipart, runMultipart } from '../uploads/multipart';

type MeasurementRow = typeof schema.measurements.$inferSelect;

export function toMeasurement(row: MeasurementRow): Measurement {
  return {
    id: row.id,
    jobId: row.jobId,
    kind: row.kind,
    data: row.data,
    note: row.note,
    version: row.version,
    createdBy: row.createdBy,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** Newest first; rowid breaks ties between rows written in the same millisecond. */
export const newestMeasurementFirst = [desc(schema.measurements.createdAt), desc(sql`${schema.measurements}.rowid`)] as const;

const inShop = (shopId: string, id: string) => and(eq(schema.measurements.id, id), eq(schema.measurements.shopId, shopId));

const csvUpload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: lobeCsvLimits.maxBytes, files: 1, fields: 4, parts: 6 },
  fileFilter: (_req, file, cb) => {
    const ext = path.extname(file.originalname).toLowerCase();
    if (ext === '.csv' || file.mimetype === 'text/csv') return cb(null, true);
    const text = `${file.originalname} is not a CSV file: save the lobe table as .csv`;
    cb(new HttpError(400, 'invalid_file', text, { file: text }));
  },
}).single('file');

/**
 * Measurements on a job: PTV baseline, springs, pushrod and preload, degree
 * readings (JSON), and measured lobes (CSV upload). Builder and tech read and
 * write them; other roles get 403, other shops' records 404.
 */
export function measurementsRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/measurements', async (req, res) => {
    const kind = typeof req.query.kind === 'string' ? req.query.kind : undefined;
    if (kind !== undefined && !(measurementKinds as readonly string[]).includes(kind)) {
      throw new HttpError(400, 'invalid', `kind: Kind is one of ${measurementKinds.join(', ')}`, {
        kind: `Kind is one of ${measurementKinds.join(', ')}`,
      });
    }
    const ctx = await requireShopRole(auth, db, req, { measurement: ['read'] });
    requireJob(db, ctx.shop.id, req.params.jobId);
    const rows = db
      .select()
      .from(schema.measurements)
      .where(
        and(
          eq(schema.measurements.jobId, req.params.jobId),
          eq(schema.measurements.shopId, ctx.shop.id),
          kind ? eq(schema.measurements.kind, kind as MeasurementKind) : undefined,
        ),
      )
      .orderBy(...newestMeasurementFirst)
      .all();
    res.json({ measurements: rows.map(toMeasurement) });
  });

  router.post('/jobs/:jobId/measurements', async (req, res) => {
    const body = parse(measurementCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const jobId = req.params.jobId;
    const row = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      const created = tx
        .insert(schema.measurements)
        .values({ id: crypto.randomUUID(), shopId: ctx.shop.id, jobId, kind: body.kind, data: body.data, note: body.note, createdBy: ctx.user.id })
        .returning()
        .get();
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'create',
        entity: 'measurement',
        entityId: created.id,
        detail: { jobId, kind: body.kind },
      });
      return created;
    });
    res.status(201).json({ measurement: toMeasurement(row) });
  });

  router.post('/jobs/:jobId/measurements/lobes', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const jobId = req.params.jobId;
    requireJob(db, ctx.shop.id, jobId);
    requireMultipart(req, 'file');
    await runMultipart(csvUpload, req, res, {
      field: 'file',
      maxFileSize: `The lobe table is over ${lobeCsvLimits.maxBytes / 1024 / 1024} MB: split it into files of fewer lobes`,
      maxFiles: 'Send one lobe table at a time',
    });
    const file = req.file;
    if (!file) throw new HttpError(400, 'invalid', 'file: Choose a lobe table (.csv) to upload', { file: 'Choose a lobe table (.csv) to upload' });
    let text: string;
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(file.buffer);
    } catch {
      throw new HttpError(400, 'invalid_file', `${file.originalname} is not a text file: save the lobe table as CSV (UTF-8)`, {
        file: 'Not a text file: save the lobe table as CSV (UTF-8)',
      });
    }
    const body: unknown = req.body;
    const sentNote = typeof body === 'object' && body !== null && 'note' in body ? body.note : undefined;
    const note = parse(measurementPatchSchema.pick({ note: true }), { note: sentNote }).note ?? '';
    const data = parse(lobesSchema, parseLobeTable(text, file.originalname));
    const row = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      const created = tx
        .insert(schema.measurements)
        .values({ id: crypto.randomUUID(), shopId: ctx.shop.id, jobId, kind: 'lobes', data, note, createdBy: ctx.user.id })
        .returning()
        .get();
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'create',
        entity: 'measurement',
        entityId: created.id,
        detail: { jobId, kind: 'lobes', fileName: data.fileName, lobes: data.lobes.length, rows: data.lobes[0]?.points.length ?? 0 },
      });
      return created;
    });
    res.status(201).json({ measurement: toMeasurement(row) });
  });

  router.get('/measurements/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['read'] });
    const row = db.select().from(schema.measurements).where(inShop(ctx.shop.id, req.params.id)).get();
    if (!row) throw notFound('Measurement');
    res.json({ measurement: toMeasurement(row) });
  });

  router.patch('/measurements/:id', async (req, res) => {
    const body = parse(measurementPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const id = req.params.id;
    const row = db.transaction((tx) => {
      const current = tx.select().from(schema.measurements).where(inShop(ctx.shop.id, id)).get();
      if (!current) throw notFound('Measurement');
      // The stored kind picks the schema; errors name `data.*` as sent.
      const data =
        body.data === undefined ? current.data : parse(measurementPatchSchema.extend({ data: measurementDataSchemas[current.kind] }), body).data;
      if (current.version !== body.version) {
        throw conflict(
          `Someone saved this measurement after you opened it (version ${current.version}, yours ${body.version}). Reload to see their changes, then edit again.`,
        );
      }
      const updated = tx
        .update(schema.measurements)
        .set({ data, note: body.note ?? current.note, version: body.version + 1 })
        .where(and(inShop(ctx.shop.id, id), eq(schema.measurements.version, body.version)))
        .returning()
        .get();
      if (!updated) throw conflict('This measurement changed while saving. Reload and try again.');
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'update',
        entity: 'measurement',
        entityId: id,
        detail: { kind: current.kind, version: updated.version, fields: Object.keys(req.body ?? {}).filter((k) => k !== 'version') },
      });
      return updated;
    });
    res.json({ measurement: toMeasurement(row) });
  });

  router.delete('/measurements/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const id = req.params.id;
    db.transaction((tx) => {
      const current = tx.select({ kind: schema.measurements.kind, jobId: schema.measurements.jobId }).from(schema.measurements).where(inShop(ctx.shop.id, id)).get();
      if (!current) throw notFound('Measurement');
      tx.delete(schema.measurements).where(inShop(ctx.shop.id, id)).run();
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'delete', entity: 'measurement', entityId: id, detail: current });
    });
    res.status(204).end();
  });

  return router;
}

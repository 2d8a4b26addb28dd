import { Router } from 'express';
import multer from 'multer';
import path from 'node:path';

import {
  lobeCsvLimits,
  lobesSchema,
  measurementCreateSchema,
  measurementDataSchemas,
  measurementKinds,
  measurementPatchSchema,
  type MeasurementKind,
} from '@/shared/measurements';

import { actorOf, requireShopRole } from '../access';
import type { AppDeps } from '../deps';
import { HttpError, parse } from '../http';
import { createMeasurement, deleteMeasurement, jobMeasurements, loadMeasurement, updateMeasurement } from '../store/measurements';
import { requireJob } from '../store/jobs';
import { parseLobeTable } from '../uploads/lobe-table';
import { requireMultipart, runMultipart } from '../uploads/multipart';

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
    res.json({ measurements: jobMeasurements(db, ctx.shop.id, req.params.jobId, kind as MeasurementKind | undefined) });
  });

  router.post('/jobs/:jobId/measurements', async (req, res) => {
    const body = parse(measurementCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    res.status(201).json({ measurement: createMeasurement(db, actorOf(ctx), req.params.jobId, body) });
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
    const measurement = createMeasurement(
      db,
      actorOf(ctx),
      jobId,
      { kind: 'lobes', data, note },
      {
        fileName: data.fileName,
        lobes: data.lobes.length,
        rows: data.lobes[0]?.points.length ?? 0,
      },
    );
    res.status(201).json({ measurement });
  });

  router.get('/measurements/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['read'] });
    res.json({ measurement: loadMeasurement(db, ctx.shop.id, req.params.id) });
  });

  router.patch('/measurements/:id', async (req, res) => {
    const body = parse(measurementPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    // The stored kind picks the schema; errors name `data.*` as sent.
    const readData = (kind: MeasurementKind) => parse(measurementPatchSchema.extend({ data: measurementDataSchemas[kind] }), body).data;
    const fields = Object.keys(req.body ?? {}).filter((k) => k !== 'version');
    res.json({ measurement: updateMeasurement(db, actorOf(ctx), req.params.id, body, readData, fields) });
  });

  router.delete('/measurements/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    deleteMeasurement(db, actorOf(ctx), req.params.id);
    res.status(204).end();
  });

  return router;
}

import fs from 'node:fs';
import path from 'node:path';

import { Router, type Request, type Response } from 'express';
import { and, asc, eq, sql } from 'drizzle-orm';
import multer from 'multer';

import { schema } from '@/db';
import { photoLimits, photoMimeTypes, photoPatchSchema, type Photo } from '@/shared/measurements';

import { requireShopRole, type InShop } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { HttpError, notFound, parse } from '../http';
import { requireJob } from '../scope';
import { allowedExtensions, detectImageType, extensionFor } from '../uploads/image-type';
import { requireMultipart, runMultipart } from '../uploads/multipart';

type PhotoRow = typeof schema.photos.$inferSelect;

export const PHOTO_FIELD = 'photos';

export function toPhoto(row: PhotoRow): Photo {
  return {
    id: row.id,
    jobId: row.jobId,
    originalName: row.originalName,
    caption: row.caption,
    mimeType: row.mimeType,
    size: row.size,
    shareable: row.shareable,
    url: `/api/photos/${row.id}/file`,
    createdAt: row.createdAt.toISOString(),
  };
}

const inShop = (shopId: string, id: string) => and(eq(schema.photos.id, id), eq(schema.photos.shopId, shopId));

/** Reads the first bytes of a stored file. */
function readHead(file: string): Uint8Array {
  const fd = fs.openSync(file, 'r');
  try {
    const head = Buffer.alloc(16);
    const n = fs.readSync(fd, head, 0, head.length, 0);
    return head.subarray(0, n);
  } finally {
    fs.closeSync(fd);
  }
}

/** Streams a stored photo with headers that keep browsers from guessing its type. */
export async function sendPhotoFile(res: Response, uploadsDir: string, row: Pick<PhotoRow, 'id' | 'shopId' | 'storedName' | 'mimeType'>) {
  const file = path.join(uploadsDir, row.shopId, row.storedName);
  if (!fs.existsSync(file)) throw new HttpError(404, 'not_found', "This photo's file is missing from the server");
  res.setHeader('Content-Type', row.mimeType);
  res.setHeader('Content-Length', String(fs.statSync(file).size));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, max-age=3600');
  res.setHeader('Content-Disposition', `inline; filename="photo-${row.id}${extensionFor[row.mimeType]}"`);
  await new Promise<void>((resolve, reject) => {
    const stream = fs.createReadStream(file);
    stream.on('error', reject);
    stream.on('end', () => resolve());
    stream.pipe(res);
  });
}

function removeQuietly(file: string) {
  try {
    fs.rmSync(file, { force: true });
  } catch (error) {
    console.error(`Could not remove ${file}`, error);
  }
}

/**
 * Photos of failed parts on a job. Files go to `<uploadsDir>/<shopId>/` under
 * generated names; a file is served only to members of its shop who may read
 * measurements (anyone else gets 404, as if it did not exist).
 */
export function photosRouter({ db, auth, uploadsDir }: AppDeps) {
  const router = Router();

  /** One multer per request: the files it writes are tracked so a refused upload leaves nothing behind. */
  function photoUpload(shopId: string, written: string[]) {
    const folder = path.join(uploadsDir, shopId);
    return multer({
      storage: multer.diskStorage({
        destination: (_req, _file, cb) => {
          fs.mkdir(folder, { recursive: true }, (error) => cb(error ?? null, folder));
        },
        // The final extension comes from the content; until it is checked the file is a ".part".
        filename: (_req, _file, cb) => {
          const name = `${crypto.randomUUID()}.part`;
          written.push(path.join(folder, name));
          cb(null, name);
        },
      }),
      limits: { fileSize: photoLimits.maxBytes, files: photoLimits.maxFiles, fields: 10, parts: photoLimits.maxFiles + 10 },
      fileFilter: (_req, file, cb) => {
        const ext = path.extname(file.originalname).toLowerCase();
        const typeOk = (photoMimeTypes as readonly string[]).includes(file.mimetype) || file.mimetype === 'application/octet-stream';
        if ((allowedExtensions as readonly string[]).includes(ext) && typeOk) return cb(null, true);
        const text = `${file.originalname} is not a photo we take: send JPEG, PNG or WebP files (.jpg, .png, .webp)`;
        cb(new HttpError(400, 'invalid_file', text, { [file.originalname]: text }));
      },
    }).array(PHOTO_FIELD, photoLimits.maxFiles);
  }

  async function readerOr404(req: Request): Promise<InShop> {
    try {
      return await requireShopRole(auth, db, req, { measurement: ['read'] });
    } catch (error) {
      if (error instanceof HttpError && error.status === 403) throw notFound('Photo');
      throw error;
    }
  }

  router.get('/jobs/:jobId/photos', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['read'] });
    requireJob(db, ctx.shop.id, req.params.jobId);
    const rows = db
      .select()
      .from(schema.photos)
      .where(and(eq(schema.photos.jobId, req.params.jobId), eq(schema.photos.shopId, ctx.shop.id)))
      .orderBy(asc(schema.photos.createdAt), asc(sql`${schema.photos}.rowid`))
      .all();
    res.json({ photos: rows.map(toPhoto) });
  });

  router.post('/jobs/:jobId/photos', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const jobId = req.params.jobId;
    requireJob(db, ctx.shop.id, jobId);
    requireMultipart(req, PHOTO_FIELD);
    const written: string[] = [];
    const kept: string[] = [];
    try {
      await runMultipart(photoUpload(ctx.shop.id, written), req, res, {
        field: PHOTO_FIELD,
        maxFileSize: `Each photo must be ${photoLimits.maxBytes / 1024 / 1024} MB or less: resize it or send a smaller one`,
        maxFiles: `Send at most ${photoLimits.maxFiles} photos at a time`,
      });
      const files = Array.isArray(req.files) ? req.files : [];
      if (files.length === 0) {
        const text = 'Choose at least one photo (JPEG, PNG or WebP)';
        throw new HttpError(400, 'invalid', `${PHOTO_FIELD}: ${text}`, { [PHOTO_FIELD]: text });
      }
      const captionSent: unknown = (req.body as Record<string, unknown> | undefined)?.caption;
      const { caption = '' } = parse(photoPatchSchema.pick({ caption: true }), { caption: typeof captionSent === 'string' ? captionSent : undefined });

      // The content decides the type: a PNG named .jpg is stored as the PNG it is; text named .png is refused.
      const checked = files.map((file) => ({ file, type: detectImageType(readHead(file.path)) }));
      const bad = checked.filter((c) => c.type === null);
      if (bad.length) {
        const fields = Object.fromEntries(
          bad.map(({ file }) => [file.originalname, `${file.originalname} is not a JPEG, PNG or WebP image (its content says otherwise)`]),
        );
        const [first] = bad;
        throw new HttpError(400, 'invalid_file', `${first?.file.originalname ?? 'A file'} is not a JPEG, PNG or WebP image. Nothing was saved.`, fields);
      }
      const stored = checked.map(({ file, type }) => {
        const mimeType = type ?? 'image/jpeg';
        const storedName = path.basename(file.filename, '.part') + extensionFor[mimeType];
        const finalPath = path.join(path.dirname(file.path), storedName);
        fs.renameSync(file.path, finalPath);
        kept.push(finalPath);
        return { id: crypto.randomUUID(), storedName, originalName: file.originalname.slice(0, 200), mimeType, size: file.size };
      });
      const rows = db.transaction((tx) => {
        requireJob(tx, ctx.shop.id, jobId);
        const inserted = stored.map((s) =>
          tx
            .insert(schema.photos)
            .values({ ...s, shopId: ctx.shop.id, jobId, caption, createdBy: ctx.user.id })
            .returning()
            .get(),
        );
        for (const p of inserted) {
          audit(tx, {
            shopId: ctx.shop.id,
            userId: ctx.user.id,
            action: 'create',
            entity: 'photo',
            entityId: p.id,
            detail: { jobId, originalName: p.originalName, mimeType: p.mimeType, size: p.size },
          });
        }
        return inserted;
      });
      res.status(201).json({ photos: rows.map(toPhoto) });
    } catch (error) {
      for (const file of [...written, ...kept]) removeQuietly(file);
      throw error;
    }
  });

  router.get('/photos/:id/file', async (req, res) => {
    const ctx = await readerOr404(req);
    const row = db.select().from(schema.photos).where(inShop(ctx.shop.id, req.params.id)).get();
    if (!row) throw notFound('Photo');
    await sendPhotoFile(res, uploadsDir, row);
  });

  router.patch('/photos/:id', async (req, res) => {
    const body = parse(photoPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const id = req.params.id;
    const row = db.transaction((tx) => {
      const current = tx.select({ id: schema.photos.id }).from(schema.photos).where(inShop(ctx.shop.id, id)).get();
      if (!current) throw notFound('Photo');
      const updated =
        Object.keys(body).length === 0
          ? tx.select().from(schema.photos).where(inShop(ctx.shop.id, id)).get()
          : tx.update(schema.photos).set(body).where(inShop(ctx.shop.id, id)).returning().get();
      if (!updated) throw notFound('Photo');
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'update', entity: 'photo', entityId: id, detail: { fields: Object.keys(body) } });
      return updated;
    });
    res.json({ photo: toPhoto(row) });
  });

  router.delete('/photos/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const id = req.params.id;
    const removed = db.transaction((tx) => {
      const current = tx.select().from(schema.photos).where(inShop(ctx.shop.id, id)).get();
      if (!current) throw notFound('Photo');
      tx.delete(schema.photos).where(inShop(ctx.shop.id, id)).run();
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'delete',
        entity: 'photo',
        entityId: id,
        detail: { jobId: current.jobId, originalName: current.originalName },
      });
      return current;
    });
    // The row is gone first, so a file left by a failed removal is never served.
    removeQuietly(path.join(uploadsDir, removed.shopId, removed.storedName));
    res.status(204).end();
  });

  return router;
}

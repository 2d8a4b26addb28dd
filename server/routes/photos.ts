import fs from 'node:fs';
import path from 'node:path';

import { Router, type Request } from 'express';
import multer from 'multer';

import { photoLimits, photoMimeTypes, photoPatchSchema } from '@/shared/measurements';

import { actorOf, requireShopRole, type InShop } from '../access';
import type { AppDeps } from '../deps';
import { HttpError, notFound, parse } from '../http';
import { requireJob } from '../store/jobs';
import { deletePhoto, insertPhotos, jobPhotos, requirePhotoRow, updatePhoto } from '../store/photos';
import { allowedExtensions, detectImageType, extensionFor } from '../uploads/image-type';
import { readHead, removeQuietly, sendPhotoFile } from '../uploads/photo-files';
import { requireMultipart, runMultipart } from '../uploads/multipart';

export const PHOTO_FIELD = 'photos';

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
    res.json({ photos: jobPhotos(db, ctx.shop.id, req.params.jobId) });
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
      res.status(201).json({ photos: insertPhotos(db, actorOf(ctx), jobId, stored, caption) });
    } catch (error) {
      for (const file of [...written, ...kept]) removeQuietly(file);
      throw error;
    }
  });

  router.get('/photos/:id/file', async (req, res) => {
    const ctx = await readerOr404(req);
    await sendPhotoFile(res, uploadsDir, requirePhotoRow(db, ctx.shop.id, req.params.id));
  });

  router.patch('/photos/:id', async (req, res) => {
    const body = parse(photoPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    res.json({ photo: updatePhoto(db, actorOf(ctx), req.params.id, body) });
  });

  router.delete('/photos/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const removed = deletePhoto(db, actorOf(ctx), req.params.id);
    // The row is gone first, so a file left by a failed removal is never served.
    removeQuietly(path.join(uploadsDir, removed.shopId, removed.storedName));
    res.status(204).end();
  });

  return router;
}

import fs from 'node:fs';
import path from 'node:path';

import type { Response } from 'express';

import { HttpError } from '../http';
import type { PhotoRow } from '../store/photos';
import { extensionFor } from './image-type';

/** Reads the first bytes of a stored file. */
export function readHead(file: string): Uint8Array {
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

export function removeQuietly(file: string) {
  try {
    fs.rmSync(file, { force: true });
  } catch (error) {
    console.error(`Could not remove ${file}`, error);
  }
}

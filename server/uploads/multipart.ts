import type { Request, RequestHandler, Response } from 'express';
import multer from 'multer';

import { HttpError } from '../http';

/** What a multipart limit means, in words that say what to fix. */
export type LimitWords = { maxFileSize: string; maxFiles: string; field: string };

/**
 * Runs one multer middleware as a promise, turning its errors into the API's
 * own 400 / 413 answers. Call it after the person is authorized, so nobody
 * else can make the server write a file.
 */
export function runMultipart(upload: RequestHandler, req: Request, res: Response, words: LimitWords): Promise<void> {
  return new Promise((resolve, reject) => {
    upload(req, res, (error: unknown) => {
      if (!error) return resolve();
      if (error instanceof HttpError) return reject(error);
      if (error instanceof multer.MulterError) {
        const field = error.field ?? words.field;
        switch (error.code) {
          case 'LIMIT_FILE_SIZE':
            return reject(new HttpError(413, 'too_large', `${field}: ${words.maxFileSize}`, { [field]: words.maxFileSize }));
          case 'LIMIT_FILE_COUNT':
            return reject(new HttpError(400, 'too_many_files', words.maxFiles, { [words.field]: words.maxFiles }));
          case 'LIMIT_UNEXPECTED_FILE': {
            const text = `Send the file in the form field named "${words.field}"`;
            return reject(new HttpError(400, 'invalid', text, { [field]: text }));
          }
          default:
            return reject(new HttpError(400, 'invalid', `The upload was refused: ${error.message}`, { [field]: error.message }));
        }
      }
      // A disk or system failure (it has an errno) is ours; anything else the form parser
      // throws (a malformed part header, a missing boundary, a cut-off body) is the request's.
      if ((error as NodeJS.ErrnoException).errno !== undefined) return reject(error);
      const message = error instanceof Error ? error.message : String(error);
      const text = `Send the file as a well-formed multipart form upload in the field "${words.field}" (${message})`;
      return reject(new HttpError(400, 'invalid', text, { [words.field]: text }));
    });
  });
}

/** True when the request says it is a multipart form; multer silently skips anything else. */
export function requireMultipart(req: Request, field: string) {
  if (!req.is('multipart/form-data')) {
    const text = `Send the file as multipart/form-data in the field "${field}"`;
    throw new HttpError(400, 'invalid', text, { [field]: text });
  }
}

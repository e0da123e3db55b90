import type { RequestHandler } from 'express';
import multer from 'multer';
import { DomainError } from '@revloop/domain';
import { UNSAFE_NAME_MESSAGE } from '@revloop/domain/text';
import type { BlobStore } from './blob-store';

/**
 * Streams one multipart file to a temporary file in the data folder, never into memory. Past the size limit the
 * request fails with 413 and multer removes the partial file, so nothing is left on disk.
 */
export function singleFileUpload(store: BlobStore, field: string, maxBytes: (req: Parameters<RequestHandler>[0]) => number): RequestHandler {
  return (req, res, next) => {
    const limit = maxBytes(req);
    const upload = multer({
      storage: multer.diskStorage({
        destination: store.tempDir,
        filename: (_req, _file, cb) => cb(null, store.tempPath().split('/').pop()!),
      }),
      // Keep the client's path so a name like "../x.bin" reaches our own name check and is refused, not silently trimmed.
      preservePath: true,
      limits: { fileSize: limit, files: 1, fields: 20, fieldSize: 64 * 1024 },
    }).single(field);
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') {
        return next(new DomainError('payload_too_large', `The file is larger than this shop allows (${Math.round(limit / 1048576)} MiB).`));
      }
      if (err instanceof multer.MulterError) return next(new DomainError('validation', `Upload refused: ${err.message}.`));
      // The client went away mid-upload (closed tab, lost network): multer has removed the partial file and no one
      // is left to answer, so this is an event worth a line, not an error.
      if (err instanceof Error && err.message === 'Request aborted') {
        req.log?.info({ path: req.path }, 'client aborted the upload');
        return;
      }
      // busboy's own refusals: a control character in a part header, a form cut off mid-way.
      if (err instanceof Error && /Malformed part header|Unexpected end of form|Multipart: Boundary not found/.test(err.message)) {
        return next(new DomainError('validation', `The upload could not be read, and the form must arrive whole. ${UNSAFE_NAME_MESSAGE}`));
      }
      next(err);
    });
  };
}

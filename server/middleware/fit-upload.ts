import type { RequestHandler } from 'express';
import multer from 'multer';
import { FIT_FILE_FIELDS, MAX_FIT_FILE_BYTES } from '@shared/limits';
import { AppError, PayloadTooLargeError, ValidationError } from '../lib/errors';

// Two FIT files held in memory (never written to disk: they may carry location),
// plus the form's fields. Multer's own errors become messages a rider understands.
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_FIT_FILE_BYTES, files: FIT_FILE_FIELDS.length, fields: 4, parts: 8, fieldSize: 64 * 1024 },
}).fields(FIT_FILE_FIELDS.map((name) => ({ name, maxCount: 1 })));

const MAX_MB = MAX_FIT_FILE_BYTES / (1024 * 1024);

export const fitUpload: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      const field = err.field && FIT_FILE_FIELDS.includes(err.field as never) ? err.field : 'files';
      switch (err.code) {
        case 'LIMIT_FILE_SIZE':
          return next(
            new PayloadTooLargeError(
              `${field === 'fileB' ? 'The second file' : 'The first file'} is larger than ${MAX_MB} MB, which no ride recording should be.`,
            ),
          );
        case 'LIMIT_FILE_COUNT':
        case 'LIMIT_UNEXPECTED_FILE':
          return next(
            new ValidationError('Upload exactly two FIT files: the first (A) and the second (B).', {
              fields: { files: 'exactly two files' },
            }),
          );
        default:
          return next(new ValidationError(`The upload could not be read: ${err.message}.`));
      }
    }
    next(err instanceof AppError ? err : new ValidationError('The upload could not be read.'));
  });
};

export function uploadedFile(req: Parameters<RequestHandler>[0], field: (typeof FIT_FILE_FIELDS)[number]) {
  const files = req.files as Record<string, Express.Multer.File[]> | undefined;
  return files?.[field]?.[0];
}

import type { Request, Response } from 'express';
import multer from 'multer';
import { AppError } from '../http/app-error.js';

/** One received upload: the file in memory and the text fields beside it. */
export interface Upload {
  file: { bytes: Buffer; filename: string; contentType: string };
  fields: Record<string, unknown>;
}

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(bytes % (1024 * 1024) === 0 ? 0 : 2)} MB`;
}

/**
 * A filename fit to store and show: no control characters (CR/LF included), no markup or quote
 * characters, no path separators, at most 255 characters; `upload` when nothing is left.
 */
export function safeFilename(name: string): string {
  const cleaned = name
    // eslint-disable-next-line no-control-regex -- control characters are what this removes
    .replace(/[\u0000-\u001f\u007f]+/g, ' ')
    .replace(/[<>"'`&\\/]/g, '_')
    .replace(/\s+/g, ' ')
    .trim()
    .slice(-255);
  return cleaned === '' ? 'upload' : cleaned;
}

/**
 * Reads a multipart body with multer into memory: one file in field `file` of at most
 * `limitBytes` (413 `file_too_large` beyond, nothing kept), a few short text fields.
 */
export async function receiveUpload(
  req: Request,
  res: Response,
  limitBytes: number,
): Promise<Upload> {
  const middleware = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: limitBytes, files: 1, fields: 8, fieldSize: 16 * 1024, parts: 12 },
  }).single('file');
  await new Promise<void>((resolve, reject) => {
    middleware(req, res, (err: unknown) => (err ? reject(err) : resolve()));
  }).catch((err: unknown) => {
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        throw new AppError(
          413,
          'file_too_large',
          `file: the upload is larger than the limit of ${megabytes(limitBytes)} (${limitBytes} bytes).`,
          'file',
        );
      }
      const field = err.code === 'LIMIT_UNEXPECTED_FILE' ? 'file' : (err.field ?? 'file');
      throw new AppError(400, 'invalid_upload', `${field}: ${err.message}.`, field);
    }
    throw new AppError(
      400,
      'invalid_upload',
      'The upload could not be read as multipart form data.',
      'file',
    );
  });
  const file = req.file;
  if (!file) {
    throw new AppError(
      400,
      'invalid_upload',
      'file: send the table as a multipart form field named "file".',
      'file',
    );
  }
  if (file.size === 0) throw new AppError(400, 'empty_file', 'file: the file is empty.', 'file');
  return {
    file: {
      bytes: file.buffer,
      filename: safeFilename(file.originalname),
      contentType: file.mimetype,
    },
    fields: (req.body ?? {}) as Record<string, unknown>,
  };
}

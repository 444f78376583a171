import type { RequestHandler } from 'express';
import multer from 'multer';
import { AppError } from './app-error.js';

/** Upload limits, all under MariaDB's default 16 MiB max_allowed_packet. */
export const UPLOAD_LIMITS = {
  readingsCsvBytes: 2 * 1024 * 1024,
  sweepCsvBytes: 4 * 1024 * 1024,
  attachmentBytes: 12 * 1024 * 1024,
  /** A photo or PDF on an inspection finding. */
  findingFileBytes: 10 * 1024 * 1024,
  /** A units spreadsheet (.xlsx or CSV), and the most an .xlsx may unpack to (its sheets are XML read in memory). */
  unitSheetBytes: 4 * 1024 * 1024,
  unitSheetUnpackedBytes: 64 * 1024 * 1024,
} as const;

// One file in memory under `file`; oversize → 413 (error middleware), no file → 400 naming the field.
export function singleFile(maxBytes: number): RequestHandler[] {
  const mw = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 20, fieldSize: 64 * 1024 } }).single('file');
  return [
    mw,
    (req, _res, next) => {
      if (!req.file) return next(new AppError('invalid_input', 'Attach a file in the field "file".', 400, { file: 'required' }));
      next();
    },
  ];
}

/** The lower-case extension of a file name, with its dot ('.csv'), or ''. */
export function extensionOf(name: string): string {
  const m = /\.[A-Za-z0-9]+$/.exec(name);
  return m ? m[0].toLowerCase() : '';
}

export const unsupportedType = (message: string) => new AppError('unsupported_file_type', message, 415, { file: message });

import type { RequestHandler } from 'express';
import multer from 'multer';
import { fileTypeProblem, type UploadType } from '../../shared/uploads/file-types.js';
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

/**
 * 415 naming the field `file`, the file and the types this uploader takes, for a name (or, without an extension, a
 * MIME type) outside its list in shared/uploads/file-types.ts: the list the client's picker and check read too.
 */
export function refuseOtherTypes(type: UploadType, file: { originalname: string; mimetype?: string }): void {
  const problem = fileTypeProblem(type, utf8Name(file.originalname), file.mimetype);
  if (problem !== null) throw unsupportedType(problem);
}

/** The multipart parser reads a file name's bytes as Latin-1; browsers send UTF-8: decode again when that is valid. */
export function utf8Name(name: string): string {
  if (!/[\x80-\xff]/.test(name) || /[^\x00-\xff]/.test(name)) return name;
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(Buffer.from(name, 'latin1'));
  } catch {
    return name;
  }
}

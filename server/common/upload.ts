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

// One file in memory under `file`; oversize → 413, no file or an empty one → 400 naming the field; a body the multipart parser cannot
// read (cut off half-way, no boundary, a malformed part header), a second file or a file under another field name →
// 400 `invalid_upload` naming `file`, never a 500.
export function singleFile(maxBytes: number): RequestHandler[] {
  const mw = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 20, fieldSize: 64 * 1024 } }).single('file');
  return [
    (req, res, next) => mw(req, res, (err?: unknown) => next(err === undefined || err === null ? undefined : uploadError(err, maxBytes))),
    (req, _res, next) => {
      if (!req.file) return next(new AppError('invalid_input', 'Attach a file in the field "file".', 400, { file: 'required' }));
      if (req.file.size === 0) return next(new AppError('invalid_input', 'The file is empty; nothing was saved.', 400, { file: 'the file is empty' }));
      next();
    },
  ];
}

const MULTER_MESSAGES: Partial<Record<multer.ErrorCode, string>> = {
  LIMIT_FILE_COUNT: 'send one file only, in the field "file"',
  LIMIT_UNEXPECTED_FILE: 'send the file in the field "file" (and only one file)',
  LIMIT_PART_COUNT: 'too many parts in the form',
  LIMIT_FIELD_KEY: 'a field name is too long',
  LIMIT_FIELD_VALUE: 'a field value is too long',
  LIMIT_FIELD_COUNT: 'too many fields in the form',
};

/** What the multipart parser (multer, busboy) raised, as the API's error: 413 for a file too large, else 400 naming `file`. */
export function uploadError(err: unknown, maxBytes: number): AppError {
  if (err instanceof AppError) return err;
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') {
      const limit = `at most ${(maxBytes / (1024 * 1024)).toFixed(maxBytes % (1024 * 1024) === 0 ? 0 : 1)} MiB`;
      return new AppError('file_too_large', `The file is larger than the upload limit (${limit}).`, 413, { file: `too large: ${limit}` });
    }
    const message = MULTER_MESSAGES[err.code] ?? err.message;
    return new AppError('invalid_upload', `Upload rejected: ${message}.`, 400, { file: message });
  }
  // busboy: "Unexpected end of form", "Multipart: Boundary not found", "Malformed part header", …
  const raw = err instanceof Error ? err.message : String(err);
  const message = /boundary/i.test(raw)
    ? 'the multipart body has no boundary: send the file as multipart/form-data in the field "file"'
    : /end of form/i.test(raw)
      ? 'the upload was cut off before its end: send the file again'
      : `the multipart body cannot be read (${raw.slice(0, 120)})`;
  return new AppError('invalid_upload', `Upload rejected: ${message}.`, 400, { file: message });
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

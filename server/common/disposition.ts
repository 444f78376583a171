import { encodeExtended } from 'content-disposition';

/** The ASCII stand-in for a file name: anything outside printable ASCII, quotes, backslashes and % become "_". */
export function asciiFileName(name: string): string {
  return name.replace(/[^\x20-\x7e]|["\\%]/g, '_') || 'file';
}

/**
 * A Content-Disposition header that is valid for any file name (RFC 6266): a quoted ASCII `filename` and, when that is
 * not the exact name (or `utf8: 'always'`), the exact name as UTF-8 in `filename*` (RFC 8187, encoded by the
 * `content-disposition` package). A raw non-Latin-1 name in the header would make Node refuse the answer (a 500).
 */
export function disposition(name: string, opts: { type?: 'attachment' | 'inline'; utf8?: 'always' | 'when-needed' } = {}): string {
  const fallback = asciiFileName(name);
  const header = `${opts.type ?? 'attachment'}; filename="${fallback}"`;
  return fallback !== name || opts.utf8 === 'always' ? `${header}; filename*=${encodeExtended(name || 'file')}` : header;
}

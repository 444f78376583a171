// One list per uploader: the file types it takes (extension, MIME types, a name a person reads). The file picker's
// `accept` filter, the check the client makes as soon as a file is picked, the help under the picker and the server's
// 415 answer all read these lists, so they cannot drift apart. The server still judges the content of every upload
// (shared/imports/sniff.ts): a name is only the first check.

export interface FileKind {
  /** Lower-case extension with its dot. */
  ext: string;
  /** What a person calls it ("CSV", "COMTRADE"); kinds with the same name are listed together. */
  name: string;
  /**
   * MIME types a browser reports for it, used in the picker filter and for a file without an extension. Left empty for
   * types whose MIME type would open the filter to everything (a COMTRADE .dat is application/octet-stream, a .txt
   * text/plain like any .log or .ini file).
   */
  mime: readonly string[];
}

export interface UploadType {
  /** What the uploader takes, with its article: "a sweep file", "a relay record". */
  noun: string;
  kinds: readonly FileKind[];
}

const CSV: FileKind = { ext: '.csv', name: 'CSV', mime: ['text/csv'] };
const TXT: FileKind = { ext: '.txt', name: 'text', mime: [] };
const XLSX: FileKind = { ext: '.xlsx', name: 'Excel', mime: ['application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'] };
const PDF: FileKind = { ext: '.pdf', name: 'PDF', mime: ['application/pdf'] };

/** The uploaders and what each takes (what the server accepts: see the services named beside each). */
export const UPLOAD_TYPES = {
  /** A sweep trace (server/features/readings/sweeps.service.ts): comma-separated frequencyHz,magnitudeDb[,phaseDeg]. */
  sweep: { noun: 'a sweep file', kinds: [CSV, TXT] },
  /** Readings of a post-fault session (server/features/events/sessions.service.ts). */
  sessionReadings: { noun: 'a readings file', kinds: [CSV, TXT] },
  /** One reading set of a unit (server/features/units/units-import.service.ts): the readings CSV or a sheet of it. */
  unitReadingSet: { noun: 'a readings file', kinds: [CSV, TXT, XLSX] },
  /** Units, or reading sets of many units, from a spreadsheet (server/features/units/units-import.service.ts). */
  spreadsheet: { noun: 'a spreadsheet', kinds: [XLSX, CSV, TXT] },
  /** A relay or fault-recorder record on an event (server/features/attachments/attachments.service.ts). */
  relayRecord: {
    noun: 'a relay record',
    kinds: [
      // IEEE Std C37.111 (COMTRADE): configuration, data, and the 2013 edition's combined file.
      { ext: '.cfg', name: 'COMTRADE', mime: [] },
      { ext: '.dat', name: 'COMTRADE', mime: [] },
      { ext: '.cff', name: 'COMTRADE', mime: [] },
      CSV,
      TXT,
      PDF,
    ],
  },
  /** A photo or document on an inspection finding (server/features/attachments/attachments.service.ts). */
  findingFile: {
    noun: 'a photo or PDF',
    kinds: [
      { ext: '.jpg', name: 'JPEG', mime: ['image/jpeg'] },
      { ext: '.jpeg', name: 'JPEG', mime: ['image/jpeg'] },
      { ext: '.png', name: 'PNG', mime: ['image/png'] },
      { ext: '.webp', name: 'WebP', mime: ['image/webp'] },
      PDF,
    ],
  },
} as const satisfies Record<string, UploadType>;

export type UploadTypeName = keyof typeof UPLOAD_TYPES;

/** The lower-case extension of a file name with its dot ('.csv'), or '' (a name like '.profile' has none). */
export function fileExtension(fileName: string): string {
  const base = fileName.split(/[\\/]/).pop() ?? '';
  const dot = base.lastIndexOf('.');
  return dot <= 0 || dot === base.length - 1 ? '' : base.slice(dot).toLowerCase();
}

/** The picker filter (`accept` attribute): every extension, then the MIME types, each once. */
export function acceptAttribute(type: UploadType): string {
  return [...new Set([...type.kinds.map((k) => k.ext), ...type.kinds.flatMap((k) => k.mime)])].join(',');
}

const joinOr = (xs: readonly string[]) => (xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} or ${xs[xs.length - 1]}`);

/** The types in words, kinds of one name together: "COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf)". */
export function describeTypes(type: UploadType): string {
  const groups = new Map<string, string[]>();
  for (const k of type.kinds) groups.set(k.name, [...(groups.get(k.name) ?? []), k.ext]);
  return joinOr([...groups].map(([name, exts]) => `${name} (${exts.join(', ')})`));
}

const article = (words: string) => (/^[aeiou]/i.test(words) ? 'an' : 'a');

/**
 * Why a picked file is not one this uploader takes, or null when it is: judged by its extension, or by its MIME type
 * when it has none. "report.docx is not a sweep file: pick a CSV (.csv) or text (.txt) file."
 */
export function fileTypeProblem(type: UploadType, fileName: string, mimeType?: string): string | null {
  const ext = fileExtension(fileName);
  if (ext !== '' && type.kinds.some((k) => k.ext === ext)) return null;
  const mime = (mimeType ?? '').toLowerCase().split(';')[0].trim();
  if (ext === '' && mime !== '' && type.kinds.some((k) => k.mime.includes(mime))) return null;
  const list = describeTypes(type);
  const name = fileName.trim() === '' ? 'The file' : fileName;
  const without = ext === '' ? ' (it has no extension)' : '';
  return `${name}${without} is not ${type.noun}: pick ${article(list)} ${list} file.`;
}

/** The columns of a sweep file in words (the parser's error keys name them: "row 4.magnitudeDb"). */
export const SWEEP_FILE_COLUMNS: Record<string, string> = {
  frequencyHz: 'frequency (Hz)',
  magnitudeDb: 'magnitude (dB)',
  phaseDeg: 'phase (deg)',
};

/**
 * Where a problem in an uploaded file is, in words, from the key the parsers give it: "row 7.hvKV" → "Row 7, HV (kV)"
 * with `labels` naming the columns; `row` is the word for a numbered line ("line" for a text file).
 */
export function problemPlace(key: string, labels: Record<string, string> = {}, row = 'Row'): string {
  const at = /^row (\d+)(?:\.(\w+))?$/.exec(key);
  if (at) return at[2] ? `${row} ${at[1]}, ${labels[at[2]] ?? at[2]}` : `${row} ${at[1]}`;
  const col = /^(?:columns|mapping)\.(\w+)$/.exec(key);
  if (col) return labels[col[1]] ?? col[1];
  const words: Record<string, string> = { file: 'File', header: 'Header', more: 'More' };
  return words[key] ?? labels[key] ?? key;
}

/** Problems of a file sorted by their row (file-wide ones first, "more" last), each with its place in words. */
export function fileProblemList(fields: Record<string, string>, labels: Record<string, string> = {}, row = 'Row'): { key: string; place: string; message: string }[] {
  const rank = (key: string) => {
    const m = /^row (\d+)/.exec(key);
    return m ? Number(m[1]) : key === 'more' ? Number.MAX_SAFE_INTEGER : 0;
  };
  return Object.entries(fields)
    .map(([key, message]) => ({ key, place: problemPlace(key, labels, row), message }))
    .sort((a, b) => rank(a.key) - rank(b.key));
}

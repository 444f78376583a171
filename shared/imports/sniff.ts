// Content checks for uploads: browsers send odd MIME types, so the server looks at the bytes themselves.
import { describeTypes, UPLOAD_TYPES, type FileKind } from '../uploads/file-types.js';

export type RelayRecordKind = 'comtrade-cfg' | 'comtrade-dat' | 'comtrade-cff' | 'csv' | 'pdf' | 'text';
export type RelayRecordCheck = { kind: RelayRecordKind } | { error: string };

/** How the content of each kind of file a person names in the relay-record list is checked. */
function contentKind(kind: FileKind): RelayRecordKind | undefined {
  if (kind.name === 'COMTRADE') {
    const comtrade: Record<string, RelayRecordKind> = { '.cfg': 'comtrade-cfg', '.dat': 'comtrade-dat', '.cff': 'comtrade-cff' };
    return comtrade[kind.ext];
  }
  const byName: Record<string, RelayRecordKind> = { CSV: 'csv', text: 'text', PDF: 'pdf' };
  return byName[kind.name];
}

/**
 * The relay-record extensions (without their dot) and the content check of each, from the one list the picker, the
 * client's check and the server's 415 read (shared/uploads/file-types.ts `UPLOAD_TYPES.relayRecord`). A type listed there
 * without a content check here is left out: tests/shared/imports/sniff.test.ts checks that none is.
 */
export const RELAY_RECORD_KINDS: Readonly<Record<string, RelayRecordKind>> = Object.fromEntries(
  UPLOAD_TYPES.relayRecord.kinds.flatMap((k) => {
    const kind = contentKind(k);
    return kind === undefined ? [] : [[k.ext.slice(1), kind] as const];
  }),
);

// IEEE Std C37.111-1999/-2013 (COMTRADE), configuration file: line 1 is station_name,rec_dev_id[,rev_year] (no rev_year
// means the 1991 edition), line 2 is TT,##A,##D (total channels, analog count + 'A', status count + 'D'; TT = ##A + ##D).
const COMTRADE_REV_YEARS = ['1991', '1999', '2013'];
const COMTRADE_CHANNEL_LINE = /^\s*(\d+)\s*,\s*(\d+)\s*A\s*,\s*(\d+)\s*D\s*,?\s*$/i;
// IEEE Std C37.111-2013 combined file format (.cff): sections headed "--- file type: CFG ---", "--- file type: INF ---", …
const CFF_CFG_MARKER = /^\s*---\s*file type:\s*CFG\s*---\s*$/i;
const CFF_ANY_MARKER = /^\s*---\s*file type:/i;

const PDF_SIGNATURE = [0x25, 0x50, 0x44, 0x46, 0x2d]; // "%PDF-" (ISO 32000-1 §7.5.2 file header)
// "PK\x03\x04" local file header, "PK\x05\x06" empty archive, "PK\x07\x08" spanned archive (PKWARE APPNOTE.TXT §4.3).
const ZIP_SIGNATURES = [
  [0x50, 0x4b, 0x03, 0x04],
  [0x50, 0x4b, 0x05, 0x06],
  [0x50, 0x4b, 0x07, 0x08],
];

function startsWith(bytes: Uint8Array, signature: readonly number[]): boolean {
  return signature.length <= bytes.length && signature.every((b, i) => bytes[i] === b);
}

/** No NUL and no control bytes other than tab, line feed, form feed, carriage return and a closing SUB (DOS end of file). */
function hasOnlyTextBytes(bytes: Uint8Array): boolean {
  for (let i = 0; i < bytes.length; i += 1) {
    const b = bytes[i];
    if (b >= 0x20 || b === 0x09 || b === 0x0a || b === 0x0c || b === 0x0d) continue;
    if (b === 0x1a && i === bytes.length - 1) continue;
    return false;
  }
  return true;
}

function decodeUtf8(bytes: Uint8Array): string | null {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
}

/** UTF-8 when the bytes are valid UTF-8, else Latin-1 (older relays write station names in an 8-bit code page). */
function decodeLenient(bytes: Uint8Array): string {
  const utf8 = decodeUtf8(bytes);
  if (utf8 !== null) return utf8;
  let out = '';
  for (let i = 0; i < bytes.length; i += 1) out += String.fromCharCode(bytes[i]);
  return out;
}

function withoutBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

function firstNonBlankLine(text: string): string {
  return text.split(/\r\n|\r|\n/).find((l) => l.trim() !== '') ?? '';
}

/** Whether uploaded bytes can be a CSV file: UTF-8 (or ASCII) text, no NUL or other binary bytes, a separator on line 1. */
export function looksLikeCsvText(bytes: Uint8Array): boolean {
  if (bytes.length === 0 || !hasOnlyTextBytes(bytes)) return false;
  const text = decodeUtf8(bytes);
  if (text === null) return false;
  return /[,;\t]/.test(firstNonBlankLine(withoutBom(text)));
}

/** The first two lines of a COMTRADE configuration checked; null when they are fine, else what is wrong. */
function comtradeConfigProblem(lines: readonly string[]): string | null {
  const station = (lines[0] ?? '').split(',');
  if (station.length < 2 || station.length > 3) {
    return "its first line should be station_name,rec_dev_id[,rev_year] (e.g. 'Harrow Cross,REL-T2,1999')";
  }
  if (station.length === 3 && !COMTRADE_REV_YEARS.includes(station[2].trim())) {
    return `its first line ends with revision year '${station[2].trim()}': it should be 1991, 1999 or 2013`;
  }
  const channels = COMTRADE_CHANNEL_LINE.exec(lines[1] ?? '');
  if (channels === null) return "its second line should be like '12,4A,8D'";
  const [total, analog, status] = channels.slice(1, 4).map(Number);
  if (total !== analog + status) {
    return `its second line gives ${total} channels but ${analog}A + ${status}D make ${analog + status}`;
  }
  return null;
}

function splitLines(text: string): string[] {
  return withoutBom(text).split(/\r\n|\r|\n/);
}

function extensionOf(fileName: string): string {
  const base = fileName.split(/[\\/]/).pop() ?? '';
  const dot = base.lastIndexOf('.');
  return dot <= 0 ? '' : base.slice(dot + 1).toLowerCase();
}

/** Which kind of relay record an upload is, judged by its extension and checked against its content. */
export function detectRelayRecord(fileName: string, bytes: Uint8Array): RelayRecordCheck {
  const ext = extensionOf(fileName);
  const kind = Object.hasOwn(RELAY_RECORD_KINDS, ext) ? RELAY_RECORD_KINDS[ext] : undefined;
  if (kind === undefined) {
    return {
      error: `relay records are ${describeTypes(UPLOAD_TYPES.relayRecord)} files: '${fileName}' is ${ext === '' ? 'without an extension' : `a .${ext} file`}`,
    };
  }
  const what = `the .${ext} file`;
  if (bytes.length === 0) return { error: `${what} is empty` };

  const isPdf = startsWith(bytes, PDF_SIGNATURE);
  if (kind === 'pdf') return isPdf ? { kind } : { error: `${what} is not a PDF document: it does not start with %PDF-` };
  if (isPdf) return { error: `${what} is a PDF document: upload it with a .pdf name` };
  if (ZIP_SIGNATURES.some((s) => startsWith(bytes, s))) {
    return { error: `${what} is a ZIP archive: unpack it and upload the files inside` };
  }

  switch (kind) {
    case 'comtrade-dat':
      // ASCII data (one sample a line, comma-separated numbers) or binary samples: both are valid COMTRADE.
      return { kind };
    case 'comtrade-cfg': {
      const notCfg = 'the .cfg file is not a COMTRADE configuration';
      if (!hasOnlyTextBytes(bytes)) return { error: `${notCfg}: it is not text` };
      const problem = comtradeConfigProblem(splitLines(decodeLenient(bytes)));
      return problem === null ? { kind } : { error: `${notCfg}: ${problem}` };
    }
    case 'comtrade-cff': {
      // The DAT section of a .cff may be binary, so only the text before it is read.
      const lines = splitLines(decodeLenient(bytes.subarray(0, 64 * 1024)));
      const marker = lines.findIndex((l) => CFF_CFG_MARKER.test(l));
      if (marker < 0) return { error: "the .cff file is not a COMTRADE combined file: it has no '--- file type: CFG ---' section" };
      const section = lines.slice(marker + 1);
      const end = section.findIndex((l) => CFF_ANY_MARKER.test(l));
      const problem = comtradeConfigProblem((end < 0 ? section : section.slice(0, end)).filter((l) => l.trim() !== ''));
      return problem === null ? { kind } : { error: `the CFG section of the .cff file is not a COMTRADE configuration: ${problem}` };
    }
    case 'csv':
      // Lenient on encoding (an 8-bit code page is fine): a relay record is kept as it is, not parsed here.
      if (!hasOnlyTextBytes(bytes)) return { error: `${what} is not text: it holds binary bytes` };
      return /[,;\t]/.test(firstNonBlankLine(withoutBom(decodeLenient(bytes))))
        ? { kind }
        : { error: `${what} is not CSV: its first line has no ',' ';' or tab between columns` };
    case 'text':
      return hasOnlyTextBytes(bytes) ? { kind } : { error: `${what} is not plain text: it holds binary bytes` };
  }
  return { error: `${what} cannot be checked` };
}

// ---- Spreadsheets (units import) ------------------------------------------------------------------------------------

export type SpreadsheetCheck = { kind: 'xlsx' | 'csv' } | { error: string; tooLarge?: boolean };

// Compound File Binary header (the old .xls format): D0 CF 11 E0 A1 B1 1A E1.
const CFB_SIGNATURE = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];

/** The names and total uncompressed size of a ZIP archive's entries, from its central directory (null: not readable). */
export function zipEntries(bytes: Uint8Array): { names: string[]; uncompressedBytes: number } | null {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  // End of central directory record: signature 0x06054b50, within the last 22 + 65535 bytes (APPNOTE.TXT §4.3.16).
  let end = -1;
  for (let i = bytes.length - 22; i >= Math.max(0, bytes.length - 22 - 0xffff); i -= 1) {
    if (view.getUint32(i, true) === 0x06054b50) {
      end = i;
      break;
    }
  }
  if (end < 0) return null;
  const count = view.getUint16(end + 10, true);
  let at = view.getUint32(end + 16, true);
  const names: string[] = [];
  let total = 0;
  for (let k = 0; k < count; k += 1) {
    if (at + 46 > bytes.length || view.getUint32(at, true) !== 0x02014b50) return null;
    const size = view.getUint32(at + 24, true);
    // 0xFFFFFFFF: the size is in a ZIP64 extra field (over 4 GiB): far beyond any sheet we take.
    total += size === 0xffffffff ? Number.MAX_SAFE_INTEGER / 2 : size;
    const nameLength = view.getUint16(at + 28, true);
    const extra = view.getUint16(at + 30, true);
    const comment = view.getUint16(at + 32, true);
    names.push(new TextDecoder().decode(bytes.subarray(at + 46, at + 46 + nameLength)));
    at += 46 + nameLength + extra + comment;
  }
  return { names, uncompressedBytes: total };
}

/**
 * Whether an upload is an Excel workbook (.xlsx: a ZIP holding xl/workbook.xml, unpacking to at most
 * `maxUncompressedBytes`) or CSV text (UTF-8, a separator on the first line), judged by its bytes, not its name.
 */
export function detectSpreadsheet(bytes: Uint8Array, maxUncompressedBytes: number): SpreadsheetCheck {
  if (bytes.length === 0) return { error: 'the file is empty' };
  if (startsWith(bytes, CFB_SIGNATURE)) return { error: 'the file is an old Excel 97-2003 workbook (.xls): save it as .xlsx or CSV' };
  if (startsWith(bytes, PDF_SIGNATURE)) return { error: 'the file is a PDF document, not a spreadsheet: use .xlsx or CSV' };
  if (startsWith(bytes, ZIP_SIGNATURES[0])) {
    const zip = zipEntries(bytes);
    if (zip === null) return { error: 'the file starts like a ZIP archive but cannot be read: save it again as .xlsx' };
    if (!zip.names.includes('xl/workbook.xml')) {
      const ods = zip.names.includes('content.xml') && zip.names.includes('mimetype');
      return { error: ods ? 'the file is an OpenDocument spreadsheet: save it as .xlsx or CSV' : 'the file is a ZIP archive but not an Excel workbook (.xlsx)' };
    }
    if (zip.uncompressedBytes > maxUncompressedBytes) {
      return { error: `the workbook unpacks to more than ${Math.round(maxUncompressedBytes / 1024 / 1024)} MB`, tooLarge: true };
    }
    return { kind: 'xlsx' };
  }
  if (looksLikeCsvText(bytes)) return { kind: 'csv' };
  return { error: 'the file is neither an Excel workbook (.xlsx) nor CSV text in UTF-8 with a separator on its first line' };
}

// ---- Photos and documents on inspection findings --------------------------------------------------------------------

export type FindingFileKind = 'jpeg' | 'png' | 'webp' | 'pdf';
export type FindingFileCheck = { kind: FindingFileKind; contentType: string } | { error: string };

export const FINDING_FILE_TYPES: Record<FindingFileKind, string> = {
  jpeg: 'image/jpeg',
  png: 'image/png',
  webp: 'image/webp',
  pdf: 'application/pdf',
};

const JPEG_SIGNATURE = [0xff, 0xd8, 0xff]; // SOI marker followed by the next marker's 0xFF (JFIF, Exif, raw)
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]; // \x89PNG\r\n\x1a\n
const RIFF = [0x52, 0x49, 0x46, 0x46]; // "RIFF" then a 4-byte size, then "WEBP"
const WEBP = [0x57, 0x45, 0x42, 0x50];
const GIF_SIGNATURE = [0x47, 0x49, 0x46, 0x38]; // "GIF8"
const BMP_SIGNATURE = [0x42, 0x4d]; // "BM"
const TIFF_SIGNATURES = [
  [0x49, 0x49, 0x2a, 0x00],
  [0x4d, 0x4d, 0x00, 0x2a],
];

/** What other, refused content looks like, for the error message. */
function describeRefused(bytes: Uint8Array): string {
  if (startsWith(bytes, GIF_SIGNATURE)) return 'a GIF image';
  if (TIFF_SIGNATURES.some((s) => startsWith(bytes, s))) return 'a TIFF image';
  if (startsWith(bytes, CFB_SIGNATURE)) return 'an old Office document';
  if (ZIP_SIGNATURES.some((s) => startsWith(bytes, s))) return 'a ZIP archive (or an Office document)';
  if (startsWith(bytes, BMP_SIGNATURE) && bytes.length > 14) return 'a BMP image';
  if (startsWith(bytes, RIFF)) return 'a RIFF file that is not a WebP image';
  if (hasOnlyTextBytes(bytes.subarray(0, 4096))) return 'text';
  return 'of an unknown binary type';
}

/**
 * Which kind of photo or document a finding's upload is, judged by its first bytes only (the name is not trusted):
 * JPEG, PNG, WebP or PDF; anything else is refused naming what was found.
 */
export function detectFindingFile(bytes: Uint8Array): FindingFileCheck {
  if (bytes.length === 0) return { error: 'the file is empty' };
  let kind: FindingFileKind | null = null;
  if (startsWith(bytes, JPEG_SIGNATURE)) kind = 'jpeg';
  else if (startsWith(bytes, PNG_SIGNATURE)) kind = 'png';
  else if (startsWith(bytes, RIFF) && bytes.length >= 12 && WEBP.every((b, i) => bytes[8 + i] === b)) kind = 'webp';
  else if (startsWith(bytes, PDF_SIGNATURE)) kind = 'pdf';
  if (kind !== null) return { kind, contentType: FINDING_FILE_TYPES[kind] };
  return { error: `photos and documents must be JPEG, PNG, WebP or PDF files: this file is ${describeRefused(bytes)}` };
}

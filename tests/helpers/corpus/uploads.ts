import { PNG_BYTES, type UploadFile } from './bases.js';

// Bad files for an upload route: wrong type (a PNG named as a CSV, or a text named as a PNG where pictures are taken;
// a Windows program), empty, one byte over the limit, a content type that claims the route's type for other bytes,
// and no file part at all.

export type FileMutationKind = 'wrong-type' | 'empty' | 'oversized' | 'mislabelled' | 'no-file';

export interface FileMutation {
  kind: FileMutationKind;
  detail: string;
  /** The file to attach (undefined: none). */
  file(): UploadFile | undefined;
}

/** The first bytes of a Windows executable ("MZ" header, DOS stub text). */
const EXE_BYTES = Buffer.concat([Buffer.from('4d5a90000300000004000000ffff0000b800000000000000', 'hex'), Buffer.from('This program cannot be run in DOS mode.\r\r\n$'), Buffer.alloc(64)]);

/** Bad files for a route taking `good` (its valid upload), at most `limit` bytes. */
export function fileMutations(good: UploadFile, limit: number): FileMutation[] {
  const takesPictures = good.type.startsWith('image/');
  const base = good.name.replace(/\.[^.]+$/, '');
  return [
    takesPictures
      ? { kind: 'wrong-type', detail: 'a text file named .png', file: () => ({ name: `${base}.png`, type: 'image/png', bytes: Buffer.from('serial,kind\nT1,routine\n') }) }
      : { kind: 'wrong-type', detail: 'a PNG named .csv', file: () => ({ name: `${base}.csv`, type: 'text/csv', bytes: PNG_BYTES }) },
    { kind: 'wrong-type', detail: 'a Windows program (.exe)', file: () => ({ name: 'setup.exe', type: 'application/x-msdownload', bytes: EXE_BYTES }) },
    { kind: 'empty', detail: 'an empty file (0 bytes)', file: () => ({ ...good, bytes: Buffer.alloc(0) }) },
    { kind: 'oversized', detail: `${limit + 1} bytes (limit ${limit})`, file: () => ({ ...good, bytes: Buffer.alloc(limit + 1, 0x31) }) },
    { kind: 'mislabelled', detail: `a program's bytes, no extension, labelled ${good.type}`, file: () => ({ name: base, type: good.type, bytes: EXE_BYTES }) },
    { kind: 'no-file', detail: 'no file part', file: () => undefined },
  ];
}

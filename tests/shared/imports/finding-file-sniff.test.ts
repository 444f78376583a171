// detectFindingFile: photos and documents on findings judged by their first bytes only.
import { describe, expect, it } from 'vitest';
import { detectFindingFile } from '../../../shared/imports/sniff.js';

const bytes = (...parts: Array<number[] | string>) =>
  new Uint8Array(parts.flatMap((p) => (typeof p === 'string' ? [...Buffer.from(p, 'latin1')] : p)));

describe('detectFindingFile', () => {
  it('recognises JPEG, PNG, WebP and PDF by their signatures', () => {
    expect(detectFindingFile(bytes([0xff, 0xd8, 0xff, 0xe1], 'Exif'))).toEqual({ kind: 'jpeg', contentType: 'image/jpeg' });
    expect(detectFindingFile(bytes([0x89], 'PNG\r\n\x1a\n', 'IHDR'))).toEqual({ kind: 'png', contentType: 'image/png' });
    expect(detectFindingFile(bytes('RIFF', [1, 0, 0, 0], 'WEBPVP8L'))).toEqual({ kind: 'webp', contentType: 'image/webp' });
    expect(detectFindingFile(bytes('%PDF-1.4\n'))).toEqual({ kind: 'pdf', contentType: 'application/pdf' });
  });

  it('refuses other content, naming what it is', () => {
    const err = (b: Uint8Array) => ('error' in detectFindingFile(b) ? (detectFindingFile(b) as { error: string }).error : 'accepted');
    expect(err(bytes(''))).toBe('the file is empty');
    expect(err(bytes('hello, world\n'))).toMatch(/this file is text$/);
    expect(err(bytes('GIF89a'))).toMatch(/a GIF image$/);
    expect(err(bytes('RIFF', [1, 0, 0, 0], 'WAVEfmt '))).toMatch(/a RIFF file that is not a WebP image$/);
    expect(err(bytes([0x50, 0x4b, 0x03, 0x04, 0, 0]))).toMatch(/a ZIP archive/);
    expect(err(bytes([0x00, 0x01, 0x02, 0xfe]))).toMatch(/unknown binary type$/);
    // A PDF signature later in the file is not a PDF.
    expect(err(bytes(' %PDF-1.4'))).toMatch(/this file is text$/);
  });
});

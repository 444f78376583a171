// The uploaders' type lists: picker filter, the words of the help and the refusal, and the check by name (and by MIME
// type for a file without an extension).
import { describe, expect, it } from 'vitest';
import { acceptAttribute, describeTypes, fileExtension, fileProblemList, fileTypeProblem, problemPlace, SWEEP_FILE_COLUMNS, UPLOAD_TYPES } from '../../shared/uploads/file-types';

describe('fileExtension', () => {
  it('gives the lower-case last extension with its dot, and nothing for a name without one', () => {
    expect(fileExtension('Trace HV-A.CSV')).toBe('.csv');
    expect(fileExtension('fault.2026.cfg')).toBe('.cfg');
    expect(fileExtension('C:\\relay\\fault.DAT')).toBe('.dat');
    expect(fileExtension('README')).toBe('');
    expect(fileExtension('.profile')).toBe('');
    expect(fileExtension('trailing.')).toBe('');
  });
});

describe('the relay-record list', () => {
  it('is the COMTRADE files, CSV, text and PDF, each extension once, as the server has always taken them', () => {
    expect(UPLOAD_TYPES.relayRecord.kinds.map((k) => k.ext)).toEqual(['.cfg', '.dat', '.cff', '.csv', '.txt', '.pdf']);
    expect(describeTypes(UPLOAD_TYPES.relayRecord)).toBe('COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf)');
  });

  it('gives the picker filter: extensions first, then only the MIME types that do not open it to everything', () => {
    expect(acceptAttribute(UPLOAD_TYPES.relayRecord)).toBe('.cfg,.dat,.cff,.csv,.txt,.pdf,text/csv,application/pdf');
    expect(acceptAttribute(UPLOAD_TYPES.sweep)).toBe('.csv,.txt,text/csv');
    expect(acceptAttribute(UPLOAD_TYPES.findingFile)).toBe('.jpg,.jpeg,.png,.webp,.pdf,image/jpeg,image/png,image/webp,application/pdf');
    expect(acceptAttribute(UPLOAD_TYPES.spreadsheet)).toBe('.xlsx,.csv,.txt,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet,text/csv');
  });
});

describe('fileTypeProblem', () => {
  it('takes every listed extension, whatever its case', () => {
    for (const name of ['fault.cfg', 'FAULT.DAT', 'fault.cff', 'events.csv', 'log.txt', 'report.pdf']) {
      expect(fileTypeProblem(UPLOAD_TYPES.relayRecord, name)).toBeNull();
    }
    expect(fileTypeProblem(UPLOAD_TYPES.unitReadingSet, 'factory.xlsx')).toBeNull();
  });

  it('names the file, what the uploader takes and the types to pick instead', () => {
    expect(fileTypeProblem(UPLOAD_TYPES.sweep, 'HV-A.xlsx')).toBe('HV-A.xlsx is not a sweep file: pick a CSV (.csv) or text (.txt) file.');
    expect(fileTypeProblem(UPLOAD_TYPES.relayRecord, 'notes.docx')).toBe(
      'notes.docx is not a relay record: pick a COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf) file.',
    );
    expect(fileTypeProblem(UPLOAD_TYPES.spreadsheet, 'fleet.xls')).toBe('fleet.xls is not a spreadsheet: pick an Excel (.xlsx), CSV (.csv) or text (.txt) file.');
    expect(fileTypeProblem(UPLOAD_TYPES.findingFile, 'bushing.heic')).toBe(
      'bushing.heic is not a photo or PDF: pick a JPEG (.jpg, .jpeg), PNG (.png), WebP (.webp) or PDF (.pdf) file.',
    );
  });

  it('judges a file without an extension by its MIME type, and says it has none when that does not help', () => {
    expect(fileTypeProblem(UPLOAD_TYPES.findingFile, 'image', 'image/png')).toBeNull();
    expect(fileTypeProblem(UPLOAD_TYPES.sweep, 'trace', 'text/csv; charset=utf-8')).toBeNull();
    expect(fileTypeProblem(UPLOAD_TYPES.sweep, 'trace', 'application/octet-stream')).toBe(
      'trace (it has no extension) is not a sweep file: pick a CSV (.csv) or text (.txt) file.',
    );
    // A listed MIME type does not excuse a wrong extension: a .xls reported as text/csv is still refused.
    expect(fileTypeProblem(UPLOAD_TYPES.sweep, 'trace.xls', 'text/csv')).not.toBeNull();
  });
});

describe('problemPlace and fileProblemList', () => {
  it('names a row and its column in words, a mapped column by its label, and the file-wide keys', () => {
    expect(problemPlace('row 4.magnitudeDb', SWEEP_FILE_COLUMNS, 'line')).toBe('line 4, magnitude (dB)');
    expect(problemPlace('row 7', {}, 'Row')).toBe('Row 7');
    expect(problemPlace('row 7.hvKV', { hvKV: 'HV (kV)' })).toBe('Row 7, HV (kV)');
    expect(problemPlace('mapping.site', { site: 'Site (name)' })).toBe('Site (name)');
    expect(problemPlace('header')).toBe('Header');
    expect(problemPlace('file')).toBe('File');
    expect(problemPlace('unknownThing')).toBe('unknownThing');
  });

  it('sorts by row number (10 after 9), file-wide problems first and "more" last', () => {
    const list = fileProblemList({ more: '12 more rows with problems', 'row 10.value': 'not a number', 'row 9.unit': 'pF or nF', file: 'no rows' });
    expect(list.map((p) => p.key)).toEqual(['file', 'row 9.unit', 'row 10.value', 'more']);
    expect(list[1]).toEqual({ key: 'row 9.unit', place: 'Row 9, unit', message: 'pF or nF' });
  });
});

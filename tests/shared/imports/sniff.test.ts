// Upload content checks: CSV text and relay records (COMTRADE, CSV, text, PDF) judged by their bytes.
import { describe, expect, it } from 'vitest';
import { detectRelayRecord, looksLikeCsvText, RELAY_RECORD_KINDS } from '../../../shared/imports/sniff.js';
import { describeTypes, UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';

const bytes = (text: string) => new TextEncoder().encode(text);
const raw = (...b: number[]) => new Uint8Array(b);
// A minimal COMTRADE configuration, IEEE Std C37.111-1999 layout: station_name,rec_dev_id,rev_year / TT,##A,##D / channels…
const CFG_1999 = 'Harrow Cross,REL-T2,1999\r\n12,4A,8D\r\n1,IA,A,,kA,0.01,0,0,-32767,32767,1200,1,P\r\n';
const PDF = bytes('%PDF-1.7\n%\u00e2\u00e3\n1 0 obj\n');
const ZIP = raw(0x50, 0x4b, 0x03, 0x04, 0x14, 0x00);

describe('looksLikeCsvText', () => {
  it('accepts UTF-8 or ASCII text with a separator on its first line (BOM allowed)', () => {
    expect(looksLikeCsvText(bytes('quantity,configuration,phase,value,unit\ncapacitance,CH,,3131,pF\n'))).toBe(true);
    expect(looksLikeCsvText(bytes('\uFEFFa;b\r\n1;2'))).toBe(true);
    expect(looksLikeCsvText(bytes('Wicklung,Wert\nH\u00f6he,1\n'))).toBe(true);
  });

  it('rejects an empty file, a first line without a separator, NUL bytes and invalid UTF-8', () => {
    expect(looksLikeCsvText(raw())).toBe(false);
    expect(looksLikeCsvText(bytes('just some words\n1,2'))).toBe(false);
    expect(looksLikeCsvText(raw(0x61, 0x2c, 0x62, 0x00, 0x0a))).toBe(false);
    expect(looksLikeCsvText(raw(0x61, 0x2c, 0xe9, 0x0a))).toBe(false); // Latin-1 é alone is not UTF-8
  });

  it('rejects PDF, ZIP and UTF-16 content whatever the name', () => {
    expect(looksLikeCsvText(ZIP)).toBe(false);
    expect(looksLikeCsvText(raw(0xff, 0xfe, 0x61, 0x00, 0x2c, 0x00))).toBe(false);
    expect(looksLikeCsvText(raw(0x25, 0x50, 0x44, 0x46, 0x2d, 0x31, 0x0a, 0x00, 0x01))).toBe(false);
  });
});

describe('detectRelayRecord', () => {
  it('accepts the allowed extensions in any case and from a browser path', () => {
    expect(detectRelayRecord('HX-T2.CFG', bytes(CFG_1999))).toEqual({ kind: 'comtrade-cfg' });
    expect(detectRelayRecord('C:\\fakepath\\HX-T2.cfg', bytes(CFG_1999))).toEqual({ kind: 'comtrade-cfg' });
  });

  it('rejects other extensions and names without one, naming the allowed ones', () => {
    expect(detectRelayRecord('record.zip', ZIP)).toEqual({
      error: "relay records are COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf) files: 'record.zip' is a .zip file",
    });
    expect(detectRelayRecord('record', bytes('x'))).toEqual({
      error: "relay records are COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf) files: 'record' is without an extension",
    });
  });

  it('takes exactly the extensions of the shared relay-record list (UPLOAD_TYPES.relayRecord), each with a content check', () => {
    const listed = UPLOAD_TYPES.relayRecord.kinds.map((k) => k.ext.slice(1)).sort();
    expect(Object.keys(RELAY_RECORD_KINDS).sort()).toEqual(listed);
    expect(RELAY_RECORD_KINDS).toEqual({ cfg: 'comtrade-cfg', dat: 'comtrade-dat', cff: 'comtrade-cff', csv: 'csv', txt: 'text', pdf: 'pdf' });
    // Every listed type the picker offers passes the name check here; the names the error gives are the list's words.
    for (const ext of listed) expect(detectRelayRecord(`r.${ext}`, raw())).toEqual({ error: `the .${ext} file is empty` });
    const refused = detectRelayRecord('r.docx', bytes('x'));
    expect('error' in refused && refused.error).toContain(describeTypes(UPLOAD_TYPES.relayRecord));
    expect(detectRelayRecord('r.constructor', bytes('x'))).toHaveProperty('error');
  });

  it('rejects an empty file', () => {
    expect(detectRelayRecord('a.dat', raw())).toEqual({ error: 'the .dat file is empty' });
  });

  describe('.cfg (IEEE C37.111 configuration)', () => {
    it('accepts the 1991 layout (no revision year) and the 1999 and 2013 revision years', () => {
      // IEEE C37.111: a first line without rev_year means the 1991 edition.
      expect(detectRelayRecord('a.cfg', bytes('Harrow Cross,REL-T2\n12,4A,8D\n'))).toEqual({ kind: 'comtrade-cfg' });
      expect(detectRelayRecord('a.cfg', bytes('Harrow Cross,REL-T2,2013\n3,3A,0D\n'))).toEqual({ kind: 'comtrade-cfg' });
      expect(detectRelayRecord('a.cfg', bytes('\uFEFFHarrow Cross,REL-T2,1991\r\n12, 4A, 8D\r\n'))).toEqual({ kind: 'comtrade-cfg' });
    });

    it('accepts a station name in an 8-bit code page (older relays)', () => {
      expect(detectRelayRecord('a.cfg', raw(...bytes('M'), 0xfc, ...bytes('hlbach,R1,1999\n2,1A,1D\n')))).toEqual({ kind: 'comtrade-cfg' });
    });

    it("rejects a second line not like '12,4A,8D'", () => {
      expect(detectRelayRecord('a.cfg', bytes('Harrow Cross,REL-T2,1999\ntwelve channels\n'))).toEqual({
        error: "the .cfg file is not a COMTRADE configuration: its second line should be like '12,4A,8D'",
      });
    });

    it('rejects channel counts that do not add up (TT = ##A + ##D)', () => {
      expect(detectRelayRecord('a.cfg', bytes('Harrow Cross,REL-T2,1999\n12,4A,7D\n'))).toEqual({
        error: 'the .cfg file is not a COMTRADE configuration: its second line gives 12 channels but 4A + 7D make 11',
      });
    });

    it('rejects a first line that is not station_name,rec_dev_id[,rev_year], or an unknown revision year', () => {
      expect(detectRelayRecord('a.cfg', bytes('quantity,configuration,phase,value,unit\n12,4A,8D\n'))).toEqual({
        error: "the .cfg file is not a COMTRADE configuration: its first line should be station_name,rec_dev_id[,rev_year] (e.g. 'Harrow Cross,REL-T2,1999')",
      });
      expect(detectRelayRecord('a.cfg', bytes('Harrow Cross,REL-T2,2005\n12,4A,8D\n'))).toEqual({
        error: "the .cfg file is not a COMTRADE configuration: its first line ends with revision year '2005': it should be 1991, 1999 or 2013",
      });
    });

    it('rejects binary content, a PDF and a ZIP', () => {
      expect(detectRelayRecord('a.cfg', raw(0x01, 0x02, 0x00))).toEqual({ error: 'the .cfg file is not a COMTRADE configuration: it is not text' });
      expect(detectRelayRecord('a.cfg', PDF)).toEqual({ error: 'the .cfg file is a PDF document: upload it with a .pdf name' });
      expect(detectRelayRecord('a.cfg', ZIP)).toEqual({ error: 'the .cfg file is a ZIP archive: unpack it and upload the files inside' });
    });
  });

  describe('.dat (COMTRADE data)', () => {
    it('accepts ASCII samples and binary samples', () => {
      expect(detectRelayRecord('a.dat', bytes('1,0,120,-45,3\n2,833,118,-47,2\n'))).toEqual({ kind: 'comtrade-dat' });
      expect(detectRelayRecord('a.dat', raw(0x01, 0x00, 0x00, 0x00, 0x00, 0x00, 0x00, 0x00, 0x78, 0x00, 0xd3, 0xff))).toEqual({ kind: 'comtrade-dat' });
    });

    it('rejects a PDF or a ZIP', () => {
      expect(detectRelayRecord('a.dat', PDF)).toEqual({ error: 'the .dat file is a PDF document: upload it with a .pdf name' });
      expect(detectRelayRecord('a.dat', ZIP)).toEqual({ error: 'the .dat file is a ZIP archive: unpack it and upload the files inside' });
    });
  });

  describe('.cff (IEEE C37.111-2013 combined file)', () => {
    it('accepts a combined file whose CFG section is a configuration, even with a binary DAT section', () => {
      const head = bytes(`--- file type: CFG ---\n${CFG_1999}--- file type: DAT BINARY: 12 ---\n`);
      expect(detectRelayRecord('a.cff', new Uint8Array([...head, 0x01, 0x00, 0xff, 0x00]))).toEqual({ kind: 'comtrade-cff' });
    });

    it("rejects a file without a '--- file type: CFG ---' section", () => {
      expect(detectRelayRecord('a.cff', bytes(CFG_1999))).toEqual({
        error: "the .cff file is not a COMTRADE combined file: it has no '--- file type: CFG ---' section",
      });
    });

    it('rejects a CFG section that is not a configuration', () => {
      expect(detectRelayRecord('a.cff', bytes('--- file type: CFG ---\nHarrow Cross,REL-T2,2013\n4A,8D\n'))).toEqual({
        error: "the CFG section of the .cff file is not a COMTRADE configuration: its second line should be like '12,4A,8D'",
      });
    });
  });

  describe('.pdf, .csv and .txt', () => {
    it('accepts a PDF that starts with %PDF- and rejects one that does not', () => {
      // ISO 32000-1 §7.5.2: the file header is "%PDF-" followed by the version.
      expect(detectRelayRecord('report.pdf', PDF)).toEqual({ kind: 'pdf' });
      expect(detectRelayRecord('report.pdf', bytes('<html>'))).toEqual({ error: 'the .pdf file is not a PDF document: it does not start with %PDF-' });
    });

    it('accepts CSV text (any 8-bit encoding) and rejects binary or separator-less content', () => {
      expect(detectRelayRecord('events.csv', bytes('time,IA,IB\n0,1.2,1.3\n'))).toEqual({ kind: 'csv' });
      expect(detectRelayRecord('events.csv', raw(...bytes('Zeit;I'), 0xb5, ...bytes('A\n')))).toEqual({ kind: 'csv' });
      expect(detectRelayRecord('events.csv', raw(0x61, 0x2c, 0x00))).toEqual({ error: 'the .csv file is not text: it holds binary bytes' });
      expect(detectRelayRecord('events.csv', bytes('no separator here\n'))).toEqual({
        error: "the .csv file is not CSV: its first line has no ',' ';' or tab between columns",
      });
      expect(detectRelayRecord('events.csv', PDF)).toEqual({ error: 'the .csv file is a PDF document: upload it with a .pdf name' });
    });

    it('accepts plain text and rejects binary content in a .txt', () => {
      expect(detectRelayRecord('notes.txt', bytes('Relay REL-T2 event summary\n\tI> trip 0.12 s\n'))).toEqual({ kind: 'text' });
      expect(detectRelayRecord('notes.txt', raw(0x4d, 0x5a, 0x90, 0x00))).toEqual({ error: 'the .txt file is not plain text: it holds binary bytes' });
    });
  });
});

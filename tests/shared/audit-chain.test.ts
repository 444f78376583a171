import { describe, expect, it } from 'vitest';
import { auditEntryHash } from '../../server/common/audit-hash.js';
import { asStoredJson, auditChainText, canonicalJson, GENESIS_HASH, type AuditChainFacts } from '../../shared/audit-chain.js';

// The audit chain's canonical text and its SHA-256. The check hashes were computed outside the project with coreutils'
// sha256sum (and confirmed with `openssl dgst -sha256`) over the texts written out below, e.g.
//   printf '%s' '{"action":"create",…,"userId":null}' | sha256sum

const P = 'ab'.repeat(32);

const entry: AuditChainFacts = {
  id: 7,
  at: new Date('2026-11-28T03:12:45.120Z'),
  userId: 3,
  action: 'update',
  entity: 'fault_event',
  entityId: '42',
  before: { status: 'screened', b: 1.5 },
  after: { zones: [2, 'x', undefined], status: 'testing', note: 'é', gone: undefined },
  highlighted: true,
  note: 'Re-energised',
};

const ENTRY_TEXT =
  '{"action":"update","after":{"note":"é","status":"testing","zones":[2,"x",null]},"at":"2026-11-28T03:12:45.120Z",' +
  '"before":{"b":1.5,"status":"screened"},"entity":"fault_event","entityId":"42","highlighted":true,"id":7,' +
  `"note":"Re-energised","prevHash":"${P}","userId":3}`;

const FIRST: AuditChainFacts = {
  id: 1,
  at: new Date('2026-12-01T09:00:00Z'),
  userId: null,
  action: 'create',
  entity: 'site',
  entityId: '1',
  before: undefined,
  after: null,
  highlighted: false,
  note: null,
};

describe('canonicalJson', () => {
  it('sorts keys at every depth, keeps array order, drops undefined keys and writes no spaces', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, 1, { z: 1, y: 2 }], c: undefined } })).toBe('{"a":{"d":[3,1,{"y":2,"z":1}]},"b":1}');
  });

  it('gives the same text whatever order the keys were written in', () => {
    expect(canonicalJson({ x: 1, y: [1, 2], z: 'é' })).toBe(canonicalJson({ z: 'é', y: [1, 2], x: 1 }));
  });

  it('writes dates as JSON.stringify does (ISO 8601) and undefined as null', () => {
    expect(canonicalJson(new Date('2026-01-02T03:04:05.006Z'))).toBe('"2026-01-02T03:04:05.006Z"');
    expect(canonicalJson(undefined)).toBe('null');
  });
});

describe('asStoredJson', () => {
  it('is what a JSON column gives back: dates as strings, undefined keys gone, undefined as null', () => {
    expect(asStoredJson({ at: new Date('2026-01-02T00:00:00Z'), gone: undefined, n: -0 })).toEqual({ at: '2026-01-02T00:00:00.000Z', n: 0 });
    expect(asStoredJson(undefined)).toBeNull();
  });
});

describe('auditChainText and auditEntryHash', () => {
  it('write the entry as canonical JSON with at in ISO milliseconds and the previous hash', () => {
    expect(auditChainText(entry, P)).toBe(ENTRY_TEXT);
  });

  it('hash an entry to the value sha256sum gives for its text', () => {
    // printf '%s' "$ENTRY_TEXT" | sha256sum → cd5857561f29…24d1 (UTF-8 bytes, é as C3 A9)
    expect(auditEntryHash(entry, P)).toBe('cd5857561f29464c1debb5d3e5ddaaf5b781b54f5f4c05e585bfe38ad04424d1');
  });

  it('hash the first entry of a chain (previous hash 64 zeros, empty fields as null) to sha256sum\'s value', () => {
    expect(GENESIS_HASH).toBe('0'.repeat(64));
    expect(auditChainText(FIRST, GENESIS_HASH)).toBe(
      `{"action":"create","after":null,"at":"2026-12-01T09:00:00.000Z","before":null,"entity":"site","entityId":"1","highlighted":false,"id":1,"note":null,"prevHash":"${GENESIS_HASH}","userId":null}`,
    );
    // printf '%s' '{"action":"create",…,"prevHash":"000…0","userId":null}' | sha256sum
    expect(auditEntryHash(FIRST, GENESIS_HASH)).toBe('c18510f093620823c5fa3fa4ace6125d79321ffa1a5ddfcdb36d1191a95a4019');
  });

  it('change with any field, the id and the previous hash', () => {
    const base = auditEntryHash(entry, P);
    const variants: AuditChainFacts[] = [
      { ...entry, id: 8 },
      { ...entry, at: new Date(entry.at.getTime() + 1) },
      { ...entry, userId: 4 },
      { ...entry, action: 'delete' },
      { ...entry, entity: 'unit' },
      { ...entry, entityId: '43' },
      { ...entry, before: { status: 'screened', b: 1.6 } },
      { ...entry, after: null },
      { ...entry, highlighted: false },
      { ...entry, note: 'Re-energised.' },
    ];
    for (const v of variants) expect(auditEntryHash(v, P)).not.toBe(base);
    expect(auditEntryHash(entry, 'cd'.repeat(32))).not.toBe(base);
  });
});

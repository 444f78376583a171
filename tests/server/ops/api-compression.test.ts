import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { gunzipSync } from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { apiForFile } from '../../helpers/api-file.js';
import { makeDesign, makeSite, makeUnit } from '../../helpers/factories.js';

// JSON answers are gzip-compressed for a client that accepts it (over 1 kB), the same JSON once decompressed; files
// (CSV here) and small answers are sent as they are; a client that asks for nothing gets plain JSON.

const file = apiForFile(['engineer']);
const { api, as } = file;
const tag = `CMP${Date.now().toString(36).toUpperCase()}`;

/** The raw bytes and headers of an answer over a real socket (supertest would decompress the body itself). */
async function rawGet(url: string, headers: Record<string, string>): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  const server = http.createServer(file.env.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  try {
    const { port } = server.address() as AddressInfo;
    return await new Promise((resolve, reject) => {
      http.get({ host: '127.0.0.1', port, path: url, headers }, (res) => {
        const parts: Buffer[] = [];
        res.on('data', (c: Buffer) => parts.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(parts) }));
        res.on('error', reject);
      }).on('error', reject);
    });
  } finally {
    await new Promise((resolve) => server.close(resolve));
  }
}

beforeAll(async () => {
  const site = await makeSite(file.env.db);
  const design = await makeDesign(file.env.db);
  for (let i = 0; i < 30; i++) await makeUnit(file.env.db, { siteId: site.id, designId: design.id, serial: `${tag}-${String(i).padStart(2, '0')}` });
});

describe('API answers compressed when the client accepts gzip', () => {
  it('sends a large JSON answer gzip-compressed, with Vary, and the same JSON once decompressed', async () => {
    const plain = await api().get(`/api/units?q=${tag}`).set(as.engineer).set('Accept-Encoding', 'identity').expect(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(Buffer.byteLength(plain.text)).toBeGreaterThan(1024);
    const zipped = await rawGet(`/api/units?q=${tag}`, { ...as.engineer, 'Accept-Encoding': 'gzip' });
    expect(zipped.status).toBe(200);
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.headers.vary).toMatch(/Accept-Encoding/i);
    const body = zipped.body;
    expect(body.length).toBeLessThan(Buffer.byteLength(plain.text));
    expect(JSON.parse(gunzipSync(body).toString('utf8'))).toEqual(plain.body);
  });

  it('sends a small JSON answer and a CSV file uncompressed', async () => {
    const small = await api().get('/api/health').set('Accept-Encoding', 'gzip').expect(200);
    expect(small.headers['content-encoding']).toBeUndefined();
    const csv = await api().get(`/api/units/export?format=csv&q=${tag}`).set(as.engineer).set('Accept-Encoding', 'gzip');
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.headers['content-encoding']).toBeUndefined();
  });
});

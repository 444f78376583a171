import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import nodemailer from 'nodemailer';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../../server/config.js';
import { serve, type Running } from '../../../server/index.js';
import { createTestUser, bearer } from '../../helpers/db.js';
import { listeningAddresses } from '../../helpers/sockets.js';

let running: Running;
let staticDir: string;
const config = loadConfig({ ...process.env, PORT: '0', MAIL_SINK_PORT: '0' });

beforeAll(async () => {
  staticDir = mkdtempSync(path.join(os.tmpdir(), 'gs-static-'));
  writeFileSync(path.join(staticDir, 'index.html'), '<!doctype html><title>Gapsight test shell</title>');
  const { default: db } = await import('../../../server/db/data-source.js');
  await db.initialize();
  running = await serve(db, config, { staticDir });
});
afterAll(async () => {
  await running.stop();
  rmSync(staticDir, { recursive: true, force: true });
});

describe('the served app', () => {
  it('listens on 127.0.0.1 only, and so does the mail sink', () => {
    expect(listeningAddresses(running.port)).toEqual(['127.0.0.1']);
    expect(running.sink).not.toBeNull();
    expect(listeningAddresses(running.sink!.port)).toEqual(['127.0.0.1']);
  });

  it('serves the client for any non-API path and JSON 404 under /api', async () => {
    const page = await request(running.url).get('/units/42');
    expect(page.status).toBe(200);
    expect(page.text).toContain('Gapsight test shell');
    const api = await request(running.url).get('/api/units-typo');
    expect(api.status).toBe(404);
    expect(api.body.error.code).toBe('not_found');
  });

  it('stores what the local mail sink receives and lists it, newest first, in the outbox for admin and manager', async () => {
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: running.sink!.port, secure: false, ignoreTLS: true });
    const subject = `Sink check ${Date.now()}`;
    await transport.sendMail({
      from: 'gapsight@localhost',
      to: 'manager@test.example',
      subject,
      text: 'Recommendation: go',
      attachments: [{ filename: 'report.pdf', content: Buffer.from('%PDF-1.4 test'), contentType: 'application/pdf' }],
    });
    const { default: db } = await import('../../../server/db/data-source.js');
    const manager = await createTestUser(db, ['manager']);
    const res = await request(running.url).get('/api/dev/outbox').set(bearer(config, manager.id));
    expect(res.status).toBe(200);
    const msg = res.body.find((m: { subject: string }) => m.subject === subject);
    expect(msg).toMatchObject({ to: 'manager@test.example', text: expect.stringContaining('Recommendation: go') });
    expect(msg.attachments).toEqual([{ filename: 'report.pdf', contentType: 'application/pdf', size: 13 }]);
    const tester = await createTestUser(db, ['tester']);
    expect((await request(running.url).get('/api/dev/outbox').set(bearer(config, tester.id))).status).toBe(403);
  });
});

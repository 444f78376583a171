import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { DataSource } from 'typeorm';
import { SinkAttachment } from './sink-attachment.entity.js';
import { SinkMessage } from './sink-message.entity.js';

export interface MailSink {
  port: number;
  close(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 15 * 1024 * 1024;

function addresses(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

/** A local SMTP server on loopback that stores every message it receives, attachments too, in the database (the dev outbox). */
export function startMailSink(db: DataSource, port: number, host = '127.0.0.1'): Promise<MailSink> {
  const server = new SMTPServer({
    authOptional: true,
    allowInsecureAuth: true,
    onAuth: (auth, _session, cb) => cb(null, { user: auth.username }),
    disabledCommands: ['STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, cb) {
      simpleParser(stream)
        .then(async (mail) => {
          const to = addresses(mail.to) || session.envelope.rcptTo.map((r) => r.address).join(', ');
          const parts = mail.attachments ?? [];
          await db.transaction(async (m) => {
            const saved = await m.getRepository(SinkMessage).save(
              m.getRepository(SinkMessage).create({
                to: to.slice(0, 1000),
                subject: (mail.subject ?? '(no subject)').slice(0, 500),
                text: mail.text ?? '',
                attachments: parts.map((a) => ({ filename: a.filename ?? 'attachment', contentType: a.contentType, size: a.size })),
              }),
            );
            if (parts.length) await m.getRepository(SinkAttachment).insert(parts.map((a, position) => ({ messageId: saved.id, position, content: a.content })));
          });
          cb();
        })
        .catch((err: Error) => cb(err));
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      const addr = server.server.address();
      const actual = typeof addr === 'object' && addr ? addr.port : port;
      resolve({ port: actual, close: () => new Promise<void>((r) => server.close(() => r())) });
    });
  });
}

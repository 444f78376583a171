import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config.js';

/** SMTP transport: the configured server (SMTP_HOST …), else the local sink on loopback. */
export function createTransport(config: Config, sinkPort: number | null): Transporter {
  if (config.SMTP_HOST) {
    return nodemailer.createTransport({
      host: config.SMTP_HOST,
      port: config.SMTP_PORT ?? 587,
      secure: config.SMTP_SECURE === 'true',
      auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASSWORD ?? '' } : undefined,
    });
  }
  return nodemailer.createTransport({ host: '127.0.0.1', port: sinkPort ?? config.MAIL_SINK_PORT, secure: false, ignoreTLS: true });
}

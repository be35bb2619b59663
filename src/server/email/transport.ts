import nodemailer, { type Transporter } from 'nodemailer';
import { getConfig } from '../config';

let transporter: Transporter | undefined;

export function getTransport(): Transporter {
  if (transporter) return transporter;
  const c = getConfig();
  transporter = nodemailer.createTransport({
    host: c.SMTP_HOST,
    port: c.SMTP_PORT,
    secure: c.SMTP_SECURE,
    ignoreTLS: c.SMTP_IGNORE_TLS,
    auth: c.SMTP_USER ? { user: c.SMTP_USER, pass: c.SMTP_PASSWORD ?? '' } : undefined,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 10000,
  });
  return transporter;
}

import { randomBytes } from 'node:crypto';
import { mkdir, rename, writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';
import { SMTPServer, type SMTPServerAddress } from 'smtp-server';

export interface MailFakeOptions {
  host?: string;
  port: number;
  dir: string;
}

export interface MailFake {
  port: number;
  stop(): Promise<void>;
}

/** The `.json` file written beside every `.eml`. */
export interface StoredMail {
  id: string;
  receivedAt: string;
  from: string;
  /** Envelope recipients (RCPT TO), lower-cased, so Cc and Bcc addressees are listed too. */
  to: string[];
  subject: string;
  text: string;
  html: string;
  headers: Record<string, string>;
}

const KEPT_HEADERS = new Set(['message-id', 'date', 'from', 'to', 'cc', 'reply-to', 'content-type', 'list-unsubscribe']);

// A closing fake has nobody to be polite to; the library default waits 30 s for open clients.
const CLOSE_TIMEOUT_MS = 1_000;
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

/** `20261201T180102123Z-<hex>`: names sort by arrival time. */
function newMailId(date: Date): string {
  const stamp = date.toISOString().replace(/[-:.]/g, '');
  return `${stamp}-${randomBytes(4).toString('hex')}`;
}

function keptHeaders(mail: ParsedMail): Record<string, string> {
  const headers: Record<string, string> = {};
  for (const { key, line } of mail.headerLines) {
    if (!KEPT_HEADERS.has(key) || key in headers) continue;
    const value = line.slice(line.indexOf(':') + 1);
    headers[key] = value.replace(/\r?\n[ \t]+/g, ' ').trim();
  }
  return headers;
}

function envelopeAddress(address: SMTPServerAddress | false): string {
  return address ? address.address : '';
}

async function storeMessage(
  dir: string,
  raw: Buffer,
  envelope: { mailFrom: SMTPServerAddress | false; rcptTo: SMTPServerAddress[] },
): Promise<void> {
  const receivedAt = new Date();
  const id = newMailId(receivedAt);
  const mail = await simpleParser(raw);
  const stored: StoredMail = {
    id,
    receivedAt: receivedAt.toISOString(),
    from: mail.from?.text ?? envelopeAddress(envelope.mailFrom),
    // Lower-cased so that a lookup by an account's e-mail matches however the app spelled it.
    to: envelope.rcptTo.map((rcpt) => rcpt.address.toLowerCase()),
    subject: mail.subject ?? '',
    text: mail.text ?? '',
    html: mail.html || '',
    headers: keptHeaders(mail),
  };
  await writeFile(path.join(dir, `${id}.eml`), raw);
  // Readers look for the .json; renaming it into place last means they never see half a message.
  const jsonPath = path.join(dir, `${id}.json`);
  const tempPath = path.join(dir, `.${id}.json.tmp`);
  await writeFile(tempPath, `${JSON.stringify(stored, null, 2)}\n`);
  await rename(tempPath, jsonPath);
}

export async function startMailFake({ host = '127.0.0.1', port, dir }: MailFakeOptions): Promise<MailFake> {
  await mkdir(dir, { recursive: true });

  const server = new SMTPServer({
    name: 'lightyard-mail-fake',
    banner: 'Lightyard mail fake: messages are written to disk, nothing is delivered',
    // The library's built-in certificate has expired, so a client that upgrades would fail.
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    // Lets the app keep SMTP_USER/SMTP_PASS set (as it would for a relay) against the fake.
    allowInsecureAuth: true,
    size: MAX_MESSAGE_BYTES,
    closeTimeout: CLOSE_TIMEOUT_MS,
    logger: false,
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? 'anonymous' });
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', callback);
      stream.on('end', () => {
        if (stream.sizeExceeded) {
          const error = Object.assign(new Error('Message exceeds the size limit'), {
            responseCode: 552,
          });
          callback(error);
          return;
        }
        storeMessage(dir, Buffer.concat(chunks), session.envelope).then(
          () => callback(),
          (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
        );
      });
    },
  });

  const address = await new Promise<AddressInfo>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve(server.server.address() as AddressInfo);
    });
  });
  // After start-up a failing connection must not take the whole fake process down.
  server.on('error', () => undefined);

  return {
    port: address.port,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

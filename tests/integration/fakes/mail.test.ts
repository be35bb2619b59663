import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import nodemailer from 'nodemailer';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { startMailFake, type MailFake, type StoredMail } from '../../../fakes/mail/server';
import { makeTempDir } from './temp-dir';

let temp: Awaited<ReturnType<typeof makeTempDir>>;
let fake: MailFake;

beforeEach(async () => {
  temp = await makeTempDir();
  fake = await startMailFake({ port: 0, dir: temp.dir });
});

afterEach(async () => {
  await fake.stop();
  await temp.remove();
});

function transport(auth?: { user: string; pass: string }) {
  return nodemailer.createTransport({ host: '127.0.0.1', port: fake.port, secure: false, ignoreTLS: true, auth });
}

async function storedMails(): Promise<StoredMail[]> {
  const names = (await readdir(temp.dir)).filter((name) => name.endsWith('.json')).sort();
  return Promise.all(names.map(async (name) => JSON.parse(await readFile(path.join(temp.dir, name), 'utf8'))));
}

describe('mail fake', () => {
  test('listens on an ephemeral port when asked for port 0', () => {
    expect(fake.port).toBeGreaterThan(0);
  });

  test('writes each message as .eml and .json with subject, recipients and bodies', async () => {
    const info = await transport().sendMail({
      from: '"Lightyard" <no-reply@lightyard.example>',
      to: 'Buyer@Demo.Lightyard.example',
      cc: 'seller@demo.lightyard.example',
      bcc: 'audit@lightyard.example',
      subject: 'Verify your e-mail address',
      text: 'Open http://localhost:4321/verify?token=abc to verify.',
      html: '<p>Open <a href="http://localhost:4321/verify?token=abc">this link</a>.</p>',
    });

    const files = (await readdir(temp.dir)).sort();
    expect(files).toHaveLength(2);
    const [eml, json] = files;
    const id = eml?.replace(/\.eml$/, '');
    expect(id).toMatch(/^\d{8}T\d{9}Z-[0-9a-f]{8}$/);
    expect(json).toBe(`${id}.json`);

    const [mail] = await storedMails();
    expect(mail).toMatchObject({
      id,
      from: '"Lightyard" <no-reply@lightyard.example>',
      to: ['buyer@demo.lightyard.example', 'seller@demo.lightyard.example', 'audit@lightyard.example'],
      subject: 'Verify your e-mail address',
    });
    expect(mail?.text).toContain('/verify?token=abc');
    expect(mail?.html).toContain('<a href="http://localhost:4321/verify?token=abc">');
    expect(mail?.headers['message-id']).toBe(info.messageId);
    expect(mail?.headers.cc).toBe('seller@demo.lightyard.example');
    expect(mail?.headers).not.toHaveProperty('bcc');
    expect(Date.parse(mail?.receivedAt ?? '')).toBeGreaterThan(Date.now() - 60_000);

    const raw = await readFile(path.join(temp.dir, eml ?? ''), 'utf8');
    expect(raw).toContain('Subject: Verify your e-mail address');
    expect(raw).toContain(`Message-ID: ${info.messageId}`);
  });

  test('file names sort in the order the messages arrived', async () => {
    const smtp = transport();
    for (const subject of ['first', 'second', 'third']) {
      await smtp.sendMail({ from: 'a@lightyard.example', to: 'b@lightyard.example', subject, text: subject });
    }
    expect((await storedMails()).map((mail) => mail.subject)).toEqual(['first', 'second', 'third']);
  });

  test('accepts a client that logs in, as it would with a real relay', async () => {
    await transport({ user: 'lightyard', pass: 'secret' }).sendMail({
      from: 'a@lightyard.example',
      to: 'b@lightyard.example',
      subject: 'with auth',
      text: 'hello',
    });
    expect((await storedMails()).map((mail) => mail.subject)).toEqual(['with auth']);
  });
});

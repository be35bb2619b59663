import { spawn } from 'node:child_process';
import { createServer } from 'node:net';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { fakesOptionsFromEnv, loopbackOrigins, startAllFakes, type FakesOptions } from '../../../fakes/start';
import { makeTempDir } from './temp-dir';

const root = fileURLToPath(new URL('../../..', import.meta.url));

let temp: Awaited<ReturnType<typeof makeTempDir>>;

beforeEach(async () => {
  temp = await makeTempDir();
});

afterEach(() => temp.remove());

function ephemeralOptions(): FakesOptions {
  return {
    mail: { port: 0, dir: path.join(temp.dir, 'mail') },
    s3: { port: 0, dir: path.join(temp.dir, 's3'), bucket: 'lightyard', allowedOrigins: ['http://localhost:4321'] },
    stripe: { port: 0, dir: path.join(temp.dir, 'stripe') },
  };
}

async function canConnect(port: number): Promise<boolean> {
  try {
    await fetch(`http://127.0.0.1:${port}/`);
    return true;
  } catch {
    return false;
  }
}

describe('fakes start script', () => {
  test('startAllFakes starts all three on ephemeral ports and stops them', async () => {
    const fakes = await startAllFakes(ephemeralOptions());
    const ports = Object.values(fakes.ports);
    expect(new Set(ports).size).toBe(3);
    expect(await canConnect(fakes.ports.s3)).toBe(true);
    expect(await canConnect(fakes.ports.stripe)).toBe(true);

    await fakes.stop();
    expect(await canConnect(fakes.ports.s3)).toBe(false);
    expect(await canConnect(fakes.ports.stripe)).toBe(false);
  });

  test('startAllFakes fails when one fake cannot listen', async () => {
    const blocker = createServer();
    await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', resolve));
    const taken = (blocker.address() as AddressInfo).port;
    try {
      const options = ephemeralOptions();
      await expect(startAllFakes({ ...options, mail: { ...options.mail, port: taken } })).rejects.toMatchObject({
        code: 'EADDRINUSE',
      });
    } finally {
      await new Promise((resolve) => blocker.close(resolve));
    }
  });

  test('reads ports, folders, bucket and origins from the environment, with defaults', () => {
    const defaults = fakesOptionsFromEnv({});
    expect(defaults.mail.port).toBe(2525);
    expect(defaults.s3).toMatchObject({
      port: 4569,
      bucket: 'lightyard',
      allowedOrigins: ['http://localhost:4321', 'http://127.0.0.1:4321'],
    });
    expect(defaults.stripe).toMatchObject({
      port: 12111,
      webhookUrl: 'http://localhost:4321/api/webhooks/stripe',
      webhookSecret: 'whsec_lightyard_local_fake',
    });
    expect(defaults.mail.dir).toBe(path.resolve('data/mail'));

    const custom = fakesOptionsFromEnv({ SMTP_PORT: '0', S3_BUCKET: 'other', APP_ORIGIN: 'https://lightyard.example' });
    expect(custom.mail.port).toBe(0);
    expect(custom.s3).toMatchObject({ bucket: 'other', allowedOrigins: ['https://lightyard.example'] });
    expect(() => fakesOptionsFromEnv({ STRIPE_PORT: 'twelve' })).toThrow(/STRIPE_PORT/);
  });

  test('pairs localhost and 127.0.0.1 origins', () => {
    expect(loopbackOrigins('http://127.0.0.1:4321/')).toEqual(['http://127.0.0.1:4321', 'http://localhost:4321']);
  });

  test('the script logs one line per fake and exits cleanly on SIGTERM', async () => {
    const child = spawn(path.join(root, 'node_modules/.bin/tsx'), [path.join(root, 'fakes/start.ts')], {
      cwd: temp.dir,
      env: { ...process.env, SMTP_PORT: '0', S3_PORT: '0', STRIPE_PORT: '0' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));

    try {
      const deadline = Date.now() + 20_000;
      while (!output.includes('stripe fake') && Date.now() < deadline && child.exitCode === null) {
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
      const lines = output.trim().split('\n');
      expect(lines.map((line) => line.split(/\s+/)[0])).toEqual(['mail', 's3', 'stripe']);
      expect(output).toContain(path.join(temp.dir, 'data/mail'));

      child.kill('SIGTERM');
      expect(await exited).toBe(0);
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL');
    }
  });
});

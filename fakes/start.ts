import { realpathSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { startMailFake, type MailFakeOptions } from './mail/server';
import { startS3Fake, type S3FakeOptions } from './s3/server';
import { startStripeFake, type StripeFakeOptions } from './stripe/server';

export interface FakesOptions {
  mail: MailFakeOptions;
  s3: S3FakeOptions;
  stripe: StripeFakeOptions;
}

export interface RunningFakes {
  ports: { smtp: number; s3: number; stripe: number };
  stop(): Promise<void>;
}

type Env = Record<string, string | undefined>;

// Every fake listens on loopback only: they check no credentials, so nothing else may reach them.
const HOST = '127.0.0.1';

function portFromEnv(env: Env, name: string, fallback: number): number {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 0 || port > 65_535) {
    throw new Error(`${name} must be a port number (0-65535), got '${raw}'`);
  }
  return port;
}

/**
 * The app's origin and its twin under the other loopback name, since a developer may open either
 * http://localhost:4321 or http://127.0.0.1:4321 and the browser treats them as different origins.
 */
export function loopbackOrigins(origin: string): string[] {
  const url = new URL(origin);
  const twins: Record<string, string> = { localhost: '127.0.0.1', '127.0.0.1': 'localhost' };
  const twin = twins[url.hostname];
  if (!twin) return [url.origin];
  const other = new URL(url.origin);
  other.hostname = twin;
  return [url.origin, other.origin];
}

export function fakesOptionsFromEnv(env: Env = process.env): FakesOptions {
  return {
    mail: {
      host: HOST,
      port: portFromEnv(env, 'SMTP_PORT', 2525),
      dir: path.resolve(env.MAIL_DIR || './data/mail'),
    },
    s3: {
      host: HOST,
      port: portFromEnv(env, 'S3_PORT', 4569),
      dir: path.resolve(env.S3_DIR || './data/s3'),
      bucket: env.S3_BUCKET || 'lightyard',
      allowedOrigins: loopbackOrigins(env.APP_ORIGIN || 'http://localhost:4321'),
    },
    stripe: {
      host: HOST,
      port: portFromEnv(env, 'STRIPE_PORT', 12111),
      dir: path.resolve(env.STRIPE_DIR || './data/stripe'),
      webhookUrl: env.STRIPE_WEBHOOK_URL || 'http://localhost:4321/api/webhooks/stripe',
      webhookSecret: env.STRIPE_WEBHOOK_SECRET || 'whsec_lightyard_local_fake',
    },
  };
}

/** Starts the three fakes together; if one cannot start, the others are stopped again. */
export async function startAllFakes(options: FakesOptions): Promise<RunningFakes> {
  const started = await Promise.allSettled([startMailFake(options.mail), startS3Fake(options.s3), startStripeFake(options.stripe)]);
  const stopAll = async () => {
    await Promise.all(started.map((result) => (result.status === 'fulfilled' ? result.value.stop() : undefined)));
  };
  const [mail, s3, stripe] = started;
  if (mail?.status !== 'fulfilled' || s3?.status !== 'fulfilled' || stripe?.status !== 'fulfilled') {
    await stopAll();
    const failure = started.find((result) => result.status === 'rejected');
    throw failure?.reason ?? new Error('startAllFakes: a fake failed to start');
  }
  return {
    ports: { smtp: mail.value.port, s3: s3.value.port, stripe: stripe.value.port },
    stop: stopAll,
  };
}

async function main(): Promise<void> {
  const options = fakesOptionsFromEnv();
  const fakes = await startAllFakes(options);
  console.log(`mail fake    smtp://${HOST}:${fakes.ports.smtp}  messages in ${options.mail.dir}`);
  console.log(
    `s3 fake      http://${HOST}:${fakes.ports.s3}  bucket '${options.s3.bucket}' in ${options.s3.dir}, CORS for ${options.s3.allowedOrigins.join(', ')}`,
  );
  console.log(
    `stripe fake  http://${HOST}:${fakes.ports.stripe}  state in ${options.stripe.dir}, webhooks to ${options.stripe.webhookUrl}`,
  );

  let stopping = false;
  const shutDown = (signal: NodeJS.Signals) => {
    if (stopping) {
      // A second Ctrl-C means the clean stop is stuck; leave at once.
      process.exit(1);
    }
    stopping = true;
    console.log(`${signal}: stopping the fakes`);
    fakes.stop().then(
      () => process.exit(0),
      (error: unknown) => {
        console.error('fakes did not stop cleanly', error);
        process.exit(1);
      },
    );
  };
  process.on('SIGINT', shutDown);
  process.on('SIGTERM', shutDown);
}

function isEntryPoint(): boolean {
  const entry = process.argv[1];
  return entry !== undefined && import.meta.url === pathToFileURL(realpathSync(entry)).href;
}

if (isEntryPoint()) {
  main().catch((error: unknown) => {
    console.error('fakes failed to start:', error);
    process.exit(1);
  });
}

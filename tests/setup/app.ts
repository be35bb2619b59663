/**
 * Starts a real app for a test file: its own temp folder, the fakes on ephemeral ports, a libSQL file
 * migrated from drizzle/ and seeded by the demo factories, and the built server as a child process.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { appendFileSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loopbackOrigins, startAllFakes, type RunningFakes } from '../../fakes/start';

export interface TestApp {
  origin: string;
  dir: string;
  mailDir: string;
  env: Record<string, string>;
  fakes: RunningFakes;
  /** Sends the app process a signal (SIGKILL by default) and waits until it has exited; the fakes keep running. */
  kill(signal?: NodeJS.Signals): Promise<void>;
  /** Starts the app process again on the same folder, database, port and fakes, and waits until it answers. */
  restart(): Promise<void>;
  stop(): Promise<void>;
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

const hasExited = (child: ChildProcess) => child.exitCode !== null || child.signalCode !== null;

async function waitUntilUp(origin: string, child: ChildProcess, log: () => string) {
  const until = Date.now() + 30_000;
  while (Date.now() < until) {
    if (hasExited(child)) throw new Error(`The app exited early:\n${log()}`);
    try {
      const r = await fetch(`${origin}/cautions`);
      if (r.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`The app did not start:\n${log()}`);
}

export async function startTestApp(
  opts: { seed?: boolean; files?: boolean; env?: Record<string, string>; dir?: string; port?: number } = {},
): Promise<TestApp> {
  const dir = opts.dir ?? mkdtempSync(join(tmpdir(), 'lightyard-test-'));
  const mailDir = join(dir, 'mail');
  const port = opts.port ?? (await freePort());
  const origin = `http://127.0.0.1:${port}`;
  const fakes = await startAllFakes({
    mail: { host: '127.0.0.1', port: 0, dir: mailDir },
    s3: { host: '127.0.0.1', port: 0, dir: join(dir, 's3'), bucket: 'lightyard', allowedOrigins: loopbackOrigins(origin) },
    stripe: {
      host: '127.0.0.1',
      port: 0,
      dir: join(dir, 'stripe'),
      webhookUrl: `${origin}/api/webhooks/stripe`,
      webhookSecret: 'whsec_test',
    },
  });
  const env: Record<string, string> = {
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    PORT: String(port),
    APP_ORIGIN: origin,
    DATABASE_URL: `file:${join(dir, 'lightyard.db')}`,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(fakes.ports.smtp),
    SMTP_IGNORE_TLS: '1',
    MAIL_DIR: mailDir,
    S3_ENDPOINT: `http://127.0.0.1:${fakes.ports.s3}`,
    S3_BUCKET: 'lightyard',
    STRIPE_API_BASE: `http://127.0.0.1:${fakes.ports.stripe}`,
    STRIPE_WEBHOOK_SECRET: 'whsec_test',
    FAKES: '1',
    ...opts.env,
  };
  Object.assign(process.env, env);
  const { migrateDatabase } = await import('../../src/server/db/migrate');
  const { closeDb } = await import('../../src/server/db/client');
  await migrateDatabase();
  if (opts.seed !== false) {
    const { seedDemo } = await import('../../src/server/db/seed');
    await seedDemo({ files: opts.files ?? false });
  }
  let output = '';
  let child: ChildProcess;
  const launch = async () => {
    child = spawn(process.execPath, ['dist/server/entry.mjs'], { env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
    const keep = (d: Buffer) => {
      output += d;
      // TEST_APP_LOG=<file> also appends the app's output there, for a run that hangs or fails late
      if (process.env.TEST_APP_LOG) appendFileSync(process.env.TEST_APP_LOG, d);
    };
    child.stdout!.on('data', keep);
    child.stderr!.on('data', keep);
    await waitUntilUp(origin, child, () => output);
  };
  const kill = async (signal: NodeJS.Signals = 'SIGKILL') => {
    if (hasExited(child)) return;
    const exited = new Promise((r) => child.once('exit', r));
    child.kill(signal);
    await exited;
  };
  await launch();
  return {
    origin,
    dir,
    mailDir,
    env,
    fakes,
    kill,
    async restart() {
      if (!hasExited(child)) throw new Error('restart() starts a stopped app: call kill() first');
      await launch();
    },
    async stop() {
      await kill('SIGTERM');
      await fakes.stop();
      await closeDb();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** A fetch client with a cookie jar of its own, like one browser. */
export class Client {
  cookies = new Map<string, string>();
  constructor(readonly origin: string) {}

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    // Like a browser, send Origin on every non-GET request (the app's origin check relies on it).
    const h: Record<string, string> = method === 'GET' ? { ...headers } : { origin: this.origin, ...headers };
    if (body !== undefined) h['content-type'] ??= 'application/json';
    if (this.cookies.size) h.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    const res = await fetch(this.origin + path, {
      method,
      headers: h,
      body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
      redirect: 'manual',
    });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const [k, v] = pair!.split('=');
      if (!v) this.cookies.delete(k!);
      else this.cookies.set(k!, v);
    }
    return res;
  }
  get = (path: string) => this.request('GET', path);
  post = (path: string, body: unknown = {}) => this.request('POST', path, body);
  del = (path: string) => this.request('DELETE', path);

  async signIn(email: string, password: string): Promise<Response> {
    return this.post('/api/auth/sign-in', { email, password });
  }
}

/**
 * `npm start` (and `npm run dev` with --dev): build if needed, start the fakes, migrate, seed the demo
 * when the database is empty, then run the app; Ctrl-C stops everything.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { loadEnvFile } from './env';

const args = new Set(process.argv.slice(2));
const dev = args.has('--dev');
const envFile = loadEnvFile();
if (dev) process.env.NODE_ENV = 'development';

const children: ChildProcess[] = [];
let stopping = false;

function stopAll(code = 0) {
  if (stopping) return;
  stopping = true;
  for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
  setTimeout(() => process.exit(code), 1500).unref();
}
process.on('SIGINT', () => stopAll(0));
process.on('SIGTERM', () => stopAll(0));

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const st = statSync(path);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = 0;
  for (const name of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, name)));
  return newest;
}

function buildIfNeeded() {
  const entry = 'dist/server/entry.mjs';
  const sources = Math.max(newestMtime('src'), newestMtime('public'), newestMtime('astro.config.mjs'), newestMtime('package-lock.json'));
  if (existsSync(entry) && statSync(entry).mtimeMs >= sources) return;
  console.log('Building the app…');
  const r = spawnSync(process.execPath, ['node_modules/astro/astro.js', 'build'], { stdio: 'inherit', env: process.env });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

function run(name: string, command: string, argv: string[]): ChildProcess {
  const child = spawn(command, argv, { stdio: 'inherit', env: process.env });
  children.push(child);
  child.on('exit', (code, signal) => {
    if (!stopping) {
      console.error(`${name} stopped (${signal ?? code}); stopping the rest.`);
      stopAll(code || 1);
    }
  });
  return child;
}

async function waitForPort(port: number, host = '127.0.0.1', timeoutMs = 20_000) {
  const { connect } = await import('node:net');
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const ok = await new Promise<boolean>((resolve) => {
      const s = connect(port, host, () => {
        s.end();
        resolve(true);
      });
      s.on('error', () => resolve(false));
    });
    if (ok) return;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`Nothing answered on ${host}:${port} after ${timeoutMs / 1000} s`);
}

if (!dev && !args.has('--no-build')) buildIfNeeded();

const fakes = process.env.FAKES === '1' || process.env.FAKES === 'true';
if (fakes) {
  run('fakes', process.execPath, ['--import', 'tsx', 'fakes/start.ts']);
  await waitForPort(Number(process.env.SMTP_PORT ?? 2525));
}

const { migrateDatabase } = await import('../db/migrate');
const { isEmpty, seedDemo } = await import('../db/seed');
const { closeDb } = await import('../db/client');
await migrateDatabase();
if (await isEmpty()) {
  await seedDemo();
  console.log('Seeded the demo labs and accounts (password in the README).');
}
await closeDb();

const port = process.env.PORT ?? '4321';
if (dev) {
  run('astro dev', process.execPath, ['node_modules/astro/astro.js', 'dev', '--port', port, '--host', process.env.HOST ?? '127.0.0.1']);
} else {
  run('app', process.execPath, ['dist/server/entry.mjs']);
}
await waitForPort(Number(port), process.env.HOST ?? '127.0.0.1', 60_000);
console.log(
  `\nLightyard is running on ${process.env.APP_ORIGIN ?? `http://localhost:${port}`}${envFile ? ` (settings from ${envFile})` : ''}. Ctrl-C stops it.`,
);

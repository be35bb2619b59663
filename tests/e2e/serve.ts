/** The server Playwright drives: fakes, a fresh seeded database and the built app, in data/e2e/. */
import { mkdirSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { startTestApp } from '../setup/app';
import { E2E_DIR, E2E_PORT } from './paths';

rmSync(E2E_DIR, { recursive: true, force: true });
mkdirSync(E2E_DIR, { recursive: true });
const app = await startTestApp({ dir: resolve(E2E_DIR), port: E2E_PORT, files: true });
console.log(`e2e app on ${app.origin}`);
const stop = () => app.stop().finally(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

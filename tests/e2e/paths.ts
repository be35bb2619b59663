import { resolve } from 'node:path';

export const E2E_PORT = Number(process.env.E2E_PORT ?? 4391);
export const E2E_ORIGIN = `http://127.0.0.1:${E2E_PORT}`;
export const E2E_DIR = resolve('data/e2e');
export const E2E_MAIL_DIR = resolve(E2E_DIR, 'mail');

import { fileURLToPath } from 'node:url';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { migrate } from 'drizzle-orm/libsql/migrator';
import { getDb, prepareDatabase } from './client';

/** drizzle/ beside package.json, found from the source tree or from the built server in dist/. */
export function migrationsFolder(): string {
  const candidates = [resolve(process.cwd(), 'drizzle'), fileURLToPath(new URL('../../../drizzle', import.meta.url))];
  const found = candidates.find((p) => existsSync(resolve(p, 'meta/_journal.json')));
  if (!found) throw new Error(`No migrations found (looked in ${candidates.join(', ')})`);
  return found;
}

export async function migrateDatabase(): Promise<void> {
  await prepareDatabase();
  await migrate(getDb(), { migrationsFolder: migrationsFolder() });
}

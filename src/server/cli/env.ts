import { existsSync } from 'node:fs';

/** Loads .env when present, else .env.example, whose values point every SDK at the local fakes. Existing variables win. */
export function loadEnvFile(): string | null {
  for (const file of ['.env', '.env.example']) {
    if (existsSync(file)) {
      process.loadEnvFile(file);
      return file;
    }
  }
  return null;
}

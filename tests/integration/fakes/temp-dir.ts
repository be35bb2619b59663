import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** A fresh folder under the system temp dir, and the function that removes it again. */
export async function makeTempDir(): Promise<{ dir: string; remove(): Promise<void> }> {
  const dir = await mkdtemp(path.join(tmpdir(), 'lightyard-fakes-'));
  return { dir, remove: () => rm(dir, { recursive: true, force: true }) };
}

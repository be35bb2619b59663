/**
 * `npm run db:backup -- [file]`: an online copy of the embedded database while the app keeps running,
 * to data/backups/lightyard-<timestamp>.db unless a file is named. Exit 1 on failure, 2 for a libSQL server.
 */
import { loadEnvFile } from '../cli/env';
import { getConfig } from '../config';
import { backupDatabase, BackupError } from './backup';

loadEnvFile();
try {
  const r = await backupDatabase({ url: getConfig().DATABASE_URL, to: process.argv[2] });
  console.log(`Backed up ${r.source} to ${r.file}: ${r.bytes} bytes in ${r.ms} ms, integrity check ok.`);
} catch (err) {
  if (!(err instanceof BackupError)) throw err;
  console.error(err.message);
  process.exit(err.exitCode);
}

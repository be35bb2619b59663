/**
 * `npm run db:restore -- <backup file> [--force]`: checks the backup, then replaces the embedded database
 * with it. Refuses while another process has the database open unless --force. Exit 1 on failure or
 * refusal, 2 for wrong arguments or a libSQL server.
 */
import { parseArgs } from 'node:util';
import { loadEnvFile } from '../cli/env';
import { getConfig } from '../config';
import { BackupError, restoreDatabase } from './backup';

loadEnvFile();
const { values, positionals } = parseArgs({ allowPositionals: true, options: { force: { type: 'boolean', default: false } } });
if (positionals.length !== 1) {
  console.error('Usage: npm run db:restore -- <backup file> [--force]');
  process.exit(2);
}
try {
  const r = await restoreDatabase({ url: getConfig().DATABASE_URL, from: positionals[0]!, force: values.force });
  console.log(`Restored ${r.file} from ${positionals[0]} (integrity check ok, ${r.migrations} migrations). Start the app to use it.`);
  if (values.force) console.log('With --force: an app that still had the old file open keeps writing to it; restart it now.');
} catch (err) {
  if (!(err instanceof BackupError)) throw err;
  console.error(err.message);
  process.exit(err.exitCode);
}

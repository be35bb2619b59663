import { loadEnvFile } from '../cli/env';
import { closeDb } from './client';
import { migrateDatabase } from './migrate';
import { isEmpty, seedDemo } from './seed';

loadEnvFile();
await migrateDatabase();
if (await isEmpty()) {
  await seedDemo();
  console.log('Demo data seeded.');
} else {
  console.log('The database already has users; the demo seed runs only on an empty database.');
}
await closeDb();

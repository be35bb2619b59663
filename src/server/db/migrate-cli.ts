import { loadEnvFile } from '../cli/env';
import { closeDb } from './client';
import { migrateDatabase } from './migrate';

loadEnvFile();
await migrateDatabase();
await closeDb();
console.log('Migrations applied.');

import { loadEnv } from '../config/env';
import { openDatabase } from './client';

const env = loadEnv();
const { sqlite } = openDatabase(env.DATABASE_PATH);
sqlite.close();
console.log(`Migrated ${env.DATABASE_PATH}`);

import { loadEnv } from '../config/env';
import { DEFAULT_SCRYPT, TEST_SCRYPT } from '../auth/password';
import { openDatabase } from './client';
import { seedDemo } from './seed-demo';

const env = loadEnv();
const { db, sqlite } = openDatabase(env.DATABASE_PATH);
const created = await seedDemo(db, env.PASSWORD_HASH_COST === 'test' ? TEST_SCRYPT : DEFAULT_SCRYPT);
sqlite.close();
console.log(created ? `Demo scenario created in ${env.DATABASE_PATH}` : 'Demo scenario already present: nothing changed.');

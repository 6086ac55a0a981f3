import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'sqlite',
  schema: './server/db/schema.ts',
  out: './migrations',
  dbCredentials: { url: process.env.DATABASE_PATH ?? 'data/stripwarden.db' },
});

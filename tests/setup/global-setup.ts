import { mkdirSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { openDatabase } from '../../server/db/client';

// Migrate one template database from migrations/ once; each test file copies it (see test-app.ts).
export const TEMPLATE_DIR = resolve('.tmp/test-db');

export default function setup() {
  rmSync(TEMPLATE_DIR, { recursive: true, force: true });
  mkdirSync(TEMPLATE_DIR, { recursive: true });
  const { sqlite } = openDatabase(resolve(TEMPLATE_DIR, 'template.db'));
  sqlite.pragma('wal_checkpoint(TRUNCATE)');
  sqlite.close();
}

// Columns every table spells the same way.
import { sql } from 'drizzle-orm';
import { text } from 'drizzle-orm/sqlite-core';

/** Now, as the ISO-8601 text every time column holds (UTC, milliseconds). */
export const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`;
export const id = () => text('id').primaryKey();
export const createdAt = () => text('created_at').notNull().default(now);

import { sql, type SQLWrapper } from 'drizzle-orm';

/**
 * One column of a step's latest reading, as a subquery: latest by time taken, ties broken by
 * insertion order (a correction supersedes). The one rule for "latest" in SQL; the
 * readings_step_idx index (step_id, taken_at) serves it.
 */
export const latestReadingOf = (stepId: SQLWrapper, column: 'id' | 'verdict') =>
  sql`(select r.${sql.raw(column)} from readings r where r.step_id = ${stepId} order by r.taken_at desc, r.rowid desc limit 1)`;

// Filters of the readings table, as query parameters of GET /api/venues/:id/readings(.csv). The
// page's export link sends the same ones, so the file holds what the screen shows.
import { z } from 'zod';
import { idField } from './common';
import { TEST_KINDS } from '../domain/limits';

export const READING_VERDICTS = ['fail', 'near-limit', 'pass'] as const;

// An ISO 8601 time with a zone (Z or ±hh:mm), so "from 09:00" means one instant on every machine.
const isoTime = (name: string) =>
  z.iso.datetime({ offset: true, error: `${name} must be an ISO 8601 time with its zone, e.g. 2026-03-14T09:00:00Z` });

export const readingsFilterSchema = z
  .strictObject({
    verdict: z.enum(READING_VERDICTS, { error: 'verdict must be fail, near-limit or pass' }).optional(),
    strip: idField.optional(),
    who: idField.optional(),
    test: z.enum(TEST_KINDS, { error: `test must be one of ${TEST_KINDS.join(', ')}` }).optional(),
    from: isoTime('from').optional(),
    to: isoTime('to').optional(),
  })
  .refine((f) => !f.from || !f.to || Date.parse(f.from) <= Date.parse(f.to), { error: 'from must not be after to', path: ['to'] });

export type ReadingsFilter = z.infer<typeof readingsFilterSchema>;

/** The filters as a query string ('' when there are none), in a stable order. */
export function readingsFilterQuery(filter: ReadingsFilter): string {
  const params = new URLSearchParams();
  for (const key of ['verdict', 'strip', 'who', 'test', 'from', 'to'] as const) {
    const value = filter[key];
    if (value) params.set(key, value);
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

/** The filters on one reading, the same on the screen and in the export; times compare as instants. */
export function matchesReadingsFilter(
  r: { verdict: string; stripId: string; takenBy: string | null; testKind: string; takenAt: string },
  f: ReadingsFilter,
): boolean {
  if (f.verdict && r.verdict !== f.verdict) return false;
  if (f.strip && r.stripId !== f.strip) return false;
  if (f.who && r.takenBy !== f.who) return false;
  if (f.test && r.testKind !== f.test) return false;
  const taken = Date.parse(r.takenAt);
  if (f.from && taken < Date.parse(f.from)) return false;
  if (f.to && taken > Date.parse(f.to)) return false;
  return true;
}

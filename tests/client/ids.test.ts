// Ids made on the tablet and on the server: UUIDv7 (RFC 9562 §5.7), time-ordered so the server's
// primary-key indexes grow at their end. Checked against the layout in RFC 9562 §5.7.
import { describe, expect, test } from 'vitest';
import { newReadingId } from '../../src/features/offline/utils/reading-id';
import { newIdempotencyKey } from '../../src/features/attachments/utils/idempotency-key';
import { newId } from '../../server/lib/ids';
import { idField } from '../../shared/schemas/common';

// RFC 9562 §5.7: 48-bit Unix milliseconds, version 7, variant 10.
const V7 = /^([0-9a-f]{8})-([0-9a-f]{4})-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;
const millisOf = (id: string) => parseInt(id.replace(/-/g, '').slice(0, 12), 16);

describe('ids', () => {
  test.each([
    ['a reading typed on the tablet', newReadingId],
    ['a row made by the server', newId],
  ])('when %s gets an id, then it is a UUIDv7 carrying the current time and the API accepts it', (_what, make) => {
    const before = Date.now();
    const id = make();
    const after = Date.now();
    expect(id).toMatch(V7);
    expect(millisOf(id)).toBeGreaterThanOrEqual(before);
    expect(millisOf(id)).toBeLessThanOrEqual(after);
    expect(idField.safeParse(id).success).toBe(true);
  });

  test('when ids are made one after another, then they sort in the order they were made', () => {
    const ids = Array.from({ length: 1000 }, () => newReadingId());
    expect([...ids].sort()).toEqual(ids);
    expect(new Set(ids).size).toBe(ids.length);
  });

  test('when an upload gets an idempotency key, then it is a random UUID (version 4) the API accepts', () => {
    const key = newIdempotencyKey();
    expect(key).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(idField.safeParse(key).success).toBe(true);
  });
});

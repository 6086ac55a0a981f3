import { v7 as uuidv7 } from 'uuid';

/**
 * The reading's id, made once when it is typed. UUIDv7 (RFC 9562 §5.7) is time-ordered, so the
 * server's index takes it at its end; uuid uses getRandomValues, which also works on the plain
 * HTTP of a venue network where crypto.randomUUID does not exist.
 */
export function newReadingId(): string {
  return uuidv7();
}

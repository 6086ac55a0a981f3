import { v4 as uuidv4 } from 'uuid';

/**
 * A random UUID for the Idempotency-Key header. uuid uses getRandomValues, which also works on the
 * plain HTTP of a venue network where crypto.randomUUID does not exist.
 */
export function newIdempotencyKey(): string {
  return uuidv4();
}

export function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${(n / (1024 * 1024)).toFixed(1)} MB`;
  if (n >= 1024) return `${Math.round(n / 1024)} kB`;
  return `${n} B`;
}

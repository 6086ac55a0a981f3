import { createHash } from 'node:crypto';
import { v7 as uuidv7 } from 'uuid';

// UUIDv7 (RFC 9562 §5.7): the leading milliseconds keep new rows at the end of each primary-key
// index instead of on a random page, so a commit writes (and fsyncs) a few pages instead of one
// per index per row (RFC 9562 §2 names that index locality as the reason for version 7).
export const newId = (): string => uuidv7();
export const sha256Hex = (data: string | Buffer): string => createHash('sha256').update(data).digest('hex');
export const nowIso = (): string => new Date().toISOString();

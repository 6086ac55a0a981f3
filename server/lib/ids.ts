import { randomUUID, createHash } from 'node:crypto';

export const newId = (): string => randomUUID();
export const sha256Hex = (data: string | Buffer): string => createHash('sha256').update(data).digest('hex');
export const nowIso = (): string => new Date().toISOString();

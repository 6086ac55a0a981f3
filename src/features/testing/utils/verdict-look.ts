import { READING_SYMBOLS } from '@shared/domain/symbols';

export const verdictLook = {
  pass: READING_SYMBOLS.pass,
  'near-limit': READING_SYMBOLS['near-limit'],
  fail: READING_SYMBOLS.fail,
} as const;

// Which cached answers are kept on the tablet (IndexedDB) for testing without a network: who is
// signed in, the venues, each venue's strip board and each strip's checklist with its latest
// readings and limit profile. Nothing else a director or admin looks at is written to disk.
export const OFFLINE_MAX_AGE_MS = 7 * 24 * 60 * 60 * 1000;

/** Query-key prefixes kept offline; also given a long garbage-collection time so they stay cached. */
export const PERSISTED_KEY_PREFIXES = [['auth', 'me'], ['venues'], ['strips']] as const;

export function shouldPersistQueryKey(key: readonly unknown[]): boolean {
  if (key[0] === 'auth') return key[1] === 'me' && key.length === 2;
  if (key[0] === 'venues') return key.length === 1 || (key.length === 3 && key[2] === 'board');
  if (key[0] === 'strips') return key.length === 2;
  return false;
}

/**
 * Whether a successful answer is written to the tablet. "Nobody is signed in" is not kept: the
 * saved copy is written at most once a second, so a reload right after signing in would otherwise
 * bring back the signed-out answer from before and send the person to sign in again.
 */
export function shouldPersistQuery(key: readonly unknown[], data: unknown): boolean {
  if (!shouldPersistQueryKey(key)) return false;
  if (key[0] === 'auth') return data != null;
  return true;
}

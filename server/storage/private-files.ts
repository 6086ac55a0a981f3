// Everything in the data folder is the server's alone (OWASP ASVS 5.0 13.3.1, secrets and data
// readable only by the account that runs the application): folders 0700, files 0600. New ones are
// created so; our own files and subfolders made by older versions are tightened at start. A folder
// that existed before us (DATA_DIR may be any folder the operator chose) is left as it is.
import { chmodSync, closeSync, existsSync, mkdirSync, openSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

export const PRIVATE_DIR_MODE = 0o700;
export const PRIVATE_FILE_MODE = 0o600;

/** Takes group and other permissions off a file or folder of ours, if it exists. */
export function tighten(path: string, mode: number): void {
  try {
    if ((statSync(path).mode & 0o777 & ~mode) === 0) return;
    chmodSync(path, mode);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    // Gone, or not ours to change (an operator's own arrangement): nothing to do.
    if (code !== 'ENOENT' && code !== 'EPERM') throw err;
  }
}

/**
 * A folder of the server's: made 0700 (with any missing parents). One of our own subfolders is
 * tightened if it exists; DATA_DIR itself is not (`tightenExisting: false`), as it may be a folder
 * the operator chose and shares.
 */
export function privateDir(path: string, opts: { tightenExisting?: boolean } = {}): string {
  mkdirSync(path, { recursive: true, mode: PRIVATE_DIR_MODE });
  if (opts.tightenExisting !== false) tighten(path, PRIVATE_DIR_MODE);
  return path;
}

/** Tightens every file of one of our folders (files made by an older version with 0644 or 0640). */
export function tightenFilesIn(dir: string): void {
  if (!existsSync(dir)) return;
  for (const name of readdirSync(dir)) tighten(join(dir, name), PRIVATE_FILE_MODE);
}

/** Creates an empty file 0600 if there is none, so whatever opens it next keeps that mode. */
export function touchPrivateFile(path: string): void {
  if (!existsSync(path)) closeSync(openSync(path, 'a', PRIVATE_FILE_MODE));
  tighten(path, PRIVATE_FILE_MODE);
}

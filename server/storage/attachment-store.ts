// Files of attachments on disk, under ${DATA_DIR}/attachments/, named by generated UUIDs only: the
// user's file name is never part of a path (OWASP ASVS 5.3.2). Writes go to a temporary name in the
// same folder and are renamed into place, so a crash never leaves a half-written file under a real name.
import { readdirSync, renameSync, rmSync, statSync, writeFileSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { randomUUID } from 'node:crypto';
import { PRIVATE_FILE_MODE, privateDir } from './private-files';

const STORED_NAME = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}(\.preview\.jpg)?$/;
const TEMP_PREFIX = '.incoming-';

export function attachmentStore(dataDir: string) {
  const dir = resolve(dataDir, 'attachments');
  privateDir(dir);

  function pathOf(storedName: string) {
    // Stored names come from the database, but a path is only ever built from a name we generated.
    if (!STORED_NAME.test(storedName)) throw new Error(`not a stored attachment name: ${storedName}`);
    return join(dir, storedName);
  }

  return {
    dir,
    pathOf,
    /** Writes the bytes under a new generated name and returns that name. */
    write(bytes: Buffer, suffix = ''): string {
      const name = `${randomUUID()}${suffix}`;
      const temp = join(dir, `${TEMP_PREFIX}${randomUUID()}`);
      try {
        writeFileSync(temp, bytes, { mode: PRIVATE_FILE_MODE, flag: 'wx' });
        renameSync(temp, pathOf(name));
      } catch (err) {
        rmSync(temp, { force: true });
        throw err;
      }
      return name;
    },
    read: (storedName: string) => readFileSync(pathOf(storedName)),
    remove(storedName: string | null | undefined) {
      if (storedName) rmSync(pathOf(storedName), { force: true });
    },
    exists(storedName: string) {
      try {
        return statSync(pathOf(storedName)).isFile();
      } catch {
        return false;
      }
    },
    /** Every file in the folder (tests use it to check nothing half-written is left behind). */
    list: () => readdirSync(dir),
  };
}
export type AttachmentStore = ReturnType<typeof attachmentStore>;

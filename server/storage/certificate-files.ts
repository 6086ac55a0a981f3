// Issued certificate PDFs, kept as files in the data folder under names the server makes
// (the certificate number), never a name from a request (OWASP ASVS 5.3.2).
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { PRIVATE_FILE_MODE, privateDir, tightenFilesIn } from './private-files';

const SAFE_NAME = /^[A-Z0-9-]+\.pdf$/;

export function certificateFiles(dataDir: string) {
  const dir = join(dataDir, 'certificates');
  // Files issued by older versions were 0640 in a 0755 folder.
  if (existsSync(dir)) {
    privateDir(dir);
    tightenFilesIn(dir);
  }
  const pathOf = (name: string) => {
    if (!SAFE_NAME.test(name)) throw new Error(`Not a certificate file name: ${name}`);
    return join(dir, name);
  };
  return {
    nameFor: (number: string) => `${number}.pdf`,
    /** Never overwrites: an issued file does not change. */
    write(name: string, data: Buffer) {
      privateDir(dir);
      writeFileSync(pathOf(name), data, { flag: 'wx', mode: PRIVATE_FILE_MODE });
    },
    /** The same, without holding the event loop while a large venue's files are written. */
    async writeAsync(name: string, data: Buffer) {
      privateDir(dir);
      await writeFile(pathOf(name), data, { flag: 'wx', mode: PRIVATE_FILE_MODE });
    },
    read: (name: string) => readFileSync(pathOf(name)),
    remove: (name: string) => rmSync(pathOf(name), { force: true }),
  };
}

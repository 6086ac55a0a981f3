// Issued certificate PDFs, kept as files in the data folder under names the server makes
// (the certificate number), never a name from a request (OWASP ASVS 5.3.2).
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

const SAFE_NAME = /^[A-Z0-9-]+\.pdf$/;

export function certificateFiles(dataDir: string) {
  const dir = join(dataDir, 'certificates');
  const pathOf = (name: string) => {
    if (!SAFE_NAME.test(name)) throw new Error(`Not a certificate file name: ${name}`);
    return join(dir, name);
  };
  return {
    nameFor: (number: string) => `${number}.pdf`,
    /** Never overwrites: an issued file does not change. */
    write(name: string, data: Buffer) {
      mkdirSync(dir, { recursive: true });
      writeFileSync(pathOf(name), data, { flag: 'wx', mode: 0o640 });
    },
    read: (name: string) => readFileSync(pathOf(name)),
    remove: (name: string) => rmSync(pathOf(name), { force: true }),
  };
}

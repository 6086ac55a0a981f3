// Where Debian's Chromium is, for the end-to-end tests: CHROMIUM_PATH, or `chromium` on PATH. One
// definition, used by playwright.config.ts and by the check `npm test` runs first.
import { accessSync, constants } from 'node:fs';
import { delimiter, join } from 'node:path';

export type ChromiumLookup = { found: true; path: string } | { found: false; problem: string };

const INSTALL = 'on Debian run `apt-get install chromium`, or set CHROMIUM_PATH to the browser';

function runnable(file: string): boolean {
  try {
    accessSync(file, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}

export function findChromium(env: NodeJS.ProcessEnv = process.env): ChromiumLookup {
  const fromEnv = env.CHROMIUM_PATH;
  if (fromEnv) {
    if (runnable(fromEnv)) return { found: true, path: fromEnv };
    return { found: false, problem: `CHROMIUM_PATH is ${fromEnv}, but no browser can be run there: ${INSTALL}.` };
  }
  for (const dir of (env.PATH ?? '').split(delimiter).filter(Boolean)) {
    for (const name of ['chromium', 'chromium-browser']) {
      const candidate = join(dir, name);
      if (runnable(candidate)) return { found: true, path: candidate };
    }
  }
  return { found: false, problem: `Chromium was not found, and the end-to-end tests need it: ${INSTALL}.` };
}

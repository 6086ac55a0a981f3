// Where Debian's Chromium is, for the end-to-end tests and the browser benchmarks: CHROMIUM_PATH, or
// `chromium` on PATH. One definition, used by playwright.config.ts, the benchmarks and the check
// `npm test` runs first.
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

/** The path, or an error saying what to install. */
export function chromiumPath(env: NodeJS.ProcessEnv = process.env): string {
  const lookup = findChromium(env);
  if (!lookup.found) throw new Error(lookup.problem);
  return lookup.path;
}

// Without the networking flags Chromium keeps trying hosts this closed network refuses (STACK.md).
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

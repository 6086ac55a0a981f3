// The server's size rule (eslint.config.js): no file over 350 lines, no function over 80 lines of
// code. Probe files that do not exist on disk, linted with the project's own config.
import { ESLint } from 'eslint';
import { describe, expect, test } from 'vitest';

const eslint = new ESLint({ cwd: process.cwd() });
const rulesOf = async (filePath: string, code: string) => (await eslint.lintText(code, { filePath }))[0].messages.map((m) => m.ruleId);

/** A function of `n` statements, one a line, with blank and comment lines that do not count. */
const fn = (name: string, n: number) =>
  `export function ${name}(x: number) {\n  // why it is long\n\n${Array.from({ length: n }, (_, i) => `  x += ${i};`).join('\n')}\n  return x;\n}\n`;

describe('lint: server size limits', { timeout: 120_000 }, () => {
  test('a server function of 81 lines is reported; one of 80, with blank and comment lines besides, is not', async () => {
    // 78 statements + the signature, the return and the closing brace = 81 lines of code.
    expect(await rulesOf('server/services/probe.ts', fn('tooLong', 78))).toEqual(['max-lines-per-function']);
    expect(await rulesOf('server/services/probe.ts', fn('justRight', 77))).toEqual([]);
  });

  test('a server file of 351 lines is reported, one of 350 is not', async () => {
    const lines = (n: number) => Array.from({ length: n }, (_, i) => `export const v${i} = ${i};`).join('\n') + '\n';
    expect(await rulesOf('server/lib/probe.ts', lines(351))).toEqual(['max-lines']);
    expect(await rulesOf('server/lib/probe.ts', lines(350))).toEqual([]);
  });

  test('the limits are the server’s: client code of the same size is not reported', async () => {
    expect(await rulesOf('src/lib/probe.ts', fn('clientSide', 120))).toEqual([]);
  });
});

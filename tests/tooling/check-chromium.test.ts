// `npm test` without Chromium stops at once with one line saying what to install, instead of a
// stack trace from Playwright at the end of a long run.
import { describe, expect, test } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

/** Runs the check as `npm test` does (through tsx), with exactly the environment given. */
function runCheck(env: Record<string, string>) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/check-chromium.ts'], { cwd: ROOT, env, encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, lines: r.stderr.split('\n').filter((l) => l.trim() !== '') };
}

describe('scripts/check-chromium.ts', () => {
  test('when there is no Chromium on an empty PATH and no CHROMIUM_PATH, then one line names the package and the alternative, and it exits non-zero', () => {
    const r = runCheck({ PATH: '' });
    expect(r.status).not.toBe(0);
    expect(r.lines).toHaveLength(1);
    expect(r.lines[0]).toContain('apt-get install chromium');
    expect(r.lines[0]).toContain('CHROMIUM_PATH');
    expect(r.stdout).toBe('');
  });

  test('when CHROMIUM_PATH names no file, then the one line says so, naming it', () => {
    const r = runCheck({ PATH: '', CHROMIUM_PATH: '/nowhere/chromium' });
    expect(r.status).not.toBe(0);
    expect(r.lines).toHaveLength(1);
    expect(r.lines[0]).toContain('/nowhere/chromium');
    expect(r.lines[0]).toContain('apt-get install chromium');
  });

  test('when a runnable chromium is on PATH, or CHROMIUM_PATH names one, then it passes silently', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-chromium-'));
    const browser = join(dir, 'chromium');
    writeFileSync(browser, '#!/bin/sh\n');
    chmodSync(browser, 0o755);
    const envs: Record<string, string>[] = [{ PATH: dir }, { PATH: '', CHROMIUM_PATH: browser }];
    for (const env of envs) {
      const r = runCheck(env);
      expect(r.lines).toEqual([]);
      expect(r.status).toBe(0);
    }
  });

  test('npm test runs the check before anything else: with no Chromium it stops before the typecheck', async () => {
    const child = spawn('npm', ['test'], {
      cwd: ROOT,
      env: { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? ROOT, CHROMIUM_PATH: '/nowhere/chromium' },
      // Its own process group: were the check gone, the whole suite (this test too) would start,
      // and the group is ended as soon as the typecheck shows up.
      detached: true,
    });
    let output = '';
    const status = await new Promise<number | null>((resolve) => {
      const seen = (c: Buffer) => {
        output += c.toString('utf8');
        if (output.includes('tsc --noEmit')) process.kill(-child.pid!, 'SIGKILL');
      };
      child.stdout.on('data', seen);
      child.stderr.on('data', seen);
      child.on('close', (code) => resolve(code));
    });
    expect(output).not.toContain('tsc --noEmit');
    expect(output).toContain('CHROMIUM_PATH is /nowhere/chromium');
    expect(status).not.toBe(0);
  });
});

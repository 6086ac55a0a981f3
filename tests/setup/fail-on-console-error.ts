import { afterEach, beforeEach, vi } from 'vitest';

// A console.error during a test is a bug the test did not see: fail it.
let errors: unknown[][] = [];
beforeEach(() => {
  errors = [];
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    errors.push(args);
  });
});
afterEach(() => {
  vi.restoreAllMocks();
  if (errors.length > 0) {
    const text = errors.map((a) => a.map(String).join(' ')).join('\n');
    throw new Error(`console.error was called during the test:\n${text}`);
  }
});

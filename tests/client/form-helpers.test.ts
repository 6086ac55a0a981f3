// The helpers that let a react-hook-form form check what it would send with the shared zod schema.
import { describe, expect, test } from 'vitest';
import { bulkStripsSchema, updateStripSchema } from '../../shared/schemas/plan';
import { bodyResolver } from '../../src/lib/form-resolver';
import { messagesUnder } from '../../src/lib/form-errors';
import { decimalOrNull } from '../../src/lib/form-values';

const options = { fields: {}, shouldUseNativeValidation: false } as const;
const issuesOf = (result: ReturnType<typeof bulkStripsSchema.safeParse>) =>
  result.success ? [] : result.error.issues.map((i) => [i.path.join('.'), i.message]);

describe('bodyResolver', () => {
  const toBody = (v: { labels: string }) => ({
    labels: v.labels
      .split('\n')
      .map((l) => l.trim())
      .filter(Boolean),
  });
  const resolver = bodyResolver(bulkStripsSchema, toBody);

  test('when the body the form would send breaks the shared schema, then its errors sit at the body paths with the schema messages', async () => {
    const typed = { labels: 'Final\nRed\nFinal' };
    const result = await resolver(typed, undefined, options);
    const expected = issuesOf(bulkStripsSchema.safeParse(toBody(typed)));
    expect(expected).toHaveLength(1);
    const [[path, message]] = expected;
    expect(path).toBe('labels.2');
    expect(result.values).toEqual({});
    expect(messagesUnder(result.errors.labels)).toEqual([message]);
  });

  test('when the body is valid, then the submit handler gets the parsed body (trimmed as the schema trims), not the typed values', async () => {
    const result = await bodyResolver(updateStripSchema, (v: { label: string }) => v)({ label: '  Final strip ' }, undefined, options);
    expect(result.errors).toEqual({});
    expect(result.values).toEqual({ label: 'Final strip' });
  });
});

describe('messagesUnder', () => {
  test('when errors are nested (a list and its items), then every message is listed once, refs and types left out', () => {
    const ref = { name: 'x', message: 'not a message' };
    const errors = {
      message: 'A limit profile needs at least one rule',
      type: 'too_small',
      ref,
      0: { source: { message: 'Every rule needs a source', type: 'custom', ref } },
    };
    expect(messagesUnder(errors)).toEqual(['A limit profile needs at least one rule', 'Every rule needs a source']);
    expect(messagesUnder(undefined)).toEqual([]);
  });
});

describe('decimalOrNull', () => {
  test.each([
    ['', null],
    ['  ', null],
    ['12.5', 12.5],
    ['12,5', 12.5],
    [' 3 ', 3],
  ])('when %j is typed, then the value is %j', (typed, value) => {
    expect(decimalOrNull(typed)).toBe(value);
  });

  test('when text that is not a number is typed, then it stays NaN for the schema to refuse', () => {
    expect(decimalOrNull('twelve')).toBeNaN();
  });
});

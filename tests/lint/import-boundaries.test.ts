// The one-way import rule of DEVELOPERS.md ("Architecture") is only real while `npm run lint` catches
// every way to break it. Each probe below is a file that does not exist on disk, linted by ESLint's
// Node API at a path inside the tree with the project's own eslint.config.js.
import { ESLint } from 'eslint';
import { describe, expect, test } from 'vitest';

const eslint = new ESLint({ cwd: process.cwd() });

async function lintProbe(filePath: string, code: string) {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.map((m) => ({ rule: m.ruleId, message: m.message }));
}

// Every probe imports one name and uses it, so the only complaint can be the import itself.
const probe = (from: string) => `import * as target from '${from}';\nexport const probe = [target];\n`;

const forbidden: [string, string, string, string][] = [
  // [what, probe file, import, rule]
  ['components/ imports a feature', 'src/components/ui/probe.tsx', '@/features/auth/api/get-me', 'import-x/no-restricted-paths'],
  ['components/ imports app code', 'src/components/layouts/probe.tsx', '@/app/routes/auth/sign-in', 'import-x/no-restricted-paths'],
  ['lib/ imports a feature', 'src/lib/probe.ts', '@/features/plan/api/plan-edit', 'import-x/no-restricted-paths'],
  ['lib/ imports app code', 'src/lib/probe.ts', '@/app/provider', 'import-x/no-restricted-paths'],
  ['a feature imports app code', 'src/features/plan/components/probe.tsx', '@/app/routes/venues/plan', 'import-x/no-restricted-paths'],
  [
    'a feature imports another feature',
    'src/features/plan/components/probe.tsx',
    '@/features/equipment/components/labels',
    'import-x/no-restricted-paths',
  ],
  ['the client imports the server', 'src/lib/probe.ts', '../../server/app', 'no-restricted-imports'],
  ['the server imports the client', 'server/services/probe.ts', '../../src/lib/api-client', 'no-restricted-imports'],
  ['shared/ imports the server', 'shared/domain/probe.ts', '../../server/app', 'no-restricted-imports'],
  ['shared/ imports the client', 'shared/domain/probe.ts', '../../src/config/paths', 'no-restricted-imports'],
  ['shared/ imports a package other than zod', 'shared/domain/probe.ts', 'date-fns', 'no-restricted-imports'],
  ['shared/format imports a package other than zod and date-fns', 'shared/format/probe.ts', 'mathjs', 'no-restricted-imports'],
];

// The first lint loads the TypeScript resolver and parses the imported modules for no-cycle: slow on a busy machine.
describe('lint: import boundaries', { timeout: 120_000 }, () => {
  test.each(forbidden)('when %s, then lint reports it', async (_what, file, from, rule) => {
    const messages = await lintProbe(file, probe(from));
    expect(messages.map((m) => m.rule)).toEqual([rule]);
  });

  test('when a page imports a feature and a feature imports itself, components, lib, config and shared, then lint is quiet', async () => {
    const page = await lintProbe('src/app/routes/venues/probe.tsx', probe('@/features/plan/components/strip-editor'));
    const feature = await lintProbe(
      'src/features/plan/components/probe.tsx',
      [
        "import { EventForm } from './event-form';",
        "import { Button } from '@/components/ui/button';",
        "import { call } from '@/lib/api-client';",
        "import { paths } from '@/config/paths';",
        "import { createEventSchema } from '@shared/schemas/plan';",
        'export const probe = [EventForm, Button, call, paths, createEventSchema];',
        '',
      ].join('\n'),
    );
    const component = await lintProbe('src/components/ui/probe.tsx', probe('@/lib/api-client'));
    expect([...page, ...feature, ...component]).toEqual([]);
  });
});

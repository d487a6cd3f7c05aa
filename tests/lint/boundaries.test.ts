// The import boundaries are enforced by `npm run lint` (eslint.config.js), which npm test runs
// first. Here each rule is shown to fire: a planted violation of it, linted as if it were a file
// in that place, is reported, and the allowed import beside it is not.
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

const eslint = new ESLint({ cwd: process.cwd() });

async function problems(filePath: string, code: string) {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages
    .filter((m) => m.ruleId === 'import-x/no-restricted-paths' || m.ruleId === 'no-restricted-imports')
    .map((m) => m.message);
}

describe('import boundaries (ESLint)', () => {
  const cases: Array<[string, string, string, RegExp]> = [
    [
      'the editor core does not import React',
      'src/features/editor/core/planted.ts',
      "import { useState } from 'react';\nexport const x = useState;\n",
      /no React, Konva/,
    ],
    [
      'the editor core does not import Konva',
      'src/features/editor/core/planted.ts',
      "import Konva from 'konva';\nexport const x = Konva;\n",
      /no React, Konva/,
    ],
    [
      'the editor core does not import the API layer',
      'src/features/editor/core/planted.ts',
      "import { outlineKey } from '../api/outlines';\nexport const x = outlineKey;\n",
      /editor core imports neither/,
    ],
    [
      'a feature does not import another feature',
      'src/features/library/components/planted.ts',
      "import { useTeam } from '../../team/api/team';\nexport const x = useTeam;\n",
      /Features import no other feature/,
    ],
    [
      'the server does not import scripts/',
      'server/modules/planted.ts',
      "import { nestingDir } from '../../scripts/bench/nesting-dir';\nexport const x = nestingDir;\n",
      /neither the client nor scripts/,
    ],
    [
      'shared/ does not import the server',
      'shared/planted.ts',
      "import { AppError } from '../server/lib/errors';\nexport const x = AppError;\n",
      /shared\/ depends on nothing/,
    ],
    [
      'a feature does not import another feature through the @/ alias',
      'src/features/library/components/planted.ts',
      "import { useTeam } from '@/features/team/api/team';\nexport const x = useTeam;\n",
      /Features import no other feature/,
    ],
    [
      'shared/ does not import the client through the @/ alias',
      'shared/planted.ts',
      "import { api } from '@/lib/api-client';\nexport const x = api;\n",
      /shared\/ depends on nothing/,
    ],
    [
      'shared/ does not import the client',
      'shared/planted.ts',
      "import { api } from '../src/lib/api-client';\nexport const x = api;\n",
      /shared\/ depends on nothing/,
    ],
    [
      'a server module does not import one above it (art → sheets)',
      'server/modules/art/planted.ts',
      "import { SheetsService } from '../sheets/sheets.service';\nexport const x = SheetsService;\n",
      /Server modules depend one way/,
    ],
    [
      'a server module does not import one above it (accounts → auth)',
      'server/modules/accounts/planted.ts',
      "import { AuthService } from '../auth/auth.service';\nexport const x = AuthService;\n",
      /Server modules depend one way/,
    ],
    [
      'the client does not import the server',
      'src/lib/planted.ts',
      "import { AppError } from '../../server/lib/errors';\nexport const x = AppError;\n",
      /never imports the server/,
    ],
  ];
  for (const [name, file, code, message] of cases) {
    it(name, async () => {
      const found = await problems(file, code);
      expect(found).toHaveLength(1);
      expect(found[0]).toMatch(message);
    });
  }

  it('allows what the layers may use: auth from a feature, shared/ from anywhere', async () => {
    expect(
      await problems('src/features/library/components/planted.ts', "import { useMe } from '../../auth/api/me';\nexport const x = useMe;\n"),
    ).toEqual([]);
    expect(
      await problems(
        'src/features/editor/core/planted.ts',
        "import { outlineKey } from '../../../../shared/sheet/placement';\nexport const x = outlineKey;\n",
      ),
    ).toEqual([]);
    expect(
      await problems('server/modules/planted.ts', "import { outlineKey } from '@shared/sheet/placement';\nexport const x = outlineKey;\n"),
    ).toEqual([]);
    expect(
      await problems(
        'server/modules/shop/planted.ts',
        "import { SheetsService } from '../sheets/sheets.service';\nexport const x = SheetsService;\n",
      ),
    ).toEqual([]);
  });

  it('refuses a file of more than 300 lines, and takes one of 300', async () => {
    const lines = (n: number) => Array.from({ length: n }, (_, i) => `export const v${i} = ${i};`).join('\n') + '\n';
    const lint = async (n: number) =>
      (await eslint.lintText(lines(n), { filePath: 'server/lib/planted.ts' }))[0].messages.filter((m) => m.ruleId === 'max-lines');
    expect(await lint(300)).toEqual([]);
    expect((await lint(301))[0]?.message).toMatch(/too many lines \(301\)/i);
  });
});

/**
 * The layers are enforced by lint (eslint.config.js, zones in lint/layers.js). Each case plants an import
 * as if it stood in a real file of the tree and checks that eslint refuses it — or, for the allowed
 * directions, accepts it — so a rule that silently stops matching (an unresolved alias, a mistyped zone)
 * fails here rather than letting the layers drift.
 */
import { readdirSync } from 'node:fs';
import path from 'node:path';

import { ESLint } from 'eslint';

const root = path.resolve(__dirname, '../..');
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { featureOrder, serverOrder } = require('../../lint/layers') as {
  featureOrder: string[];
  serverOrder: string[];
};

// The project's own config, handed over directly: jest cannot run the dynamic import eslint uses to find it.
// eslint-disable-next-line @typescript-eslint/no-require-imports
const config = require('../../eslint.config.js');
const eslint = new ESLint({ cwd: root, ignore: false, overrideConfigFile: true, overrideConfig: config });
// Planted text has no file on disk, which import/no-cycle cannot walk from; the cycle has its own fixture.
const zonesOnly = new ESLint({
  cwd: root,
  ignore: false,
  overrideConfigFile: true,
  overrideConfig: [...config, { rules: { 'import/no-cycle': 'off' } }],
});

async function importRules(code: string, filePath: string): Promise<string[]> {
  const [result] = await zonesOnly.lintText(code, { filePath: path.join(root, filePath) });
  return result.messages
    .filter((m) => m.ruleId === 'import/no-restricted-paths' || m.ruleId === 'import/no-cycle')
    .map((m) => `${m.ruleId}: ${m.message}`);
}

jest.setTimeout(120_000);

describe('layer rules refuse imports that point upward', () => {
  const refused: [string, string, string][] = [
    [
      'lib/planted.ts',
      "import { apiFetch } from '@/features/api/client';\nexport const x = apiFetch;\n",
      'lib/',
    ],
    [
      'components/planted.tsx',
      "import { RoleGate } from '@/features/auth/role-gate';\nexport const x = RoleGate;\n",
      'components/',
    ],
    [
      'features/api/planted.ts',
      "import { reviewKeys } from '@/features/review/keys';\nexport const x = reviewKeys;\n",
      'features/api sits below',
    ],
    [
      'features/registry/planted.ts',
      "import { useRideNotices } from '@/features/notices/ride-notices-api';\nexport const x = useRideNotices;\n",
      'features/registry sits below',
    ],
    [
      'features/review/planted-deep.ts',
      "import { ChainDrawing } from '@/features/registry/chain-drawing';\nexport const x = ChainDrawing;\n",
      'through its index.ts',
    ],
    [
      'features/records/planted.ts',
      "import { decisionInputSchema } from '@/features/review/schema';\nexport const x = decisionInputSchema;\n",
      'features/records sits below',
    ],
    [
      'server/planted.ts',
      "import { Card } from '@/components/card';\nexport const x = Card;\n",
      'The server imports',
    ],
    [
      'features/rides/schema-planted-schema.ts',
      "import { rideKeys } from '@/features/rides/api';\nexport const x = rideKeys;\n",
      'A contract',
    ],
    [
      'server/queue/planted.ts',
      "import { mustTransition } from '@/server/review/ride-status';\nexport const x = mustTransition;\n",
      'server/queue sits below',
    ],
    [
      'scripts/planted.ts',
      "import { a } from '@/tests/lint-fixtures/cycle/a';\nexport const x = a;\n",
      'Nothing outside tests/',
    ],
  ];
  test.each(refused)('%s', async (file, code, words) => {
    const problems = await importRules(code, file);
    expect(problems.join('\n')).toContain(words);
  });
});

describe('layer rules accept the allowed directions', () => {
  const allowed: [string, string][] = [
    // A higher feature imports a lower one through its public API.
    [
      'features/review/planted.ts',
      "import { apiFetch } from '@/features/api';\nexport const x = apiFetch;\n",
    ],
    // A feature imports a lower feature's contract.
    [
      'features/device-db/planted.ts',
      "import { inspectionRecordSchema } from '@/features/records/schema';\nexport const x = inspectionRecordSchema;\n",
    ],
    // The server imports a pure feature module and lib.
    [
      'server/planted.ts',
      "import { analyseRecord } from '@/features/records/analysis';\nimport { formatDate } from '@/lib/dates';\nexport const x = [analyseRecord, formatDate];\n",
    ],
    ['components/planted.tsx', "import { formatDate } from '@/lib/dates';\nexport const x = formatDate;\n"],
  ];
  test.each(allowed)('%s', async (file, code) => {
    expect(await importRules(code, file)).toEqual([]);
  });
});

test('import/no-cycle refuses two modules that import each other', async () => {
  const results = await eslint.lintFiles([path.join(root, 'tests/lint-fixtures/cycle/a.ts')]);
  expect(results[0].messages.map((m) => m.ruleId)).toContain('import/no-cycle');
});

test('every feature folder has its place in the documented order', () => {
  const folders = readdirSync(path.join(root, 'features'), { withFileTypes: true })
    .filter((d) => d.isDirectory())
    .map((d) => d.name)
    .sort();
  expect(folders).toEqual([...featureOrder].sort());
});

test('every folder and module at the top of server/ has its place in the documented order', () => {
  const entries = readdirSync(path.join(root, 'server'), { withFileTypes: true })
    .map((d) => (d.isDirectory() ? d.name : d.name.replace(/\.ts$/, '')))
    .sort();
  expect(entries).toEqual([...serverOrder].sort());
});

/**
 * `npm run create-admin`, run as its own process the way an operator of a fresh install runs it: the
 * password read from stdin or PIVOTWATCH_ADMIN_PASSWORD, never printed; the stored hash checked with
 * bcryptjs's own compare (the reference implementation of the bcrypt format we store).
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

import bcrypt from 'bcryptjs';
import { eq } from 'drizzle-orm';

import { auditLog, users } from '@/db/server/schema';
import { openDb } from '@/server/db';

import { makeTempDir } from './helpers';

const password = 'correct horse battery';

function run(args: string[], opts: { dataDir: string; stdin?: string; env?: Record<string, string> }) {
  const result = spawnSync(
    process.execPath,
    ['--import', 'tsx', path.join('scripts', 'create-admin.ts'), ...args],
    {
      input: opts.stdin ?? '',
      env: {
        ...process.env,
        NODE_ENV: 'production',
        DATA_DIR: opts.dataDir,
        PIVOTWATCH_ADMIN_PASSWORD: '',
        ...opts.env,
      },
      encoding: 'utf8',
      timeout: 60_000,
    },
  );
  return { code: result.status, out: `${result.stdout}${result.stderr}` };
}

function usersIn(dataDir: string) {
  const database = openDb(dataDir);
  try {
    return database.db.select().from(users).all();
  } finally {
    database.close();
  }
}

let dataDir = '';
beforeEach(() => {
  dataDir = makeTempDir('pivotwatch-create-admin-');
});
afterEach(() => fs.rmSync(dataDir, { recursive: true, force: true }));

test('creates the first administrator in a fresh DATA_DIR from a password on stdin, and never prints it', () => {
  const res = run(['--email', 'Gwen.Ashdown@Halvard.test', '--name', 'Gwen Ashdown'], {
    dataDir,
    stdin: `${password}\n`,
  });
  expect(res.code).toBe(0);
  expect(res.out).toContain('Created administrator Gwen Ashdown <gwen.ashdown@halvard.test>');
  expect(res.out).not.toContain(password);

  const [admin, ...others] = usersIn(dataDir);
  expect(others).toHaveLength(0);
  expect(admin).toMatchObject({
    email: 'gwen.ashdown@halvard.test',
    role: 'admin',
    companyId: null,
    disabledAt: null,
  });
  expect(bcrypt.compareSync(password, admin.passwordHash)).toBe(true);
  const database = openDb(dataDir);
  const audit = database.db.select().from(auditLog).where(eq(auditLog.entityId, admin.id)).all();
  database.close();
  expect(audit).toMatchObject([{ entity: 'user', action: 'create', userId: admin.id }]);
  expect(JSON.stringify(audit)).not.toContain(password);
});

test('takes the password from PIVOTWATCH_ADMIN_PASSWORD; a second run with the same e-mail changes nothing', () => {
  const env = { PIVOTWATCH_ADMIN_PASSWORD: password };
  expect(run(['--email', 'ops@halvard.test', '--name', 'Ops Desk'], { dataDir, env }).code).toBe(0);
  const again = run(['--email', 'ops@halvard.test', '--name', 'Someone Else'], { dataDir, env });
  expect(again.code).toBe(1);
  expect(again.out).toMatch(/already exists/);
  expect(usersIn(dataDir).map((u) => u.name)).toEqual(['Ops Desk']);
});

test.each([
  [['--email', 'a@halvard.test', '--name', 'Short Pass'], 'short one\n', /at least 12 characters/],
  [['--email', 'long.name@halvard.test', '--name', 'Same As Mail'], 'long.name@halvard.test\n', /e-mail/],
  [['--name', 'No Mail'], `${password}\n`, /--email/],
  [['--email', 'x@halvard.test'], `${password}\n`, /--name/],
  [['--email', 'x@halvard.test', '--name', 'X', '--role', 'admin'], `${password}\n`, /role/],
])('refuses %j with a clear message and creates no one', (args, stdin, message) => {
  const res = run(args, { dataDir, stdin });
  expect(res.code).toBe(1);
  expect(res.out).toMatch(message);
  expect(res.out).not.toMatch(/\bat .+\.(ts|js):\d+/);
  expect(fs.existsSync(path.join(dataDir, 'pivotwatch.db')) ? usersIn(dataDir) : []).toHaveLength(0);
});

/**
 * `npm run create-admin -- --email a@b.example --name "Full Name"`: creates an administrator in DATA_DIR's
 * database (migrating it first), for the first sign-in of a production install. The password comes from
 * PIVOTWATCH_ADMIN_PASSWORD, else a hidden prompt on a terminal (asked twice), else the first line of
 * stdin; it is never printed or logged.
 */
import { Writable } from 'node:stream';
import readline from 'node:readline';
import { parseArgs } from 'node:util';

import { z } from 'zod';

import { passwordProblem } from '@/features/auth/password-schema';
import { createAdministrator } from '@/server/auth/people';
import { ConfigError, parseEnv } from '@/server/config';
import { openDb } from '@/server/db';
import { restrictNewFiles } from '@/server/files';
import { HttpError } from '@/server/http/errors';

class UsageError extends Error {}

const usage =
  'Usage: npm run create-admin -- --email <address> --name "<full name>"\n' +
  'The password is read from PIVOTWATCH_ADMIN_PASSWORD, a hidden prompt, or standard input.';

/** Asks on the terminal without echoing what is typed. */
function askHidden(prompt: string): Promise<string> {
  let muted = false;
  const output = new Writable({
    write(chunk, _encoding, done) {
      if (!muted) process.stdout.write(chunk);
      done();
    },
  });
  const rl = readline.createInterface({ input: process.stdin, output, terminal: true });
  return new Promise((resolve) => {
    rl.question(prompt, (answer) => {
      rl.close();
      process.stdout.write('\n');
      resolve(answer);
    });
    muted = true;
  });
}

async function readStdinLine(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(Buffer.from(chunk));
  return Buffer.concat(chunks).toString('utf8').split(/\r?\n/)[0] ?? '';
}

async function readPassword(): Promise<string> {
  const fromEnv = process.env.PIVOTWATCH_ADMIN_PASSWORD;
  if (fromEnv) return fromEnv;
  if (!process.stdin.isTTY) return readStdinLine();
  const first = await askHidden('Password (at least 12 characters): ');
  const second = await askHidden('The same password again: ');
  if (first !== second) throw new UsageError('The two passwords differ. Nothing was created.');
  return first;
}

async function main() {
  const { values } = parseArgs({
    options: { email: { type: 'string' }, name: { type: 'string' }, help: { type: 'boolean' } },
    strict: true,
  });
  if (values.help) {
    console.log(usage);
    return;
  }
  const email = z
    .string()
    .trim()
    .toLowerCase()
    .email()
    .safeParse(values.email ?? '');
  if (!email.success) throw new UsageError(`Give the administrator's e-mail address with --email.\n${usage}`);
  const name = (values.name ?? '').trim();
  if (!name || name.length > 120)
    throw new UsageError(`Give the administrator's name with --name.\n${usage}`);
  const password = await readPassword();
  const problem = passwordProblem(password, email.data);
  if (problem) throw new UsageError(`The password cannot be used: ${problem}. Nothing was created.`);

  restrictNewFiles();
  const config = parseEnv(process.env);
  const database = openDb(config.dataDir, { backupDir: config.backupDir });
  try {
    const admin = await createAdministrator(database.db, { email: email.data, name, password }, new Date());
    console.log(`Created administrator ${admin.name} <${admin.email}> in ${config.dataDir}.`);
    console.log(
      'Start the server (npm start) and sign in; invite everyone else from Administration › People.',
    );
  } finally {
    database.close();
  }
}

main().catch((error: unknown) => {
  const known = error instanceof UsageError || error instanceof ConfigError || error instanceof HttpError;
  const parseProblem =
    error instanceof TypeError && 'code' in error && String(error.code).startsWith('ERR_PARSE_ARGS');
  console.error(known || parseProblem ? (error as Error).message : error);
  process.exit(1);
});

/**
 * `npm run storage:move -- --from <STORAGE_URL> --to <STORAGE_URL>`: copies every stored photo, NDT report
 * and cached notice PDF from one storage to another, checks each copy by SHA-256, and prints the counts.
 * The source is only read. `file:` means the disk under DATA_DIR (as for the server); the S3 credentials
 * come from the environment (AWS_ACCESS_KEY_ID, AWS_SECRET_ACCESS_KEY). README.md "Stored files" gives
 * the whole procedure.
 */
import { ConfigError, parseEnv } from '@/server/config';
import {
  describeStorage,
  openStorage,
  parseStorageUrl,
  StorageError,
  StorageUrlError,
} from '@/server/storage';
import { moveStorage } from '@/server/storage/move';

const usage =
  'Usage: npm run storage:move -- --from <STORAGE_URL> --to <STORAGE_URL>\n' +
  '  e.g. --from file: --to "s3://pivotwatch-files/prod?region=eu-central-1"';

function option(args: string[], name: string): string {
  const at = args.indexOf(name);
  const value = at >= 0 ? args[at + 1] : undefined;
  if (value === undefined || value.startsWith('--'))
    throw new StorageUrlError(`${name} is missing.\n${usage}`);
  return value;
}

function settingsOf(name: string, value: string) {
  try {
    return parseStorageUrl(value);
  } catch (error) {
    if (error instanceof StorageUrlError) throw new StorageUrlError(`${name} ${value}: ${error.message}`);
    throw error;
  }
}

async function main() {
  const args = process.argv.slice(2);
  const { dataDir } = parseEnv(process.env);
  const fromSettings = settingsOf('--from', option(args, '--from'));
  const toSettings = settingsOf('--to', option(args, '--to'));
  const fromWhere = describeStorage(fromSettings, dataDir);
  const toWhere = describeStorage(toSettings, dataDir);
  if (fromWhere === toWhere)
    throw new StorageUrlError(`--from and --to are the same storage (${fromWhere}).`);
  const from = openStorage(fromSettings, dataDir);
  const to = openStorage(toSettings, dataDir);
  await from.check();
  await to.check();
  console.log(`Copying stored files from ${fromWhere} to ${toWhere} (the source is only read).`);
  const result = await moveStorage(from, to, {
    onProgress: (folder, done, total) => console.log(`  ${folder}: ${done} of ${total} checked`),
  });
  for (const [folder, c] of Object.entries(result.folders)) {
    console.log(
      `${folder}: ${c.copied} copied, ${c.already} already there, ${c.vanished} gone from the source meanwhile`,
    );
  }
  if (result.problems.length > 0) {
    console.error(`${result.problems.length} not copied:\n  ${result.problems.join('\n  ')}`);
    process.exitCode = 1;
    return;
  }
  console.log('Every object is at the destination with the same SHA-256.');
}

main().catch((error: unknown) => {
  const known =
    error instanceof ConfigError || error instanceof StorageUrlError || error instanceof StorageError;
  console.error(known ? error.message : error);
  process.exit(1);
});

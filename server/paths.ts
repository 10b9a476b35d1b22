import path from 'node:path';

/**
 * The repository root, found from this file rather than from the working directory, so migrations and
 * other shipped files are found whether the server is started by `npm start`, a test or a script.
 */
export const repoRoot = path.resolve(__dirname, '..');

export const serverMigrationsDir = path.join(repoRoot, 'drizzle', 'server');

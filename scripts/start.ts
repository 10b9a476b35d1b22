/**
 * `npm start`: builds the web export when it is missing or older than the sources, then starts the
 * server (API + app on one origin). With an empty database the server seeds the demo scenario.
 */
import { buildWeb } from '@/scripts/build-web';
import { startServer } from '@/server/main';

async function main() {
  await buildWeb();
  const { port } = await startServer();
  console.log(`[pivotwatch] ready on http://localhost:${port}`);
}

main().catch((err) => {
  console.error('[pivotwatch] could not start:', err instanceof Error ? err.message : err);
  process.exit(1);
});

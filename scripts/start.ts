/**
 * `npm start`: builds the web export when it is missing or older than the sources, then starts the
 * server (API + app on one origin). It listens on loopback unless HOST says otherwise, and only there (or
 * with SEED_DEMO=1) seeds the demo scenario into an empty database.
 */
import { buildWeb } from '@/scripts/build-web';
import { isLoopbackHost } from '@/server/config';
import { startServer } from '@/server/main';

async function main() {
  await buildWeb();
  const { url, config } = await startServer();
  const reach = isLoopbackHost(config.host)
    ? 'this machine only; README "Running for real" says how to open it to a site network'
    : `listening on ${config.host}`;
  console.log(`[pivotwatch] ready on ${url} (${reach})`);
}

main().catch((err) => {
  console.error('[pivotwatch] could not start:', err instanceof Error ? err.message : err);
  process.exit(1);
});

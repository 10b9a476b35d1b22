/**
 * `npm run bench`: runs every benchmark module in turn and prints plain figures. To add one, export a
 * `run()` from a module in this folder and list it below.
 */
type Bench = { name: string; load: () => Promise<{ run: () => void | Promise<void> }> };

const benches: Bench[] = [
  { name: 'load engine', load: () => import('@/bench/loads') },
  { name: 'free swing', load: () => import('@/bench/free-swing') },
  { name: 'fatigue', load: () => import('@/bench/fatigue') },
  { name: 'measured motion', load: () => import('@/bench/conditioning') },
  { name: 'server ingest', load: () => import('@/bench/ingest') },
  { name: 'review queue', load: () => import('@/bench/review-queue') },
  { name: 'ride cycle over HTTP', load: () => import('@/bench/cycle-http') },
  { name: 'notice PDF', load: () => import('@/bench/notice-pdf') },
  {
    // It builds the web export and drives chromium for minutes, so it runs on its own.
    name: 'web app: bytes per phase, offline reload',
    load: async () => ({
      run: () =>
        console.log('`npm run bench:web` (scripts/bench-web.ts): figures beside the issue #16 goals'),
    }),
  },
];

async function main() {
  console.log(`node ${process.version}, ${process.platform}/${process.arch}, one thread per bench`);
  for (const bench of benches) {
    console.log(`\n== ${bench.name} ==`);
    const mod = await bench.load();
    await mod.run();
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});

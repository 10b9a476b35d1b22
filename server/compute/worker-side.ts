/**
 * The worker thread's half of the pool (pool.ts): says it is ready once its module has loaded, then answers
 * each job in turn. A thrown error goes back as a message; the pool rejects that one job.
 */
import { parentPort } from 'node:worker_threads';

import type { WorkerReply } from '@/server/compute/pool';

export function serveJobs<I, O>(handle: (input: I) => O | Promise<O>): void {
  const port = parentPort;
  if (!port) throw new Error('serveJobs runs only inside a worker thread.');
  port.on('message', async ({ id, input }: { id: number; input: I }) => {
    let reply: WorkerReply<O>;
    try {
      reply = { id, ok: true, output: await handle(input) };
    } catch (error) {
      reply = { id, ok: false, message: error instanceof Error ? error.message : String(error) };
    }
    port.postMessage(reply);
  });
  port.postMessage('ready');
}

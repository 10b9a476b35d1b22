/**
 * The worker thread's half of the pool (pool.ts): says it is ready once its module has loaded, then answers
 * each job in turn. A thrown error goes back as a message; the pool rejects that one job.
 *
 * `transferOf` names the buffers of an answer to move to the main thread rather than copy (a compressed
 * body of a hundred kilobytes, say): they must be whole ArrayBuffers the worker no longer uses.
 */
import { parentPort, type Transferable } from 'node:worker_threads';

import type { WorkerReply } from '@/server/compute/pool';

export function serveJobs<I, O>(
  handle: (input: I) => O | Promise<O>,
  transferOf: (output: O) => Transferable[] = () => [],
): void {
  const port = parentPort;
  if (!port) throw new Error('serveJobs runs only inside a worker thread.');
  port.on('message', async ({ id, input }: { id: number; input: I }) => {
    let reply: WorkerReply<O>;
    let transfer: Transferable[] = [];
    try {
      const output = await handle(input);
      reply = { id, ok: true, output };
      transfer = transferOf(output);
    } catch (error) {
      reply = { id, ok: false, message: error instanceof Error ? error.message : String(error) };
    }
    port.postMessage(reply, transfer);
  });
  port.postMessage('ready');
}

/**
 * The bytes as a Uint8Array over an ArrayBuffer of their own, which can be transferred: a Node Buffer may
 * be a slice of a shared pool (transferring that would take the pool from under every other Buffer), so
 * it is copied once unless it already owns its whole ArrayBuffer.
 */
export function ownBytes(bytes: Uint8Array): Uint8Array<ArrayBuffer> {
  const whole = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength;
  if (whole && bytes.buffer instanceof ArrayBuffer) return new Uint8Array(bytes.buffer);
  return new Uint8Array(bytes);
}

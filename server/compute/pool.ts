/**
 * A small pool of worker threads for work that would otherwise block the event loop (the ride cycle's
 * analysis). Each job gets a time limit counted from the moment a ready worker receives it; a worker that
 * overruns is terminated (the only way to stop synchronous code) and a fresh one takes its place.
 *
 * Workers are TypeScript modules. The server always runs under tsx (`npm start`, `tsx server/main.ts`) or
 * jest (ts-jest), and neither hook reaches a worker thread, so a `.ts` worker is started from a one-line
 * bootstrap that registers tsx's CommonJS hook first. (`execArgv: ['--import', 'tsx']` does not work on
 * Node 20: the worker's entry file is rejected for its extension before the hook is registered.)
 */
import os from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';

/** The job overran its time limit; its worker was stopped. */
export class ComputeTimeoutError extends Error {
  constructor(readonly limitMs: number) {
    super(`The computation took longer than ${limitMs} ms and was stopped.`);
    this.name = 'ComputeTimeoutError';
  }
}

/** Every worker is busy and the waiting line is full. */
export class ComputeBusyError extends Error {
  constructor() {
    super('The server is busy with other computations.');
    this.name = 'ComputeBusyError';
  }
}

/** What a worker module answers for each job (see `serveJobs` in worker-side.ts). */
export type WorkerReply<O> = { id: number; ok: true; output: O } | { id: number; ok: false; message: string };

export type PoolOptions = {
  /** Absolute path of the worker module (`.ts` under tsx/jest, `.js` if ever compiled). */
  file: string;
  /** Worker threads at most; default: one fewer than the cores, at least 1, at most 2. */
  size?: number;
  /** Per-job limit in milliseconds. */
  timeoutMs: number;
  /** Jobs allowed to wait for a worker; beyond it `run` rejects with ComputeBusyError at once. */
  maxQueue?: number;
};

export type WorkerPool<I, O> = {
  run: (input: I) => Promise<O>;
  /** Stops every worker; waiting and running jobs reject. */
  close: () => Promise<void>;
};

type Job<I, O> = { input: I; resolve: (o: O) => void; reject: (e: Error) => void };
type Slot<I, O> = { worker: Worker; ready: boolean; job: Job<I, O> | null; timer?: NodeJS.Timeout };

const repoRoot = path.resolve(__dirname, '..', '..');

function startWorker(file: string): Worker {
  if (!file.endsWith('.ts')) return new Worker(file);
  const hook = require.resolve('tsx/cjs');
  const bootstrap = `require(${JSON.stringify(hook)}); require(${JSON.stringify(file)});`;
  // tsx finds the `@/` alias in the tsconfig named here, whatever directory the server was started from.
  return new Worker(bootstrap, {
    eval: true,
    env: { ...process.env, TSX_TSCONFIG_PATH: path.join(repoRoot, 'tsconfig.json') },
  });
}

export function defaultPoolSize(): number {
  return Math.max(1, Math.min(2, os.availableParallelism() - 1));
}

export function createWorkerPool<I, O>(opts: PoolOptions): WorkerPool<I, O> {
  const size = opts.size ?? defaultPoolSize();
  const maxQueue = opts.maxQueue ?? 8;
  const slots: Slot<I, O>[] = [];
  const queue: Job<I, O>[] = [];
  let nextId = 1;
  let closed = false;

  const retire = (slot: Slot<I, O>, error: Error) => {
    clearTimeout(slot.timer);
    const index = slots.indexOf(slot);
    if (index >= 0) slots.splice(index, 1);
    const job = slot.job;
    slot.job = null;
    job?.reject(error);
    void slot.worker.terminate();
    pump();
  };

  const spawn = (): Slot<I, O> => {
    const slot: Slot<I, O> = { worker: startWorker(opts.file), ready: false, job: null };
    slot.worker.on('message', (message: 'ready' | WorkerReply<O>) => {
      if (message === 'ready') {
        slot.ready = true;
        slot.worker.unref();
        pump();
        return;
      }
      const job = slot.job;
      if (!job) return;
      clearTimeout(slot.timer);
      slot.job = null;
      // An idle worker must not keep the process (or a test run) alive.
      slot.worker.unref();
      if (message.ok) job.resolve(message.output);
      else job.reject(new Error(message.message));
      pump();
    });
    slot.worker.on('error', (error: unknown) =>
      retire(slot, error instanceof Error ? error : new Error(String(error))),
    );
    slot.worker.on('exit', (code) => {
      if (slots.includes(slot)) retire(slot, new Error(`The compute worker stopped (exit code ${code}).`));
    });
    slots.push(slot);
    return slot;
  };

  const dispatch = (slot: Slot<I, O>, job: Job<I, O>) => {
    slot.job = job;
    slot.worker.ref();
    slot.timer = setTimeout(() => retire(slot, new ComputeTimeoutError(opts.timeoutMs)), opts.timeoutMs);
    slot.worker.postMessage({ id: nextId++, input: job.input });
  };

  function pump() {
    if (closed) return;
    while (queue.length > 0) {
      const idle = slots.find((s) => s.ready && s.job === null);
      if (idle) {
        dispatch(idle, queue.shift()!);
        continue;
      }
      // A worker still booting will take the next job when it says it is ready.
      const booting = slots.filter((s) => !s.ready).length;
      if (booting < queue.length && slots.length < size) {
        spawn();
        continue;
      }
      return;
    }
  }

  return {
    run: (input) =>
      new Promise<O>((resolve, reject) => {
        if (closed) {
          reject(new Error('The compute pool is closed.'));
          return;
        }
        const busy = slots.filter((s) => s.job !== null || !s.ready).length;
        if (busy >= size && queue.length >= maxQueue) {
          reject(new ComputeBusyError());
          return;
        }
        queue.push({ input, resolve, reject });
        pump();
      }),
    close: async () => {
      closed = true;
      const waiting = queue.splice(0);
      waiting.forEach((job) => job.reject(new Error('The compute pool is closed.')));
      await Promise.all(
        slots.splice(0).map((slot) => {
          clearTimeout(slot.timer);
          slot.job?.reject(new Error('The compute pool is closed.'));
          return slot.worker.terminate();
        }),
      );
    },
  };
}

// The nester on several worker threads at once (piscina), one seed each, for the CLI and the
// server: the best layout any thread found wins (shared/arrange/portfolio.ts), as in the browser.
import { availableParallelism } from 'node:os';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { ArrangeItem, ArrangeOptions, ArrangeResult, LockedPiece } from '@shared/arrange/nester';
import { ArrangeInputError } from '@shared/arrange/nester';
import { bestOfThreads, betterResult, threadSeed, threadsFor } from '@shared/arrange/portfolio';
import type { ArrangeTask, ArrangeTaskResult } from './thread';

type ParallelRun = {
  /** The best of the threads' answers (of equal ones, the first thread's). */
  done: Promise<ArrangeResult>;
  /** Asks every thread to stop; `done` then answers the best so far. */
  stop: () => void;
};

export const defaultThreads = () => threadsFor(availableParallelism());

export function arrangeInThreads(
  items: ArrangeItem[],
  options: Omit<ArrangeOptions, 'shouldStop' | 'onBest'>,
  locked: LockedPiece[] = [],
  threads = defaultThreads(),
  onBest?: (best: ArrangeResult) => void,
): ParallelRun {
  const pool = new Piscina({
    filename: new URL('./thread-entry.mjs', import.meta.url).href,
    minThreads: threads,
    maxThreads: threads,
    execArgv: [],
  });
  const stop = new SharedArrayBuffer(4);
  let best: ArrangeResult | null = null;
  const offer = (result: ArrangeResult) => {
    if (!best || betterResult(result, best)) {
      best = result;
      onBest?.(result);
    }
  };
  // Progress goes out as it comes; the answer is chosen from every thread's last word in thread order.
  const finals: ArrangeResult[] = [];
  const runs = Array.from({ length: threads }, async (_, k) => {
    const { port1, port2 } = new MessageChannel();
    port1.on('message', offer);
    const task: ArrangeTask = { items, options: { ...options, seed: threadSeed(options.seed ?? 1, k) }, locked, stop, port: port2 };
    try {
      const reply: ArrangeTaskResult = await pool.run(task, { transferList: [port2] });
      if (!reply.ok) throw new ArrangeInputError(reply.message);
      offer(reply.result);
      finals[k] = reply.result;
    } finally {
      port1.close();
    }
  });
  const done = Promise.all(runs)
    .then(() => bestOfThreads(finals))
    .finally(() => pool.destroy());
  return { done, stop: () => Atomics.store(new Int32Array(stop), 0, 1) };
}

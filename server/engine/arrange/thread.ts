// One search in a worker thread: the nester with this thread's seed; a shared flag asks it to stop
// (it then answers the best layout so far) and each new best goes back through a message port.
import type { MessagePort } from 'node:worker_threads';
import type { ArrangeItem, ArrangeOptions, ArrangeResult, LockedPiece } from '@shared/arrange/nester';
import { ArrangeInputError, arrange } from '@shared/arrange/nester';

export type ArrangeTask = {
  items: ArrangeItem[];
  options: Omit<ArrangeOptions, 'shouldStop' | 'onBest'>;
  locked: LockedPiece[];
  stop: SharedArrayBuffer;
  port?: MessagePort;
};
export type ArrangeTaskResult = { ok: true; result: ArrangeResult } | { ok: false; message: string };

export function arrangeTask(task: ArrangeTask): ArrangeTaskResult {
  const flag = new Int32Array(task.stop);
  try {
    const result = arrange(
      task.items,
      { ...task.options, shouldStop: () => Atomics.load(flag, 0) !== 0, onBest: (best) => task.port?.postMessage(best) },
      task.locked,
    );
    return { ok: true, result };
  } catch (error) {
    if (error instanceof ArrangeInputError) return { ok: false, message: error.message };
    throw error;
  } finally {
    task.port?.close();
  }
}

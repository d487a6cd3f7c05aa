import { availableParallelism } from 'node:os';
import { setFlagsFromString } from 'node:v8';
import { Piscina } from 'piscina';
import type { OutlineOptionsInput } from '@shared/schemas/outline';
import { OutlineInputError } from './errors';
import type { OutlineLimits, OutlineResult } from './outline';
import { DEFAULT_LIMITS } from './outline';
import type { RemovalPreview } from './removal-preview';
import type { OutlineTask, OutlineTaskResult } from './worker';

export class OutlinePoolBusyError extends Error {}

/**
 * Threads started from now on begin with a 64 MB old generation (V8 reads the flag when a thread's
 * heap is made). An outline's short-lived objects outlive a few scavenges while sharp works on the
 * pixels, and from V8's small default start nearly every 4 MP outline ended in a full collection:
 * 25 in 45 outlines at 72 ms each, against 3 at 63 ms with 64 MB (4 MP art, one thread).
 */
function roomierThreadHeaps() {
  setFlagsFromString('--initial-heap-size=64');
}

/**
 * A bounded pool of worker threads for outlines, so image work never runs on the thread that
 * answers HTTP requests. One core is left to the API; extra tasks wait in a bounded queue.
 */
export class OutlinePool {
  private readonly piscina: Piscina;

  constructor(
    readonly limits: OutlineLimits = DEFAULT_LIMITS,
    threads = Math.max(1, Math.min(4, availableParallelism() - 1)),
    maxQueue = 64,
  ) {
    roomierThreadHeaps();
    this.piscina = new Piscina({
      filename: new URL('./worker-entry.mjs', import.meta.url).href,
      minThreads: 0,
      maxThreads: threads,
      maxQueue,
      idleTimeout: 60_000,
      execArgv: [],
    });
  }

  /** Threads the pool may use: a worker takes this many outline jobs at once. */
  get size() {
    return this.piscina.options.maxThreads;
  }

  get threads() {
    return this.piscina.threads.length;
  }

  get queued() {
    return this.piscina.queueSize;
  }

  private async task(task: OutlineTask): Promise<Exclude<OutlineTaskResult, { ok: false }>> {
    let reply: OutlineTaskResult;
    try {
      reply = await this.piscina.run(task);
    } catch (error) {
      if (String((error as Error).message).includes('queue is at limit'))
        throw new OutlinePoolBusyError('The outline workers are busy. Try again in a moment.');
      throw error;
    }
    if (!reply.ok) throw new OutlineInputError(reply.code, reply.message);
    return reply;
  }

  /** The original with what background removal takes drawn over it (see removalPreview). */
  async removalPreview(image: Buffer, options: OutlineOptionsInput): Promise<RemovalPreview> {
    const reply = await this.task({ kind: 'removal-preview', image, options, limits: this.limits });
    if (!('preview' in reply)) throw new Error('The outline worker answered a removal preview with something else.');
    const { png } = reply.preview;
    return { ...reply.preview, png: Buffer.from(png.buffer, png.byteOffset, png.byteLength) };
  }

  async run(image: Buffer, options: OutlineOptionsInput): Promise<OutlineResult> {
    const reply = await this.task({ image, options, limits: this.limits });
    if (!('result' in reply)) throw new Error('The outline worker answered an outline with something else.');
    // Buffers come back from the thread as plain Uint8Arrays.
    for (const piece of reply.result.pieces) piece.png = Buffer.from(piece.png.buffer, piece.png.byteOffset, piece.png.byteLength);
    return reply.result;
  }

  close(): Promise<void> {
    return this.piscina.destroy();
  }
}

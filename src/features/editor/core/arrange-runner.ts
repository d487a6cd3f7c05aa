// Runs the nester in several Web Workers at once, one seed each, and keeps the best layout any of
// them has found: progress and "stop" see that best, and the run is done when every worker is, with
// the best of their last answers (of equal ones the first worker's, so a seed repeats).
import type { ArrangeItem, ArrangeOptions, ArrangeProgress, ArrangeResult, LockedPiece } from '@shared/arrange/nester';
import { bestOfThreads, betterResult, threadSeed } from '@shared/arrange/portfolio';

export type RunnerEvents = {
  onProgress: (progress: ArrangeProgress & { threads: number }) => void;
  onDone: (best: ArrangeResult) => void;
  onError: (message: string) => void;
};

export class ArrangeRunner {
  readonly remote = false;
  private workers: Worker[] = [];
  private best: ArrangeResult | null = null;
  private finished = 0;
  private iterations: number[] = [];
  private finals: ArrangeResult[] = [];

  constructor(
    private readonly spawn: () => Worker,
    private readonly threads: number,
  ) {}

  start(request: { items: ArrangeItem[]; options: ArrangeOptions; locked: LockedPiece[] }, events: RunnerEvents) {
    this.stop();
    this.best = null;
    this.finished = 0;
    this.iterations = Array(this.threads).fill(0);
    this.finals = [];
    for (let k = 0; k < this.threads; k++) {
      const worker = this.spawn();
      this.workers.push(worker);
      worker.onmessage = (event) => {
        const message = event.data;
        if (message.type === 'best' || message.type === 'done') this.offer(message.result);
        if (message.type === 'progress') this.iterations[k] = message.progress.iteration;
        if ((message.type === 'progress' || message.type === 'best') && this.best)
          events.onProgress(this.progressOf(message.progress?.elapsedMs ?? this.best.ms));
        if (message.type === 'error') {
          this.stop();
          events.onError(message.message);
        }
        if (message.type === 'done') this.finals[k] = message.result;
        if (message.type === 'done' && ++this.finished === this.threads) {
          this.terminate();
          this.best = bestOfThreads(this.finals);
          events.onDone(this.best);
        }
      };
      worker.onerror = () => {
        this.stop();
        events.onError('Arranging stopped unexpectedly; nothing was changed. Try again, or with fewer pieces.');
      };
      worker.postMessage({ ...request, options: { ...request.options, seed: threadSeed(request.options.seed ?? 1, k) } });
    }
  }

  /** Ends every worker; answers the best layout found so far, if any. */
  stop(): ArrangeResult | null {
    this.terminate();
    return this.best;
  }

  close() {
    this.stop();
  }

  private terminate() {
    for (const w of this.workers) w.terminate();
    this.workers = [];
  }

  private offer(result: ArrangeResult) {
    if (!this.best || betterResult(result, this.best)) this.best = result;
  }

  private progressOf(elapsedMs: number): ArrangeProgress & { threads: number } {
    const b = this.best!;
    return {
      iteration: this.iterations.reduce((s, n) => s + n, 0),
      placed: b.placed,
      elapsedMs,
      sheets: b.sheets,
      areaUsed: b.areaUsed[0] ?? 0,
      length: b.length,
      threads: this.threads,
    };
  }
}

import { describe, expect, it } from 'vitest';
import type { ArrangeResult } from '@shared/arrange/nester';
import { ArrangeRunner } from './arrange-runner';

const result = (placed: number, sheets: number, area: number): ArrangeResult => ({
  placements: [],
  sheets,
  requested: 10,
  placed,
  unplaced: [],
  areaUsed: [area],
  iterations: 1,
  ms: 5,
});

/** A stand-in for a Web Worker: records what it was sent and lets the test answer for it. */
class FakeWorker {
  static made: FakeWorker[] = [];
  onmessage: ((event: { data: unknown }) => void) | null = null;
  onerror: (() => void) | null = null;
  sent: unknown[] = [];
  ended = false;
  constructor() {
    FakeWorker.made.push(this);
  }
  postMessage(message: unknown) {
    this.sent.push(message);
  }
  terminate() {
    this.ended = true;
  }
  say(data: unknown) {
    this.onmessage?.({ data });
  }
}

describe('several arrange workers at once', () => {
  const start = (threads: number) => {
    FakeWorker.made = [];
    const seen: { done?: ArrangeResult; progress: number[]; error?: string } = { progress: [] };
    const runner = new ArrangeRunner(() => new FakeWorker() as unknown as Worker, threads);
    runner.start(
      { items: [], options: { width: 100, height: 100, seed: 5 }, locked: [] },
      { onDone: (r) => (seen.done = r), onProgress: (p) => seen.progress.push(p.placed), onError: (m) => (seen.error = m) },
    );
    return { runner, seen, workers: FakeWorker.made };
  };

  it('gives each worker its own seed and keeps the best layout any of them found', () => {
    const { seen, workers } = start(3);
    const seeds = workers.map((w) => (w.sent[0] as { options: { seed: number } }).options.seed);
    expect(new Set(seeds).size).toBe(3);
    workers[0].say({ type: 'done', result: result(8, 1, 0.5) });
    workers[1].say({ type: 'best', result: result(9, 1, 0.4) });
    expect(seen.done).toBeUndefined(); // two still running
    workers[1].say({ type: 'done', result: result(9, 1, 0.45) });
    workers[2].say({ type: 'done', result: result(9, 2, 0.9) });
    // More pieces first, then fewer sheets, then more of the sheet used.
    expect(seen.done).toEqual(result(9, 1, 0.45));
    expect(workers.every((w) => w.ended)).toBe(true);
  });

  it("of equal layouts answers the first worker's, whichever finished first (a seed repeats)", () => {
    const { seen, workers } = start(2);
    workers[1].say({ type: 'done', result: { ...result(9, 1, 0.45), ms: 7 } });
    workers[0].say({ type: 'done', result: { ...result(9, 1, 0.45), ms: 5 } });
    expect(seen.done?.ms).toBe(5);
  });

  it('stop ends every worker at once and answers the best so far', () => {
    const { runner, workers } = start(2);
    workers[1].say({ type: 'best', result: result(6, 1, 0.3) });
    workers[0].say({ type: 'best', result: result(5, 1, 0.6) });
    expect(runner.stop()).toEqual(result(6, 1, 0.3));
    expect(workers.every((w) => w.ended)).toBe(true);
  });

  it('one worker failing ends the run with its message', () => {
    const { seen, workers } = start(2);
    workers[0].say({ type: 'error', message: 'Moon: its cut line crosses itself.' });
    expect(seen.error).toBe('Moon: its cut line crosses itself.');
    expect(workers.every((w) => w.ended)).toBe(true);
  });
});

import { describe, expect, it } from 'vitest';
import { arrange } from '@shared/arrange/nester';
import { betterResult, threadSeed } from '@shared/arrange/portfolio';
import { esicupItems } from '../../../tests/helpers/arrange-check';
import { arrangeInThreads } from './parallel';

describe('the nester on several worker threads', () => {
  const items = esicupItems('jakobs1', { stripHeight: 200 });
  const options = { width: 200, height: 2000, gap: 0.5, margin: 0, strip: true, timeMs: 60_000, seed: 3 };

  it('answers the best of the threads, each searching with its own seed', async () => {
    const run = arrangeInThreads(items, { ...options, maxIterations: 4 }, [], 2);
    const threaded = await run.done;
    const [a, b] = [0, 1].map((k) => arrange(items, { ...options, maxIterations: 4, seed: threadSeed(3, k) }));
    const best = betterResult(b, a) ? b : a;
    expect(threaded.length).toBe(best.length);
    expect(threaded.placements).toEqual(best.placements);
  }, 120_000);

  it('stops every thread on request and answers the best layout so far', async () => {
    const seen: number[] = [];
    const run = arrangeInThreads(items, options, [], 2, (best) => seen.push(best.length!));
    await new Promise((resolve) => setTimeout(resolve, 1500));
    const stoppedAt = Date.now();
    run.stop();
    const result = await run.done;
    expect(Date.now() - stoppedAt).toBeLessThan(5_000);
    expect(result.placed).toBe(25);
    expect(seen.length).toBeGreaterThan(0);
    expect(result.length).toBeLessThanOrEqual(Math.min(...seen));
  }, 120_000);
});

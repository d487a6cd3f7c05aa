import { describe, expect, it } from 'vitest';
import type { ArrangeResult } from './nester';
import { bestOfThreads } from './portfolio';

const answer = (placed: number, length: number, tag: string) =>
  ({
    placed,
    sheets: 1,
    length,
    areaUsed: [0.5],
    placements: [{ key: tag, x: 0, y: 0, rotation: 0, sheet: 0 }],
  }) as unknown as ArrangeResult;

describe('choosing among the threads', () => {
  it('takes the first thread of equal answers, whatever order they finished in', () => {
    const first = answer(25, 70.25, 'thread 0'),
      second = answer(25, 70.25, 'thread 1');
    expect(bestOfThreads([first, second]).placements[0].key).toBe('thread 0');
    expect(bestOfThreads([first, second, answer(25, 70.25, 'thread 2')]).placements[0].key).toBe('thread 0');
  });

  it('takes a later thread only when it is better: more pieces, then a shorter strip', () => {
    expect(bestOfThreads([answer(25, 70, 'a'), answer(25, 69.9, 'b')]).placements[0].key).toBe('b');
    expect(bestOfThreads([answer(24, 60, 'a'), answer(25, 80, 'b'), answer(25, 80, 'c')]).placements[0].key).toBe('b');
  });
});

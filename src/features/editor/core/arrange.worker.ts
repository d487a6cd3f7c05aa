// Runs the nester off the page's main thread; the page stays responsive and shows progress.
import type { ArrangeItem, ArrangeOptions, LockedPiece } from '@shared/arrange/nester';
import { ArrangeInputError, arrange } from '@shared/arrange/nester';

export type ArrangeRequest = { items: ArrangeItem[]; options: ArrangeOptions; locked: LockedPiece[] };

self.onmessage = (event: MessageEvent<ArrangeRequest>) => {
  const { items, options, locked } = event.data;
  try {
    const result = arrange(items, { ...options, onBest: (best) => self.postMessage({ type: 'best', result: best }) }, locked, (progress) =>
      self.postMessage({ type: 'progress', progress }),
    );
    self.postMessage({ type: 'done', result });
  } catch (error) {
    self.postMessage({ type: 'error', message: error instanceof ArrangeInputError ? error.message : 'Arranging failed.' });
  }
};

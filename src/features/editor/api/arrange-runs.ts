// Auto-arrange on the shop's server: start a run, read its best so far every half second, ask it to
// stop. The same start/stop shape as the Web Worker runner, so the panel treats both alike.
import type { ArrangeItem, ArrangeOptions, ArrangeResult, LockedPiece } from '@shared/arrange/nester';
import type { ArrangeRunView } from '@shared/schemas/arrange';
import { ApiError, api } from '@/lib/api-client';
import type { RunnerEvents } from '../core/arrange-runner';

type RunView = ArrangeRunView & { result: ArrangeResult | null };

export class ServerArrangeRunner {
  readonly remote = true;
  private id: string | null = null;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private ended = false;

  constructor(private readonly base: string) {}

  start(request: { items: ArrangeItem[]; options: ArrangeOptions; locked: LockedPiece[] }, events: RunnerEvents) {
    this.ended = false;
    const { items, options, locked } = request;
    const body = {
      items,
      options: {
        width: options.width,
        height: options.height,
        gap: options.gap ?? 0,
        margin: options.margin ?? 0,
        rotate: options.rotate,
        fill: options.fill,
        timeMs: options.timeMs,
        seed: options.seed,
        maxSheets: options.maxSheets,
      },
      locked,
    };
    const fail = (e: unknown) => {
      this.ended = true;
      // A refused field says more than "some fields need attention".
      events.onError(
        e instanceof ApiError
          ? (Object.values(e.fields)[0] ?? e.message)
          : 'The server could not arrange this sheet; nothing was changed. Try again.',
      );
    };
    api<ArrangeRunView>('POST', this.base, body).then((run) => {
      this.id = run.id;
      const poll = () => {
        if (this.ended) return;
        api<RunView>('GET', `${this.base}/${run.id}`).then((view) => {
          if (this.ended) return;
          if (view.progress) events.onProgress({ iteration: 0, ...view.progress, threads: 0 });
          if (view.state === 'done' && view.result) {
            this.ended = true;
            events.onDone(view.result);
          } else if (view.state === 'failed') {
            this.ended = true;
            events.onError(view.message ?? 'The server could not arrange this sheet; nothing was changed.');
          } else this.timer = setTimeout(poll, 500);
        }, fail);
      };
      poll();
    }, fail);
  }

  /** Asks the server to stop; the run then ends with its best so far (reported through onDone). */
  stop(): ArrangeResult | null {
    if (this.id && !this.ended) void api('POST', `${this.base}/${this.id}/stop`, {}).catch(() => undefined);
    return null;
  }

  /** Stops reading the run (the panel closed). */
  close() {
    this.stop();
    this.ended = true;
    if (this.timer) clearTimeout(this.timer);
  }
}

// Large pixel buffers lent out and taken back, so outline after outline reuses the same memory
// instead of leaving megabytes for the garbage collector each time (an outline made a collection
// per call). A buffer is lent to one user at a time; what is not given back is simply collected.

/** At most this many idle buffers of at most this many bytes in all are kept (a huge sticker's are let go). */
const KEEP = 6;
const KEEP_BYTES = 64 * 1024 * 1024;
const idle: ArrayBuffer[] = [];

/** A buffer of at least `bytes` bytes, not lent to anyone else until given back. Its contents are left over. */
export function borrow(bytes: number): ArrayBuffer {
  let pick = -1;
  for (let i = 0; i < idle.length; i++)
    if (idle[i].byteLength >= bytes && (pick < 0 || idle[i].byteLength < idle[pick].byteLength)) pick = i;
  if (pick < 0) return new ArrayBuffer(bytes);
  return idle.splice(pick, 1)[0];
}

/** Takes buffers back for the next borrower, keeping the smallest within KEEP and KEEP_BYTES. */
export function giveBack(...buffers: ArrayBuffer[]) {
  for (const buffer of buffers) if (!idle.includes(buffer)) idle.push(buffer);
  idle.sort((a, b) => a.byteLength - b.byteLength);
  let bytes = 0,
    kept = 0;
  while (kept < idle.length && kept < KEEP && bytes + idle[kept].byteLength <= KEEP_BYTES) bytes += idle[kept++].byteLength;
  idle.length = kept;
}

/** Buffers borrowed for one piece of work, given back together. */
export class Loans {
  private readonly taken: ArrayBuffer[] = [];

  take(bytes: number): ArrayBuffer {
    const buffer = borrow(bytes);
    this.taken.push(buffer);
    return buffer;
  }

  returnAll() {
    giveBack(...this.taken.splice(0));
  }
}

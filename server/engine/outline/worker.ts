// Runs inside a pool thread: one outline per task. Input problems come back as data, not as a
// thrown error, so their code and message survive the trip between threads.
import { OutlineInputError } from './errors';
import type { OutlineLimits, OutlineResult } from './outline';
import { outline } from './outline';
import type { OutlineOptionsInput } from '../../../shared/schemas/outline';

export type OutlineTask = { image: Uint8Array; options: OutlineOptionsInput; limits: OutlineLimits };
export type OutlineTaskResult =
  | { ok: true; result: OutlineResult }
  | { ok: false; code: OutlineInputError['code']; message: string };

export async function outlineTask(task: OutlineTask): Promise<OutlineTaskResult> {
  try {
    const image = Buffer.from(task.image.buffer, task.image.byteOffset, task.image.byteLength);
    return { ok: true, result: await outline(image, task.options, task.limits) };
  } catch (error) {
    if (error instanceof OutlineInputError) return { ok: false, code: error.code, message: error.message };
    throw error;
  }
}

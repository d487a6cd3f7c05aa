// Runs inside a pool thread: one outline per task. Input problems come back as data, not as a
// thrown error, so their code and message survive the trip between threads.
import { OutlineInputError } from './errors';
import type { OutlineLimits, OutlineResult } from './outline';
import { outline } from './outline';
import type { OutlineOptionsInput } from '@shared/schemas/outline';
import { outlineOptionsSchema } from '@shared/schemas/outline';
import type { RemovalPreview } from './removal-preview';
import { removalPreview } from './removal-preview';

export type OutlineTask =
  | { kind?: 'outline'; image: Uint8Array; options: OutlineOptionsInput; limits: OutlineLimits }
  | { kind: 'removal-preview'; image: Uint8Array; options: OutlineOptionsInput; limits: OutlineLimits };
export type OutlineTaskResult =
  | { ok: true; result: OutlineResult }
  | { ok: true; preview: RemovalPreview }
  | { ok: false; code: OutlineInputError['code']; message: string };

export async function outlineTask(task: OutlineTask): Promise<OutlineTaskResult> {
  try {
    const image = Buffer.from(task.image.buffer, task.image.byteOffset, task.image.byteLength);
    if (task.kind === 'removal-preview')
      return { ok: true, preview: await removalPreview(image, outlineOptionsSchema.parse(task.options), task.limits) };
    return { ok: true, result: await outline(image, task.options, task.limits) };
  } catch (error) {
    if (error instanceof OutlineInputError) return { ok: false, code: error.code, message: error.message };
    throw error;
  }
}

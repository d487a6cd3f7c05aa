import { existsSync } from 'node:fs';
import path from 'node:path';

/**
 * The ESICUP instances in the workplace's shared folder (never copied into the repository): beside
 * the checkout (`../shared/nesting`), or where SHEETSMITH_SHARED_DIR says, or the workplace's own
 * /work/shared for a clone made elsewhere (as when checking a fresh clone in /tmp).
 */
export function nestingDir(): string {
  const candidates = [
    process.env.SHEETSMITH_SHARED_DIR && path.join(process.env.SHEETSMITH_SHARED_DIR, 'nesting'),
    path.resolve('../shared/nesting'),
    '/work/shared/nesting',
  ].filter(Boolean) as string[];
  const found = candidates.find((dir) => existsSync(path.join(dir, 'README.md')));
  if (!found)
    throw new Error(
      `The nesting benchmark instances were not found (looked in ${candidates.join(', ')}); set SHEETSMITH_SHARED_DIR to the shared folder.`,
    );
  return found;
}

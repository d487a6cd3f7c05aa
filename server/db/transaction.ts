import type { DataSource, EntityManager } from 'typeorm';

/** MariaDB errors after which the whole transaction may simply run again. */
const RETRYABLE_ERRNOS = new Set([
  1213, // ER_LOCK_DEADLOCK: InnoDB chose this transaction as the deadlock victim and rolled it back
  1205, // ER_LOCK_WAIT_TIMEOUT: a row lock was not granted within innodb_lock_wait_timeout
]);

function isRetryableTransactionError(error: unknown): boolean {
  const e = error as { errno?: number; driverError?: { errno?: number } };
  return RETRYABLE_ERRNOS.has(e?.errno ?? -1) || RETRYABLE_ERRNOS.has(e?.driverError?.errno ?? -1);
}

/** A unique-key violation of one named key: a concurrent writer committed the same row first. */
export const isDuplicateOf = (key: string) => (error: unknown) => {
  const e = error as { code?: string; message?: string };
  return e?.code === 'ER_DUP_ENTRY' && String(e.message).includes(`'${key}'`);
};

type TransactionOptions = {
  attempts?: number;
  baseDelayMs?: number;
  /** Another error after which running `work` again gives the right answer. */
  retryIf?: (error: unknown) => boolean;
};

/**
 * The one way to run a multi-row write. Runs `work` in a READ COMMITTED transaction (no gap locks
 * on searches, so writes to different sheets or art rarely wait on each other) and runs it again,
 * after a jittered exponential pause, when MariaDB answers deadlock or lock-wait timeout: the
 * server rolled everything back, so a clean retry is safe. `work` must only write through
 * `manager`; anything else it does (content-addressed storage puts) must be safe to repeat.
 */
export async function inTransaction<T>(
  dataSource: DataSource,
  work: (manager: EntityManager) => Promise<T>,
  options: TransactionOptions = {},
): Promise<T> {
  const attempts = options.attempts ?? 6;
  const base = options.baseDelayMs ?? 15;
  for (let attempt = 1; ; attempt++) {
    try {
      return await dataSource.transaction('READ COMMITTED', work);
    } catch (error) {
      if (attempt >= attempts || !(isRetryableTransactionError(error) || options.retryIf?.(error))) throw error;
      // "Full jitter" backoff: a random pause up to base · 2^attempt, so the losers of one
      // deadlock do not collide again in lockstep.
      await new Promise((resolve) => setTimeout(resolve, Math.random() * base * 2 ** attempt));
    }
  }
}

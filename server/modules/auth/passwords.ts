import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import { env } from '../../config/env';
import { AppError } from '../../lib/errors';
import { ERROR_CODES } from '@shared/schemas/api-error';

/**
 * Password hashing and checks run on worker threads, never on the thread that answers requests: a
 * storm of sign-ups must not slow everyone else down. One core is left to the API; extra work waits
 * in a bounded queue and past that the caller is told to try again.
 */
let pool: Piscina | null = null;

function passwordPool(): Piscina {
  pool ??= new Piscina({
    filename: new URL('./password-worker.mjs', import.meta.url).href,
    minThreads: 0,
    maxThreads: Math.max(1, Math.min(4, availableParallelism() - 1)),
    maxQueue: 512,
    idleTimeout: 30_000,
    execArgv: [],
  });
  return pool;
}

async function run<T>(task: object): Promise<T> {
  try {
    return (await passwordPool().run(task)) as T;
  } catch (error) {
    if (String((error as Error).message).includes('queue is at limit')) {
      const busy = new AppError(503, ERROR_CODES.unavailable, 'Sheetsmith is very busy right now. Try again in a moment.');
      busy.retryAfter = 5;
      throw busy;
    }
    throw error;
  }
}

export function hashPassword(password: string): Promise<string> {
  return run<string>({ op: 'hash', password, cost: env.BCRYPT_COST });
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return run<boolean>({ op: 'compare', password, hash });
}

// Compared against when the e-mail is unknown, so a wrong e-mail costs the same time as a wrong
// password and timing does not tell which accounts exist (bcrypt of a throwaway text, cost 12).
const DUMMY_HASH = '$2b$12$I2jjuhjsSrdLpNIFhVbAuuT2Rxn/324yq7ENRKKRTBYM1M3FQZ/GO';
export async function burnPasswordCheck(password: string): Promise<false> {
  await verifyPassword(password, DUMMY_HASH);
  return false;
}

/** How many hashes and checks the worker threads have finished (tests prove the work left this thread). */
export const passwordTasksCompleted = () => pool?.completed ?? 0;

import { useState } from 'react';
import { ApiError } from '../lib/api-client';

/**
 * Runs a user action and keeps its error message for the screen: the server's message, or the
 * first field message when `preferField` (short inline spots). Resolves true when it succeeded.
 */
export function useAction({ preferField = false } = {}) {
  const [error, setError] = useState<string | null>(null);
  const run = async (action: () => Promise<unknown>): Promise<boolean> => {
    setError(null);
    try {
      await action();
      return true;
    } catch (e) {
      setError(e instanceof ApiError ? ((preferField && Object.values(e.fields)[0]) || e.message) : 'That did not work. Try again.');
      return false;
    }
  };
  return { error, run };
}

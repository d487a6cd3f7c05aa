import { useRef, useState } from 'react';
import { ApiError } from '../lib/api-client';

/**
 * Runs a user action and keeps its error message for the screen: the server's message, or the
 * first field message when `preferField` (short inline spots), and every field's message in
 * `fields` for forms that show each beside its input. While an action runs a second one is not
 * started (`busy`), so a double click never sends twice. Resolves true when it succeeded.
 */
export function useAction({ preferField = false } = {}) {
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const running = useRef(false);
  const run = async (action: () => Promise<unknown>): Promise<boolean> => {
    if (running.current) return false;
    running.current = true;
    setBusy(true);
    setError(null);
    setFields({});
    try {
      await action();
      return true;
    } catch (e) {
      setError(e instanceof ApiError ? (preferField && Object.values(e.fields)[0]) || e.message : 'That did not work. Try again.');
      if (e instanceof ApiError) setFields(e.fields);
      return false;
    } finally {
      running.current = false;
      setBusy(false);
    }
  };
  return { error, fields, busy, run };
}

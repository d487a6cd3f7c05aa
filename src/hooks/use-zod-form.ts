import { useRef, useState } from 'react';
import type { FormEvent } from 'react';
import type { z } from 'zod';
import { ApiError } from '../lib/api-client';

type Values = Record<string, string>;

/**
 * Form state validated with a shared zod schema before sending; server field errors are shown
 * the same way. What the user typed is never cleared by an error.
 */
export function useZodForm<S extends z.ZodType>(schema: S, initial: Values) {
  const [values, setValues] = useState<Values>(initial);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const bind = (name: string) => ({
    name,
    value: values[name] ?? '',
    error: fieldErrors[name],
    onChange: (value: string) => {
      setValues((current) => ({ ...current, [name]: value }));
      setFieldErrors(({ [name]: _dropped, ...rest }) => rest);
    },
  });

  // A second submit while the first is still on its way is dropped: a double click sends once.
  const submitting = useRef(false);
  const handleSubmit = (submit: (data: z.output<S>) => Promise<unknown>) => async (event: FormEvent) => {
    event.preventDefault();
    if (submitting.current) return;
    setFormError(null);
    const parsed = schema.safeParse(values);
    if (!parsed.success) {
      const errors: Record<string, string> = {};
      for (const issue of parsed.error.issues) errors[String(issue.path[0] ?? '_')] ??= issue.message;
      setFieldErrors(errors);
      setFormError('Please fix the highlighted fields.');
      return;
    }
    setFieldErrors({});
    submitting.current = true;
    try {
      await submit(parsed.data);
    } catch (error) {
      if (error instanceof ApiError) {
        setFieldErrors(error.fields);
        setFormError(error.message);
      } else {
        setFormError('Something went wrong. Nothing was lost; try again.');
      }
    } finally {
      submitting.current = false;
    }
  };

  return { values, setValues, bind, handleSubmit, fieldErrors, formError, setFormError };
}

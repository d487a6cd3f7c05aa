import { zodResolver } from '@hookform/resolvers/zod';
import { useRef, useState } from 'react';
import type { FormEvent } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { ApiError } from '../lib/api-client';

type Values = Record<string, string>;

/**
 * The forms of plain text fields: react-hook-form holding the values, validated with the shared
 * zod schema before sending (@hookform/resolvers), the server's field errors shown the same way.
 * `bind` gives a field its value, error and change handler (for TextField and friends). What the
 * user typed is never cleared by an error.
 */
export function useZodForm<S extends z.ZodType>(schema: S, initial: Values) {
  const form = useForm<Values, unknown, z.output<S>>({ defaultValues: initial, resolver: zodResolver(schema as never) as never });
  const [formError, setFormError] = useState<string | null>(null);
  const values = form.watch();
  const fieldErrors: Record<string, string> = {};
  for (const [name, error] of Object.entries(form.formState.errors)) if (error?.message) fieldErrors[name] = String(error.message);

  const bind = (name: string) => ({
    name,
    value: values[name] ?? '',
    error: fieldErrors[name],
    onChange: (value: string) => {
      form.setValue(name, value);
      form.clearErrors(name);
    },
  });

  // A second submit while the first is still on its way is dropped: a double click sends once.
  const submitting = useRef(false);
  const handleSubmit = (submit: (data: z.output<S>) => Promise<unknown>) => async (event: FormEvent) => {
    event.preventDefault();
    if (submitting.current) return;
    setFormError(null);
    submitting.current = true;
    try {
      await form.handleSubmit(
        async (data) => {
          try {
            await submit(data);
          } catch (error) {
            if (error instanceof ApiError) {
              for (const [name, message] of Object.entries(error.fields)) form.setError(name, { message });
              setFormError(error.message);
            } else setFormError('Something went wrong. Nothing was lost; try again.');
          }
        },
        () => setFormError('Please fix the highlighted fields.'),
      )();
    } finally {
      submitting.current = false;
    }
  };

  /** Replaces the values (after a send that should empty the form), keeping the form's own state. */
  const setValues = (next: Values) => form.reset(next);

  return { values, setValues, bind, handleSubmit, fieldErrors, formError, setFormError };
}

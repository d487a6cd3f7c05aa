import { z } from 'zod';
import './messages';

/** The one error shape every API route answers with. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});

export const ERROR_CODES = {
  validation: 'validation_failed',
  unauthenticated: 'unauthenticated',
  forbidden: 'forbidden',
  notFound: 'not_found',
  conflict: 'conflict',
  csrf: 'csrf_invalid',
  throttled: 'too_many_attempts',
  badCredentials: 'bad_credentials',
  tokenInvalid: 'token_invalid',
  payloadTooLarge: 'payload_too_large',
  unavailable: 'unavailable',
  internal: 'internal_error',
} as const;

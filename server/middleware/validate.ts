import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import '@shared/schemas/messages';
import { validationError } from '../lib/errors';

type Schemas = { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType };
type Parsed<S extends Schemas> = {
  params: S['params'] extends z.ZodType ? z.output<S['params']> : Record<string, never>;
  query: S['query'] extends z.ZodType ? z.output<S['query']> : Record<string, never>;
  body: S['body'] extends z.ZodType ? z.output<S['body']> : Record<string, never>;
};

/** Turns zod issues into `{ "field.path": "message" }`, first message per field. */
export function fieldMessages(error: z.ZodError, prefix = ''): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || prefix || '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/**
 * Validates params, query and body with shared zod schemas and hands the *parsed* values to the
 * handler, so no handler reads raw input. A returned value is sent as JSON.
 */
export function route<S extends Schemas>(schemas: S, handler: (input: Parsed<S>, req: Request, res: Response) => unknown): RequestHandler {
  return async (req: Request, res: Response, next: NextFunction) => {
    const input: Record<string, unknown> = {};
    let fields: Record<string, string> = {};
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) {
        input[part] = {};
        continue;
      }
      const result = schema.safeParse(req[part] ?? {});
      if (result.success) input[part] = result.data;
      else fields = { ...fields, ...fieldMessages(result.error, part === 'body' ? '' : part) };
    }
    if (Object.keys(fields).length > 0) return next(validationError(fields));
    try {
      const value = await handler(input as Parsed<S>, req, res);
      if (value !== undefined && !res.headersSent) res.json(value);
    } catch (error) {
      next(error);
    }
  };
}

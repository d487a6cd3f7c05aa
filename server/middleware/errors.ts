import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ERROR_CODES } from '../../shared/schemas/api-error';
import { AppError } from '../lib/errors';
import { OutlineInputError } from '../engine/outline/errors';
import { OutlinePoolBusyError } from '../engine/outline/pool';

export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: ERROR_CODES.notFound, message: `No API route ${req.method} ${req.path}.` } });
};

/** One error shape for every failure: `{ error: { code, message, fields? } }`. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return;
  if (err instanceof AppError) {
    if (err.retryAfter) res.set('Retry-After', String(err.retryAfter));
    res.status(err.status).json({ error: { code: err.code, message: err.message, fields: err.fields } });
    return;
  }
  if (err instanceof OutlineInputError) {
    res.status(422).json({ error: { code: 'art_unusable', message: err.message } });
    return;
  }
  if (err instanceof OutlinePoolBusyError) {
    res.set('Retry-After', '5').status(503).json({ error: { code: 'busy', message: err.message } });
    return;
  }
  if (err?.name === 'MulterError' && err.code !== 'LIMIT_FILE_SIZE') {
    res.status(400).json({ error: { code: ERROR_CODES.validation, message: `Upload refused: ${err.message}.` } });
    return;
  }
  // csrf-sync's error
  if (err?.code === 'EBADCSRFTOKEN') {
    res.status(403).json({
      error: { code: ERROR_CODES.csrf, message: 'Your form expired or came from another site. Reload the page and try again.' },
    });
    return;
  }
  // body-parser: malformed JSON or a body over the limit are the client's mistakes, not ours.
  if (err?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: ERROR_CODES.validation, message: 'The request body is not valid JSON.' } });
    return;
  }
  if (err?.type === 'entity.too.large' || err?.code === 'LIMIT_FILE_SIZE') {
    res.status(413).json({ error: { code: ERROR_CODES.payloadTooLarge, message: 'That upload is too large.' } });
    return;
  }
  if (typeof err?.status === 'number' && err.status >= 400 && err.status < 500) {
    res.status(err.status).json({ error: { code: 'bad_request', message: String(err.message ?? 'Bad request') } });
    return;
  }
  console.error(`[sheetsmith] ${req.method} ${req.originalUrl} failed:`, err);
  res.status(500).json({ error: { code: ERROR_CODES.internal, message: 'Something went wrong on our side. Nothing was changed.' } });
};

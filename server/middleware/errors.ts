import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ERROR_CODES } from '@shared/schemas/api-error';
import { AppError } from '../lib/errors';
import { sizeText } from './uploads';
import { OutlineInputError } from '../engine/outline/errors';
import { OutlinePoolBusyError } from '../engine/outline/pool';

// mysql2 and Node socket codes (and MariaDB error numbers) that mean "the database is not there",
// not "the query was wrong": server gone, refused, reset, shutting down, out of connections.
const UNREACHABLE_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENOTFOUND',
  'EPIPE',
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_ENQUEUE_AFTER_FATAL_ERROR',
  'ER_SERVER_SHUTDOWN',
  'ER_CON_COUNT_ERROR',
  'POOL_CLOSED',
]);
const UNREACHABLE_ERRNOS = new Set([1040, 1053, 2002, 2003, 2006, 2013]);

/** Whether an error (or the driver error or cause inside it) says the database cannot be reached. */
function isDatabaseUnreachable(error: unknown, depth = 0): boolean {
  if (!error || typeof error !== 'object' || depth > 4) return false;
  const e = error as { code?: unknown; errno?: unknown; fatal?: unknown; driverError?: unknown; cause?: unknown; errors?: unknown[] };
  if (typeof e.code === 'string' && UNREACHABLE_CODES.has(e.code)) return true;
  if (typeof e.errno === 'number' && UNREACHABLE_ERRNOS.has(e.errno)) return true;
  if (Array.isArray(e.errors) && e.errors.some((inner) => isDatabaseUnreachable(inner, depth + 1))) return true; // AggregateError (IPv4 + IPv6 refused)
  return isDatabaseUnreachable(e.driverError, depth + 1) || isDatabaseUnreachable(e.cause, depth + 1);
}

const DATABASE_RETRY_SECONDS = 5;

export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({
    error: { code: ERROR_CODES.notFound, message: 'Sheetsmith has no such page or action. Check the address, or go back and try again.' },
  });
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
    res
      .set('Retry-After', '5')
      .status(503)
      .json({ error: { code: 'busy', message: err.message } });
    return;
  }
  if (err?.name === 'MulterError' && err.code !== 'LIMIT_FILE_SIZE') {
    res.status(400).json({ error: { code: ERROR_CODES.validation, message: `Upload refused: ${err.message}.` } });
    return;
  }
  if (isDatabaseUnreachable(err)) {
    res
      .set('Retry-After', String(DATABASE_RETRY_SECONDS))
      .status(503)
      .json({
        error: {
          code: ERROR_CODES.unavailable,
          message: 'Sheetsmith cannot reach its database right now. Nothing was changed; try again in a moment.',
        },
      });
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
    const limit = typeof err.limit === 'number' ? `the ${sizeText(err.limit)}` : 'what';
    res.status(413).json({
      error: {
        code: ERROR_CODES.payloadTooLarge,
        message: `That is more than ${limit} one change may carry. Nothing was saved; make the change in smaller steps.`,
      },
    });
    return;
  }
  if (typeof err?.status === 'number' && err.status >= 400 && err.status < 500) {
    // Other client mistakes from body parsing (an aborted body, an unknown charset): logged as they
    // are, answered in words; the library's own text is for us, not the maker.
    (req.log ?? console).warn({ err }, 'request refused before routing');
    res.status(err.status).json({
      error: { code: 'bad_request', message: 'The request could not be read. Reload the page and try again; nothing was changed.' },
    });
    return;
  }
  (req.log ?? console).error({ err }, 'unexpected error');
  res.status(500).json({ error: { code: ERROR_CODES.internal, message: 'Something went wrong on our side. Nothing was changed.' } });
};

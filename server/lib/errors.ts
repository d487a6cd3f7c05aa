import { ERROR_CODES } from '@shared/schemas/api-error';

/** An error a client caused or may see; everything else is answered as a plain 500. */
export class AppError extends Error {
  /** Seconds the client should wait (sent as Retry-After). */
  retryAfter?: number;

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

export const notFound = (what = 'That item') => new AppError(404, ERROR_CODES.notFound, `${what} was not found.`);

export const forbidden = (message = 'Your role in this team does not allow that.') => new AppError(403, ERROR_CODES.forbidden, message);

export const unauthenticated = () => new AppError(401, ERROR_CODES.unauthenticated, 'Please sign in to continue.');

export const validationError = (fields: Record<string, string>, message = 'Some fields need attention.') =>
  new AppError(400, ERROR_CODES.validation, message, fields);

export const conflict = (message: string, fields?: Record<string, string>) => new AppError(409, ERROR_CODES.conflict, message, fields);

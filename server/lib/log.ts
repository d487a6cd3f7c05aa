import { randomUUID } from 'node:crypto';
import type { RequestHandler } from 'express';
import pino from 'pino';
import type { Logger as TypeOrmLogger } from 'typeorm';
import type { Env } from '../config/env';

export type Log = pino.Logger;

/**
 * Structured JSON logs (pino), one line per event. What never goes in: passwords, hashes, tokens,
 * cookies, query parameters and query strings. Errors keep their kind, code and stack; SQL error
 * texts lose their quoted values (a duplicate-key message quotes the e-mail it refused).
 */
export function createLog(env: Pick<Env, 'LOG_LEVEL'>, destination?: pino.DestinationStream): Log {
  return pino(
    {
      level: env.LOG_LEVEL,
      base: { app: 'sheetsmith' },
      timestamp: pino.stdTimeFunctions.isoTime,
      serializers: { err: safeError },
      redact: {
        paths: [
          'password',
          '*.password',
          'passwordHash',
          '*.passwordHash',
          'token',
          '*.token',
          'cookie',
          '*.cookie',
          'headers',
          '*.headers',
        ],
        censor: '[removed]',
      },
    },
    destination,
  );
}

const scrubQuoted = (text: string) => text.replace(/'(?:[^'\\]|\\.)*'/g, "'…'").replace(/\$2[aby]\$\d\d\$[./A-Za-z0-9]{53}/g, '[hash]');

/** An error as it may be logged: no `parameters`, `query` values, driver internals or quoted values. */
function safeError(error: unknown): Record<string, unknown> {
  if (!(error instanceof Error)) return { message: scrubQuoted(String(error)) };
  const e = error as Error & { code?: unknown; errno?: unknown; driverError?: unknown };
  return {
    type: e.name,
    message: scrubQuoted(e.message),
    ...(typeof e.code === 'string' ? { code: e.code } : {}),
    ...(typeof e.errno === 'number' ? { errno: e.errno } : {}),
    stack: e.stack ? scrubQuoted(e.stack) : undefined,
  };
}

// A path segment that looks like a secret (invite and reset tokens are 43 base64url characters).
const TOKEN_SEGMENT = /\/[A-Za-z0-9_-]{20,}(?=\/|$)/g;
const REQUEST_ID = /^[A-Za-z0-9._-]{8,80}$/;

/** Gives each request an id (a proxy's X-Request-Id is kept when well formed) and logs it when it ends. */
export function requestLog(log: Log): RequestHandler {
  return (req, res, next) => {
    const incoming = req.get('x-request-id');
    const id = incoming && REQUEST_ID.test(incoming) ? incoming : randomUUID();
    const started = process.hrtime.bigint();
    req.log = log.child({ reqId: id });
    res.set('X-Request-Id', id);
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      const entry = {
        method: req.method,
        path: req.originalUrl.split('?')[0].replace(TOKEN_SEGMENT, '/:secret'),
        status: res.statusCode,
        ms: Math.round(ms * 10) / 10,
        user: req.user?.id,
      };
      if (res.statusCode >= 500) req.log.error(entry, 'request failed');
      else req.log.info(entry, 'request');
    });
    next();
  };
}

/** TypeORM's log through ours: failed and slow queries with their SQL text only, never their parameters. */
export class QueryLog implements TypeOrmLogger {
  constructor(private readonly out: Log) {}
  logQuery() {}
  logQueryError(error: string | Error, query: string, _parameters?: unknown[]) {
    this.out.warn({ err: typeof error === 'string' ? new Error(error) : error, sql: oneLine(query) }, 'query failed');
  }
  logQuerySlow(time: number, query: string) {
    this.out.warn({ ms: time, sql: oneLine(query) }, 'slow query');
  }
  logSchemaBuild() {}
  logMigration(message: string) {
    this.out.info({ migration: message }, 'migration');
  }
  log(level: 'log' | 'info' | 'warn', message: unknown) {
    if (level === 'warn') this.out.warn({ typeorm: scrubQuoted(String(message)) }, 'database');
  }
}

const oneLine = (sql: string) => scrubQuoted(sql.replace(/\s+/g, ' ').trim()).slice(0, 500);

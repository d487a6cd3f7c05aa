import { createHash } from 'node:crypto';
import type { Pool } from 'mysql2';
import { RateLimiterMySQL, RateLimiterRes } from 'rate-limiter-flexible';
import type { DataSource } from 'typeorm';
import type { MysqlDriver } from 'typeorm/driver/mysql/MysqlDriver.js';
import type { Env } from '../config/env';
import { ERROR_CODES } from '@shared/schemas/api-error';
import { AppError } from './errors';

/**
 * Rate limits kept in MariaDB (the `rate_limits` table, through rate-limiter-flexible's MySQL
 * store), so they hold across every app process on the same database. Keys are hashed: the table
 * never holds an e-mail address or a client address in the clear.
 */
type LimitRule = { points: number; seconds: number; message: string };

type LimitName =
  | 'signUpPerAddress'
  | 'resetPerEmail'
  | 'resetPerAddress'
  | 'invitePerAccount'
  | 'invitePerTeam'
  | 'invitePerRecipient'
  | 'proofPerAddress';

const HOUR = 60 * 60;
const DAY = 24 * HOUR;

export function limitRules(
  env: Pick<Env, 'LIMIT_SIGNUPS_PER_HOUR' | 'LIMIT_RESETS_PER_HOUR' | 'LIMIT_INVITES_PER_HOUR' | 'LIMIT_PROOF_REQUESTS_PER_HOUR'>,
): Record<LimitName, LimitRule> {
  return {
    signUpPerAddress: { points: env.LIMIT_SIGNUPS_PER_HOUR, seconds: HOUR, message: 'Too many new accounts from your network' },
    resetPerEmail: { points: env.LIMIT_RESETS_PER_HOUR, seconds: HOUR, message: 'Too many reset e-mails for that address' },
    resetPerAddress: { points: env.LIMIT_RESETS_PER_HOUR * 5, seconds: HOUR, message: 'Too many reset e-mails from your network' },
    invitePerAccount: { points: env.LIMIT_INVITES_PER_HOUR, seconds: HOUR, message: 'You have sent a lot of invites in the last hour' },
    invitePerTeam: { points: env.LIMIT_INVITES_PER_HOUR * 3, seconds: DAY, message: 'This team has sent a lot of invites today' },
    invitePerRecipient: { points: 3, seconds: DAY, message: 'That address has been invited several times today' },
    // Proof pages need no account: every request from one address counts, so tokens cannot be tried in bulk.
    proofPerAddress: { points: env.LIMIT_PROOF_REQUESTS_PER_HOUR, seconds: HOUR, message: 'Too many proof pages opened from your network' },
  };
}

export const hashedKey = (value: string) => createHash('sha256').update(value.trim().toLowerCase()).digest('base64url').slice(0, 32);

export const waitText = (seconds: number) => {
  const minutes = Math.max(1, Math.ceil(seconds / 60));
  return minutes < 90 ? `about ${minutes} minute${minutes === 1 ? '' : 's'}` : `about ${Math.ceil(minutes / 60)} hours`;
};

/** A limiter over the shared table; `prefix` separates installs (and test runs) sharing one database. */
export function mysqlLimiter(dataSource: DataSource, prefix: string, points: number, seconds: number): RateLimiterMySQL {
  const pool = (dataSource.driver as MysqlDriver).pool as Pool;
  return new RateLimiterMySQL({
    storeClient: pool,
    storeType: 'pool',
    dbName: dataSource.options.database as string,
    tableName: 'rate_limits',
    tableCreated: true, // the migration made it
    keyPrefix: prefix,
    points,
    duration: seconds,
  });
}

export class RateLimits {
  private readonly limiters: Record<LimitName, RateLimiterMySQL>;

  constructor(
    dataSource: DataSource,
    readonly rules: Record<LimitName, LimitRule>,
    prefix = 'ss',
  ) {
    this.limiters = Object.fromEntries(
      Object.entries(rules).map(([name, rule]) => [name, mysqlLimiter(dataSource, `${prefix}:${name}`, rule.points, rule.seconds)]),
    ) as Record<LimitName, RateLimiterMySQL>;
  }

  /**
   * Counts one use against every named limit; throws 429 with the longest wait when any is used up.
   * All are counted first, so trying again while blocked does not reset a window.
   */
  async consume(uses: Partial<Record<LimitName, string>>): Promise<void> {
    const entries = Object.entries(uses) as [LimitName, string][];
    const results = await Promise.all(
      entries.map(([name, key]) =>
        this.limiters[name].consume(hashedKey(key)).then(
          () => null,
          (error: unknown) => {
            if (error instanceof RateLimiterRes) return { name, ms: error.msBeforeNext };
            throw error;
          },
        ),
      ),
    );
    const blocked = results.filter((entry) => entry !== null);
    if (blocked.length === 0) return;
    const worst = blocked.reduce((a, b) => (b.ms > a.ms ? b : a));
    const seconds = Math.max(1, Math.ceil(worst.ms / 1000));
    const error = new AppError(429, ERROR_CODES.throttled, `${this.rules[worst.name].message}. Wait ${waitText(seconds)} and try again.`);
    error.retryAfter = seconds;
    throw error;
  }
}

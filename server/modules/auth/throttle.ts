import type { RateLimiterMySQL } from 'rate-limiter-flexible';
import type { DataSource } from 'typeorm';
import type { Env } from '../../config/env';
import { AppError } from '../../lib/errors';
import { hashedKey, mysqlLimiter, waitText } from '../../lib/rate-limits';
import { ERROR_CODES } from '@shared/schemas/api-error';

/**
 * Counts failed sign-ins per (e-mail, address) and per address. After LOGIN_MAX_FAILURES failures
 * for one e-mail from one address, that pair waits LOGIN_BLOCK_SECONDS; one address gets ten times
 * as many failures across all e-mails. Kept in MariaDB, so every app process sees the same counts.
 */
export class SignInThrottle {
  private readonly perAccount: RateLimiterMySQL;
  private readonly perAddress: RateLimiterMySQL;

  constructor(dataSource: DataSource, env: Pick<Env, 'LOGIN_MAX_FAILURES' | 'LOGIN_BLOCK_SECONDS'>, prefix = 'ss') {
    this.perAccount = mysqlLimiter(dataSource, `${prefix}:signIn`, env.LOGIN_MAX_FAILURES, env.LOGIN_BLOCK_SECONDS);
    this.perAddress = mysqlLimiter(dataSource, `${prefix}:signInAddress`, env.LOGIN_MAX_FAILURES * 10, env.LOGIN_BLOCK_SECONDS);
  }

  /** Throws 429 with the wait in seconds when either counter is used up. */
  async check(email: string, ip: string): Promise<void> {
    const [account, address] = await Promise.all([this.perAccount.get(hashedKey(`${email}|${ip}`)), this.perAddress.get(hashedKey(ip))]);
    const blocked = [
      account && account.consumedPoints >= this.perAccount.points ? account : null,
      address && address.consumedPoints >= this.perAddress.points ? address : null,
    ].filter((entry) => entry !== null);
    if (blocked.length > 0) {
      const seconds = Math.ceil(Math.max(...blocked.map((entry) => entry.msBeforeNext)) / 1000);
      const error = new AppError(
        429,
        ERROR_CODES.throttled,
        `Too many failed sign-ins. Wait ${waitText(seconds)} and try again, or reset your password.`,
      );
      error.retryAfter = seconds;
      throw error;
    }
  }

  async failed(email: string, ip: string): Promise<void> {
    await Promise.all([this.perAccount.penalty(hashedKey(`${email}|${ip}`), 1), this.perAddress.penalty(hashedKey(ip), 1)]);
  }

  async succeeded(email: string, ip: string): Promise<void> {
    await this.perAccount.delete(hashedKey(`${email}|${ip}`));
  }
}

import { RateLimiterMemory } from 'rate-limiter-flexible';
import type { Env } from '../../config/env';
import { AppError } from '../../lib/errors';
import { ERROR_CODES } from '../../../shared/schemas/api-error';

/**
 * Counts failed sign-ins per (e-mail, address) and per address. After LOGIN_MAX_FAILURES failures
 * for one e-mail from one address, that pair waits LOGIN_BLOCK_SECONDS; one address gets ten times
 * as many failures across all e-mails. In memory: one app process serves the API.
 */
export class SignInThrottle {
  private readonly perAccount: RateLimiterMemory;
  private readonly perAddress: RateLimiterMemory;

  constructor(env: Pick<Env, 'LOGIN_MAX_FAILURES' | 'LOGIN_BLOCK_SECONDS'>) {
    this.perAccount = new RateLimiterMemory({ points: env.LOGIN_MAX_FAILURES, duration: env.LOGIN_BLOCK_SECONDS });
    this.perAddress = new RateLimiterMemory({ points: env.LOGIN_MAX_FAILURES * 10, duration: env.LOGIN_BLOCK_SECONDS });
  }

  /** Throws 429 with the wait in seconds when either counter is used up. */
  async check(email: string, ip: string): Promise<void> {
    const [account, address] = await Promise.all([this.perAccount.get(`${email}|${ip}`), this.perAddress.get(ip)]);
    const blocked = [
      account && account.consumedPoints >= this.perAccount.points ? account : null,
      address && address.consumedPoints >= this.perAddress.points ? address : null,
    ].filter((entry) => entry !== null);
    if (blocked.length > 0) {
      const seconds = Math.ceil(Math.max(...blocked.map((entry) => entry.msBeforeNext)) / 1000);
      const minutes = Math.max(1, Math.ceil(seconds / 60));
      const error = new AppError(
        429,
        ERROR_CODES.throttled,
        `Too many failed sign-ins. Wait about ${minutes} minute${minutes === 1 ? '' : 's'} and try again, or reset your password.`,
      );
      error.retryAfter = seconds;
      throw error;
    }
  }

  async failed(email: string, ip: string): Promise<void> {
    await Promise.all([
      this.perAccount.penalty(`${email}|${ip}`, 1),
      this.perAddress.penalty(ip, 1),
    ]);
  }

  async succeeded(email: string, ip: string): Promise<void> {
    await this.perAccount.delete(`${email}|${ip}`);
  }
}

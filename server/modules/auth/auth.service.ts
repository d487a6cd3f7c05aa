import type { DataSource, EntityManager } from 'typeorm';
import { IsNull, MoreThan } from 'typeorm';
import type { Me, SignUpInput } from '@shared/schemas/auth';
import type { Env } from '../../config/env';
import { AppError, conflict } from '../../lib/errors';
import { hashToken, newToken } from '../../lib/tokens';
import type { Mailer } from '../../mail/mailer';
import { passwordResetMail } from '../../mail/templates';
import { ERROR_CODES } from '@shared/schemas/api-error';
import { Membership } from '../accounts/membership.entity';
import { burnPasswordCheck, hashPassword, verifyPassword } from './passwords';
import { PasswordReset } from './password-reset.entity';
import { User } from '../accounts/user.entity';
import { createUserWithTeam } from '../accounts/create-account';
import { inTransaction } from '../../db/transaction';

const RESET_LIFETIME_MS = 60 * 60 * 1000;

export type SessionUser = Express.User;

export const toSessionUser = (user: User): SessionUser => ({
  id: user.id,
  email: user.email,
  name: user.name,
  unit: user.unit,
  sessionEpoch: user.sessionEpoch,
});

/** Accounts the demo seeder made: they sign in only while demo mode is on. */
const isDemoAccount = (user: User) => user.seedKey?.startsWith('demo:') === true;

export const tokenInvalid = (what: string) =>
  new AppError(410, ERROR_CODES.tokenInvalid, `This ${what} link has expired or was already used. Ask for a new one.`);

export class AuthService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly mailer: Mailer,
    private readonly env: Env,
  ) {}

  /** Creates the user, a personal team and the owner membership in one transaction. */
  async signUp(input: SignUpInput): Promise<User> {
    const passwordHash = await hashPassword(input.password);
    try {
      return await inTransaction(this.dataSource, (manager) => createUserWithTeam(manager, input, passwordHash));
    } catch (error) {
      if ((error as { code?: string }).code === 'ER_DUP_ENTRY') {
        throw conflict('An account with that e-mail already exists. Sign in instead.', {
          email: 'An account with that e-mail already exists',
        });
      }
      throw error;
    }
  }

  /** Returns the user for a right e-mail and password, else null (same cost either way). */
  async verifyCredentials(email: string, password: string): Promise<User | null> {
    const user = await this.dataSource.getRepository(User).findOneBy({ email });
    if (!user || (isDemoAccount(user) && !this.env.demoMode)) return burnPasswordCheck(password).then(() => null);
    return (await verifyPassword(password, user.passwordHash)) ? user : null;
  }

  /** The user behind a session, or null when the account is gone or may not sign in now. */
  async findUser(id: string): Promise<User | null> {
    const user = await this.dataSource.getRepository(User).findOneBy({ id });
    return user && !(isDemoAccount(user) && !this.env.demoMode) ? user : null;
  }

  /** Ends every session of the user begun before now; returns the new epoch. */
  async endSessions(userId: string, manager: EntityManager = this.dataSource.manager): Promise<number> {
    await manager.increment(User, { id: userId }, 'sessionEpoch', 1);
    return (await manager.findOneByOrFail(User, { id: userId })).sessionEpoch;
  }

  async me(user: SessionUser, activeTeamId: string | undefined, csrfToken: string): Promise<Me> {
    const memberships = await this.dataSource.getRepository(Membership).find({
      where: { userId: user.id },
      relations: { team: true },
      order: { createdAt: 'ASC' },
    });
    const teams = memberships.map((m) => ({
      teamId: m.teamId,
      teamName: m.team!.name,
      role: m.role,
      personal: m.team!.personal,
    }));
    const active = teams.find((t) => t.teamId === activeTeamId) ?? teams.find((t) => !t.personal) ?? teams[0] ?? null;
    return {
      user: { id: user.id, email: user.email, name: user.name, unit: user.unit },
      teams,
      activeTeamId: active?.teamId ?? null,
      csrfToken,
      sessionLimits: { idleSeconds: this.env.SESSION_IDLE_SECONDS, absoluteSeconds: this.env.SESSION_ABSOLUTE_SECONDS },
    };
  }

  /** Always succeeds from the caller's view, so it never reveals whether an e-mail has an account. */
  async requestPasswordReset(email: string): Promise<void> {
    const user = await this.dataSource.getRepository(User).findOneBy({ email });
    if (!user || (isDemoAccount(user) && !this.env.demoMode)) return;
    const { token, hash } = newToken();
    await this.dataSource.getRepository(PasswordReset).save({
      userId: user.id,
      tokenHash: hash,
      expiresAt: new Date(Date.now() + RESET_LIFETIME_MS),
      usedAt: null,
    });
    await this.mailer.send(passwordResetMail({ to: user.email, name: user.name, link: `${this.env.appUrl}/reset-password/${token}` }));
  }

  async findValidReset(token: string, manager: EntityManager = this.dataSource.manager) {
    return manager.getRepository(PasswordReset).findOne({
      where: { tokenHash: hashToken(token), usedAt: IsNull(), expiresAt: MoreThan(new Date()) },
      relations: { user: true },
    });
  }

  /** Sets the new password and spends the token; a second use finds no valid row. */
  async resetPassword(token: string, password: string): Promise<User> {
    const passwordHash = await hashPassword(password);
    return inTransaction(this.dataSource, async (manager) => {
      const reset = await this.findValidReset(token, manager);
      if (!reset) throw tokenInvalid('password reset');
      // Conditional update: if two requests race, only one flips used_at.
      const spent = await manager
        .createQueryBuilder()
        .update(PasswordReset)
        .set({ usedAt: new Date() })
        .where('id = :id AND used_at IS NULL', { id: reset.id })
        .execute();
      if (spent.affected !== 1) throw tokenInvalid('password reset');
      await manager.update(User, { id: reset.userId }, { passwordHash });
      // Whoever knew the old password is signed out everywhere (ASVS 4.0 §3.3.3).
      await this.endSessions(reset.userId, manager);
      // Any other outstanding reset links for this account stop working too.
      await manager.update(PasswordReset, { userId: reset.userId, usedAt: IsNull() }, { usedAt: new Date() });
      return reset.user!;
    });
  }

  /** Sets a new password and ends every session but the caller's; returns the new epoch. */
  async changePassword(userId: string, current: string, next: string): Promise<number> {
    const user = await this.dataSource.getRepository(User).findOneByOrFail({ id: userId });
    if (!(await verifyPassword(current, user.passwordHash))) {
      throw new AppError(400, ERROR_CODES.validation, 'Your current password is not right.', {
        currentPassword: 'This is not your current password',
      });
    }
    const passwordHash = await hashPassword(next);
    return inTransaction(this.dataSource, async (manager) => {
      await manager.update(User, { id: userId }, { passwordHash });
      return this.endSessions(userId, manager);
    });
  }

  async updateAccount(userId: string, changes: { name?: string; unit?: 'in' | 'mm' }): Promise<User> {
    if (Object.keys(changes).length > 0) await this.dataSource.getRepository(User).update({ id: userId }, changes);
    return this.dataSource.getRepository(User).findOneByOrFail({ id: userId });
  }
}

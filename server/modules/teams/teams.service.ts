import type { DataSource } from 'typeorm';
import { IsNull, MoreThan } from 'typeorm';
import type { Role } from '@shared/permissions';
import { assignableRoles, can } from '@shared/permissions';
import type { CreateInviteInput, InvitePreview, TeamDetail } from '@shared/schemas/team';
import type { Env } from '../../config/env';
import { AppError, conflict, forbidden, notFound } from '../../lib/errors';
import { hashToken, newToken } from '../../lib/tokens';
import type { Mailer } from '../../mail/mailer';
import { inviteMail } from '../../mail/templates';
import { ERROR_CODES } from '@shared/schemas/api-error';
import { createUserWithTeam } from '../accounts/create-account';
import { tokenInvalid } from '../auth/auth.service';
import { hashPassword } from '../auth/passwords';
import { User } from '../accounts/user.entity';
import { Invite } from './invite.entity';
import { Membership } from '../accounts/membership.entity';
import { Team } from '../accounts/team.entity';
import { inTransaction } from '../../db/transaction';

const INVITE_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

import type { Actor } from '@shared/permissions';

export class TeamsService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly mailer: Mailer,
    private readonly env: Env,
  ) {}

  async create(userId: string, name: string): Promise<Team> {
    return inTransaction(this.dataSource, async (manager) => {
      const team = await manager.save(manager.create(Team, { name, personal: false }));
      await manager.save(manager.create(Membership, { teamId: team.id, userId, role: 'owner' }));
      return team;
    });
  }

  async detail(actor: Actor): Promise<TeamDetail> {
    const team = await this.dataSource.getRepository(Team).findOneByOrFail({ id: actor.teamId });
    const members = await this.dataSource.getRepository(Membership).find({
      where: { teamId: actor.teamId },
      relations: { user: true },
      order: { createdAt: 'ASC' },
    });
    const invites = can(actor.role, 'team.members')
      ? await this.dataSource.getRepository(Invite).find({
          where: { teamId: actor.teamId, acceptedAt: IsNull(), revokedAt: IsNull(), expiresAt: MoreThan(new Date()) },
          order: { createdAt: 'DESC' },
        })
      : [];
    return {
      id: team.id,
      name: team.name,
      personal: team.personal,
      role: actor.role,
      members: members.map((m) => ({
        userId: m.userId,
        name: m.user!.name,
        email: m.user!.email,
        role: m.role,
        joinedAt: m.createdAt.toISOString(),
      })),
      invites: invites.map((i) => ({
        id: i.id,
        email: i.email,
        role: i.role,
        expiresAt: i.expiresAt.toISOString(),
        createdAt: i.createdAt.toISOString(),
      })),
    };
  }

  async rename(actor: Actor, name: string): Promise<void> {
    await this.dataSource.getRepository(Team).update({ id: actor.teamId }, { name });
  }

  async remove(actor: Actor): Promise<void> {
    const team = await this.dataSource.getRepository(Team).findOneByOrFail({ id: actor.teamId });
    if (team.personal) throw conflict('A personal studio cannot be deleted.');
    await this.dataSource.getRepository(Team).delete({ id: actor.teamId });
  }

  async invite(actor: Actor, input: CreateInviteInput): Promise<Invite> {
    if (!assignableRoles(actor.role).includes(input.role)) throw forbidden('Only an owner can invite another owner.');
    const existing = await this.dataSource
      .getRepository(Membership)
      .createQueryBuilder('m')
      .innerJoin('m.user', 'u')
      .where('m.team_id = :teamId AND u.email = :email', { teamId: actor.teamId, email: input.email })
      .getCount();
    if (existing > 0) throw conflict('That person is already in this team.', { email: 'Already a member of this team' });
    const { token, hash } = newToken();
    const invite = await this.dataSource.getRepository(Invite).save({
      teamId: actor.teamId,
      email: input.email,
      role: input.role,
      tokenHash: hash,
      invitedById: actor.userId,
      expiresAt: new Date(Date.now() + INVITE_LIFETIME_MS),
      acceptedAt: null,
      revokedAt: null,
    });
    const [team, inviter] = await Promise.all([
      this.dataSource.getRepository(Team).findOneByOrFail({ id: actor.teamId }),
      this.dataSource.getRepository(User).findOneByOrFail({ id: actor.userId }),
    ]);
    await this.mailer.send(
      inviteMail({
        to: input.email,
        teamName: team.name,
        invitedBy: inviter.name,
        role: input.role,
        link: `${this.env.appUrl}/invite/${token}`,
      }),
    );
    return invite;
  }

  async revokeInvite(actor: Actor, inviteId: string): Promise<void> {
    const result = await this.dataSource
      .getRepository(Invite)
      .update({ id: inviteId, teamId: actor.teamId, acceptedAt: IsNull() }, { revokedAt: new Date() });
    if (result.affected !== 1) throw notFound('That invitation');
  }

  async changeRole(actor: Actor, userId: string, role: Role): Promise<void> {
    const repo = this.dataSource.getRepository(Membership);
    const target = await repo.findOneBy({ teamId: actor.teamId, userId });
    if (!target) throw notFound('That member');
    if (userId === actor.userId) throw forbidden('You cannot change your own role. Ask another owner.');
    const allowed = assignableRoles(actor.role);
    if (!allowed.includes(target.role) || !allowed.includes(role)) {
      throw forbidden('Only an owner can change an owner or make someone an owner.');
    }
    await repo.update({ teamId: actor.teamId, userId }, { role });
  }

  async removeMember(actor: Actor, userId: string): Promise<void> {
    const repo = this.dataSource.getRepository(Membership);
    const target = await repo.findOneBy({ teamId: actor.teamId, userId });
    if (!target) throw notFound('That member');
    const leaving = userId === actor.userId;
    if (!leaving) {
      if (!can(actor.role, 'team.members')) throw forbidden();
      if (!assignableRoles(actor.role).includes(target.role)) throw forbidden('Only an owner can remove an owner.');
    }
    if (target.role === 'owner') {
      const owners = await repo.countBy({ teamId: actor.teamId, role: 'owner' });
      if (owners <= 1) throw conflict('A team needs at least one owner. Make someone else owner first.');
    }
    const team = await this.dataSource.getRepository(Team).findOneByOrFail({ id: actor.teamId });
    if (team.personal && leaving) throw conflict('You cannot leave your own personal studio.');
    await repo.delete({ teamId: actor.teamId, userId });
  }

  private async findOpenInvite(token: string) {
    const invite = await this.dataSource.getRepository(Invite).findOne({
      where: { tokenHash: hashToken(token), acceptedAt: IsNull(), revokedAt: IsNull(), expiresAt: MoreThan(new Date()) },
      relations: { team: true, invitedBy: true },
    });
    if (!invite) throw tokenInvalid('invitation');
    return invite;
  }

  async previewInvite(token: string): Promise<InvitePreview> {
    const invite = await this.findOpenInvite(token);
    const accountExists = (await this.dataSource.getRepository(User).countBy({ email: invite.email })) > 0;
    return {
      teamName: invite.team!.name,
      email: invite.email,
      role: invite.role,
      invitedBy: invite.invitedBy!.name,
      accountExists,
      expiresAt: invite.expiresAt.toISOString(),
    };
  }

  /**
   * Accepts an invite once. A signed-in user must be the invited e-mail; a new person gives a name
   * and password and gets an account (with a personal studio) in the same transaction.
   */
  async acceptInvite(
    token: string,
    signedIn: Express.User | undefined,
    newAccount: { name?: string; password?: string },
  ): Promise<{ user: User; teamId: string }> {
    const invite = await this.findOpenInvite(token);
    const existing = await this.dataSource.getRepository(User).findOneBy({ email: invite.email });
    if (signedIn && signedIn.email !== invite.email) {
      throw forbidden(`This invitation is for ${invite.email}. Sign out and accept it with that account.`);
    }
    if (!signedIn && existing) {
      throw new AppError(401, ERROR_CODES.unauthenticated, `Sign in as ${invite.email} to accept this invitation.`);
    }
    if (!signedIn && (!newAccount.name || !newAccount.password)) {
      const fields: Record<string, string> = {};
      if (!newAccount.name) fields.name = 'Enter your name';
      if (!newAccount.password) fields.password = 'Choose a password';
      throw new AppError(400, ERROR_CODES.validation, 'Choose a name and password for your new account.', fields);
    }
    const passwordHash = signedIn ? null : await hashPassword(newAccount.password!);
    return inTransaction(this.dataSource, async (manager) => {
      const spent = await manager
        .createQueryBuilder()
        .update(Invite)
        .set({ acceptedAt: new Date() })
        .where('id = :id AND accepted_at IS NULL AND revoked_at IS NULL', { id: invite.id })
        .execute();
      if (spent.affected !== 1) throw tokenInvalid('invitation');
      const user = existing ?? (await createUserWithTeam(manager, { name: newAccount.name!, email: invite.email }, passwordHash!));
      const already = await manager.findOneBy(Membership, { teamId: invite.teamId, userId: user.id });
      if (!already) await manager.save(manager.create(Membership, { teamId: invite.teamId, userId: user.id, role: invite.role }));
      return { user, teamId: invite.teamId };
    });
  }
}

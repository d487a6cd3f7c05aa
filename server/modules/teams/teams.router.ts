import { Router } from 'express';
import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import { acceptInviteSchema, tokenParamSchema } from '@shared/schemas/auth';
import {
  createInviteSchema,
  createTeamSchema,
  inviteParamsSchema,
  memberParamsSchema,
  teamParamsSchema,
  updateMemberSchema,
  updateTeamSchema,
} from '@shared/schemas/team';
import { actorOf, requirePermission, requireUser, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { AuthService } from '../auth/auth.service';
import { toSessionUser } from '../auth/auth.service';
import type { TeamsService } from './teams.service';
import { signInSession } from '../auth/session-guard';
import type { RateLimits } from '../../lib/rate-limits';

type Deps = {
  dataSource: DataSource;
  teams: TeamsService;
  auth: AuthService;
  limits: RateLimits;
  csrfToken: (req: Request, overwrite?: boolean) => string;
};

export function teamsRouter({ dataSource, teams, auth, limits, csrfToken }: Deps): Router {
  const router = Router();
  const scoped = teamScope(dataSource);

  router.post(
    '/teams',
    requireUser,
    route({ body: createTeamSchema }, async ({ body }, req, res) => {
      const team = await teams.create(req.user!.id, body.name);
      req.session.activeTeamId = team.id;
      res.status(201);
      return auth.me(req.user!, team.id, csrfToken(req));
    }),
  );

  router.get(
    '/teams/:teamId',
    scoped,
    requirePermission('team.view'),
    route({ params: teamParamsSchema }, (_input, req) => teams.detail(actorOf(req))),
  );

  router.patch(
    '/teams/:teamId',
    scoped,
    requirePermission('team.settings'),
    route({ params: teamParamsSchema, body: updateTeamSchema }, async ({ body }, req) => {
      await teams.rename(actorOf(req), body.name);
      return teams.detail(actorOf(req));
    }),
  );

  router.delete(
    '/teams/:teamId',
    scoped,
    requirePermission('team.delete'),
    route({ params: teamParamsSchema }, async (_input, req, res) => {
      await teams.remove(actorOf(req));
      res.status(204).end();
    }),
  );

  router.post(
    '/teams/:teamId/invites',
    scoped,
    requirePermission('team.members'),
    route({ params: teamParamsSchema, body: createInviteSchema }, async ({ body }, req, res) => {
      await limits.consume({ invitePerAccount: req.user!.id, invitePerTeam: req.membership!.teamId, invitePerRecipient: body.email });
      const invite = await teams.invite(actorOf(req), body);
      res.status(201);
      return { id: invite.id, email: invite.email, role: invite.role, expiresAt: invite.expiresAt.toISOString() };
    }),
  );

  router.delete(
    '/teams/:teamId/invites/:inviteId',
    scoped,
    requirePermission('team.members'),
    route({ params: inviteParamsSchema }, async ({ params }, req, res) => {
      await teams.revokeInvite(actorOf(req), params.inviteId);
      res.status(204).end();
    }),
  );

  router.patch(
    '/teams/:teamId/members/:userId',
    scoped,
    requirePermission('team.members'),
    route({ params: memberParamsSchema, body: updateMemberSchema }, async ({ params, body }, req) => {
      await teams.changeRole(actorOf(req), params.userId, body.role);
      return teams.detail(actorOf(req));
    }),
  );

  // Members manage others; anyone may leave (the service tells the two apart).
  router.delete(
    '/teams/:teamId/members/:userId',
    scoped,
    route({ params: memberParamsSchema }, async ({ params }, req, res) => {
      await teams.removeMember(actorOf(req), params.userId);
      res.status(204).end();
    }),
  );

  router.get(
    '/invites/:token',
    route({ params: tokenParamSchema }, ({ params }) => teams.previewInvite(params.token)),
  );

  router.post(
    '/invites/:token/accept',
    route({ params: tokenParamSchema, body: acceptInviteSchema }, async ({ params, body }, req) => {
      const wasSignedIn = Boolean(req.user);
      const { user, teamId } = await teams.acceptInvite(params.token, req.user, body);
      if (!wasSignedIn) await signInSession(req, toSessionUser(user));
      req.session.activeTeamId = teamId;
      return auth.me(toSessionUser(user), teamId, csrfToken(req, !wasSignedIn));
    }),
  );

  return router;
}

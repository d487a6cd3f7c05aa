import type { Log } from '../lib/log';
import type { RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import type { Actor, Permission, Role } from '@shared/permissions';
import type { Request } from 'express';
import { can } from '@shared/permissions';
import { idSchema } from '@shared/schemas/team';
import { forbidden, notFound, unauthenticated } from '../lib/errors';
import { Membership } from '../modules/accounts/membership.entity';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** This request's logger, carrying its id (set first thing by requestLog). */
      log: Log;
    }
    interface User {
      id: string;
      email: string;
      name: string;
      unit: 'in' | 'mm';
      /** The user's session epoch when loaded; a session from an older epoch has ended. */
      sessionEpoch: number;
    }
    interface Request {
      membership?: { teamId: string; role: Role };
    }
  }
}

export const requireUser: RequestHandler = (req, _res, next) => {
  next(req.user ? undefined : unauthenticated());
};

/**
 * Loads the caller's membership of `:teamId`. A team the caller does not belong to answers 404,
 * exactly like a team that does not exist, so other teams' data is never revealed.
 */
export function teamScope(dataSource: DataSource): RequestHandler {
  return async (req, _res, next) => {
    if (!req.user) return next(unauthenticated());
    const teamId = idSchema.safeParse(req.params.teamId);
    if (!teamId.success) return next(notFound('That team'));
    const membership = await dataSource.getRepository(Membership).findOneBy({ teamId: teamId.data, userId: req.user.id });
    if (!membership) return next(notFound('That team'));
    req.membership = { teamId: membership.teamId, role: membership.role };
    next();
  };
}

/** The one place the permission table is enforced on the server. */
export function requirePermission(permission: Permission): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(unauthenticated());
    if (!req.membership) return next(notFound('That team'));
    next(can(req.membership.role, permission) ? undefined : forbidden());
  };
}

/** The signed-in member acting in the request's team (after teamScope). */
export const actorOf = (req: Request): Actor => ({ userId: req.user!.id, teamId: req.membership!.teamId, role: req.membership!.role });

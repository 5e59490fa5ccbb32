import type { Request, RequestHandler } from 'express';
import type { Role } from '../../shared/roles';
import { ForbiddenError, UnauthenticatedError } from '../lib/errors';
import type { SessionUser } from './session-user';

const ROLE_NAMES: Record<Role, string> = { rider: 'riders', moderator: 'moderators', admin: 'admins' };

/** 401 unless someone is signed in. */
export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new UnauthenticatedError();
  next();
};

/** 401 for visitors; 403 unless the person holds at least one of the roles. */
export function requireRole(...roles: Role[]): RequestHandler {
  const who = roles.map((r) => ROLE_NAMES[r]).join(' or ');
  return (req, _res, next) => {
    if (!req.user) throw new UnauthenticatedError();
    if (!roles.some((role) => req.user!.roles.includes(role))) throw new ForbiddenError(`Only ${who} can do this.`);
    next();
  };
}

export function isStaffOf(user: Pick<SessionUser, 'makerIds'> | undefined, makerId: number | null | undefined): boolean {
  return !!user && makerId != null && user.makerIds.includes(makerId);
}

/**
 * 401 for visitors; 403 unless the person is verified staff of the maker of the
 * thing being acted on. getMakerId looks that maker up (throw NotFoundError there
 * when the thing does not exist).
 */
export function requireMakerStaff(
  getMakerId: (req: Request) => number | null | undefined | Promise<number | null | undefined>,
): RequestHandler {
  return async (req, _res, next) => {
    if (!req.user) throw new UnauthenticatedError();
    const makerId = await getMakerId(req);
    if (!isStaffOf(req.user, makerId)) throw new ForbiddenError("Only this maker's verified staff can do this.");
    next();
  };
}

/**
 * Independence rule: staff of a maker may not decide on anything involving that
 * maker's models (even if they are also moderators). Call it in services or
 * handlers with the makers involved.
 */
export function assertIndependentOf(user: Pick<SessionUser, 'makerIds'>, makerIds: Iterable<number>): void {
  for (const makerId of makerIds) {
    if (isStaffOf(user, makerId)) {
      throw new ForbiddenError('You are staff of a maker involved here, so someone independent has to decide.');
    }
  }
}

/** Independence rule: makers' staff may not moderate or change statistics, whatever other roles they hold. */
export const requireNotMakerStaff: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new UnauthenticatedError();
  if (req.user.makerIds.length > 0) throw new ForbiddenError("Makers' staff cannot do this, so that moderation stays independent.");
  next();
};

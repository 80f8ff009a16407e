import type { Request, RequestHandler, Response } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Role } from '@midgray/shared';
import { AppError } from '../errors.ts';

/** The signed-in user as Passport keeps it on req.user. */
export interface SessionUser {
  id: string;
  name: string;
  login: string;
  email: string | null;
  avatarUrl: string | null;
}

declare global {
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

/** The caller's membership of the channel the request is about (set by requireMember). */
export interface ScopedMembership {
  channelId: string;
  userId: string;
  role: Role;
}

/** Returns the signed-in user or throws 401. */
export function currentUser(req: Request): SessionUser {
  if (!req.user) throw new AppError('unauthenticated', 'Sign in to continue');
  return req.user;
}

/** Returns the membership set by requireMember (throws if the route forgot it). */
export function membershipOf(res: Response): ScopedMembership {
  const m = res.locals.membership as ScopedMembership | undefined;
  if (!m) throw new Error('route is missing requireMember');
  return m;
}

/** 401 unless signed in. */
export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(new AppError('unauthenticated', 'Sign in to continue'));
  next();
};

/**
 * How to find the channel of the record a route is about. Either the channel id is a path
 * parameter, or an SQL query maps a path parameter (`:id` named by `param`) to `channel_id`.
 */
export type ChannelScope = { channelParam: string } | { param: string; sql: string };

/** Scope for routes under /channels/:channelId. */
export const byChannelParam: ChannelScope = { channelParam: 'channelId' };

/** Scope for routes about one row of `table` (id in path param `param`). */
export function byRecord(table: 'episodes' | 'gear' | 'invitations' | string, param = 'id'): ChannelScope {
  if (!/^[a-z_]+$/.test(table)) throw new Error(`bad table name ${table}`);
  return { param, sql: `SELECT channel_id FROM ${table} WHERE id = :id` };
}

/**
 * Checks sign-in, membership of the record's channel and role. A record of a channel the caller
 * is not in answers 404 (never 403), so ids of other channels reveal nothing.
 * Run after `validate`, so path ids are known to be well-formed; stores res.locals.membership.
 */
export function requireMember(sequelize: Sequelize, roles: readonly Role[], scope: ChannelScope = byChannelParam, what = 'Record'): RequestHandler {
  return async (req, res, next) => {
    if (!req.user) return next(new AppError('unauthenticated', 'Sign in to continue'));
    const params = (res.locals.input?.params ?? req.params) as Record<string, string>;
    let channelId: string | undefined;
    if ('channelParam' in scope) channelId = params[scope.channelParam];
    else {
      const rows = await sequelize.query<{ channel_id: string }>(scope.sql, { replacements: { id: params[scope.param] }, type: QueryTypes.SELECT });
      channelId = rows[0]?.channel_id;
    }
    if (!channelId) return next(new AppError('not_found', `${what} not found`));
    const rows = await sequelize.query<{ role: Role }>('SELECT role FROM memberships WHERE channel_id = :channelId AND user_id = :userId', {
      replacements: { channelId, userId: req.user.id },
      type: QueryTypes.SELECT,
    });
    const role = rows[0]?.role;
    if (!role) return next(new AppError('not_found', 'channelParam' in scope ? 'Channel not found' : `${what} not found`));
    if (!roles.includes(role)) {
      return next(new AppError('forbidden', `Your role (${role}) cannot do this; it needs ${roles.join(' or ')}`));
    }
    res.locals.membership = { channelId, userId: req.user.id, role } satisfies ScopedMembership;
    next();
  };
}

/** All four roles: any member of the channel. */
export const ANY_ROLE: readonly Role[] = ['host', 'editor', 'producer', 'admin'];

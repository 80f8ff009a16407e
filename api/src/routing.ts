import express, { type RequestHandler } from 'express';
import type { Sequelize } from 'sequelize';
import type { z } from 'zod';
import type { Role } from '@midgray/shared';
import { byChannelParam, requireMember, requireUser, type ChannelScope } from './middleware/auth.ts';
import { validate } from './middleware/validate.ts';

/** Who may call a route: anyone, any signed-in user, or members of the record's channel with these roles. */
export type Access = 'public' | 'user' | readonly Role[];

/** One registered API route, as the route-matrix test reads it. */
export interface RouteInfo {
  method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE' | 'ALL';
  /** Full path under the app, e.g. /api/channels/:channelId/members */
  path: string;
  access: Access;
}

/** How a route is guarded and what it accepts; turned into middleware in a fixed order. */
export interface RouteSpec {
  access: Access;
  /** Where the channel comes from (default: the :channelId path parameter). */
  scope?: ChannelScope;
  /** Name of the record for "… not found" messages. */
  what?: string;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  /** Extra middleware run first (rate limits). */
  before?: RequestHandler[];
}

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

/**
 * A router that records every route with its access rule, so tests can walk them all, and
 * guards each one in the same order: sign-in → path params → channel membership and role →
 * query and body. So a role that may not call a route learns nothing from its validation errors.
 */
export class ApiRoutes {
  readonly router = express.Router();
  readonly list: RouteInfo[] = [];

  constructor(private readonly sequelize: Sequelize) {}

  private add(method: Method, path: string, spec: RouteSpec, handlers: RequestHandler[]) {
    this.list.push({ method: method.toUpperCase() as RouteInfo['method'], path: `/api${path}`, access: spec.access });
    const chain: RequestHandler[] = [...(spec.before ?? [])];
    if (spec.access !== 'public') chain.push(requireUser);
    if (spec.params) chain.push(validate({ params: spec.params }));
    if (Array.isArray(spec.access)) chain.push(requireMember(this.sequelize, spec.access as readonly Role[], spec.scope ?? byChannelParam, spec.what));
    if (spec.query || spec.body) chain.push(validate({ query: spec.query, body: spec.body }));
    this.router[method](path, ...chain, ...handlers);
  }
  get(path: string, spec: RouteSpec, ...h: RequestHandler[]) { this.add('get', path, spec, h); }
  post(path: string, spec: RouteSpec, ...h: RequestHandler[]) { this.add('post', path, spec, h); }
  patch(path: string, spec: RouteSpec, ...h: RequestHandler[]) { this.add('patch', path, spec, h); }
  put(path: string, spec: RouteSpec, ...h: RequestHandler[]) { this.add('put', path, spec, h); }
  delete(path: string, spec: RouteSpec, ...h: RequestHandler[]) { this.add('delete', path, spec, h); }
}

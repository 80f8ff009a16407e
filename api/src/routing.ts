import express, { type RequestHandler } from 'express';
import type { Role } from '@midgray/shared';

/** Who may call a route: anyone, any signed-in user, or members of the record's channel with these roles. */
export type Access = 'public' | 'user' | readonly Role[];

/** One registered API route, as the route-matrix test reads it. */
export interface RouteInfo {
  method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE' | 'ALL';
  /** Full path under the app, e.g. /api/channels/:channelId/members */
  path: string;
  access: Access;
}

type Method = Lowercase<Exclude<RouteInfo['method'], 'ALL'>>;

/**
 * A router that records every route with its access rule, so tests can walk them all.
 * Paths are given relative to /api; `access` is declared beside the handlers that enforce it.
 */
export class ApiRoutes {
  readonly router = express.Router();
  readonly list: RouteInfo[] = [];

  private add(method: Method, path: string, access: Access, handlers: RequestHandler[]) {
    this.list.push({ method: method.toUpperCase() as RouteInfo['method'], path: `/api${path}`, access });
    this.router[method](path, ...handlers);
  }
  get(path: string, access: Access, ...h: RequestHandler[]) { this.add('get', path, access, h); }
  post(path: string, access: Access, ...h: RequestHandler[]) { this.add('post', path, access, h); }
  patch(path: string, access: Access, ...h: RequestHandler[]) { this.add('patch', path, access, h); }
  put(path: string, access: Access, ...h: RequestHandler[]) { this.add('put', path, access, h); }
  delete(path: string, access: Access, ...h: RequestHandler[]) { this.add('delete', path, access, h); }
}

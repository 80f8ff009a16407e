import type { RequestHandler } from 'express';
import type { createPassport } from './passport.ts';
import { QueryTypes, type Sequelize } from 'sequelize';
import { ChannelSettingsSchema, type Me } from '@midgray/shared';
import { currentUser } from '../middleware/auth.ts';
import type { ApiRoutes } from '../routing.ts';
import { SESSION_COOKIE } from './session.ts';

/** Sign-in, sign-out, the current user and the CSRF token. */
export function registerAuthRoutes(routes: ApiRoutes, deps: { passport: ReturnType<typeof createPassport>; sequelize: Sequelize; generateCsrfToken: (req: any) => string; signInLimiter: RequestHandler }) {
  const { passport, sequelize } = deps;

  routes.get('/auth/github', { access: 'public', before: [deps.signInLimiter] }, passport.authenticate('github', { scope: ['user:email'] }));
  routes.get(
    '/auth/github/callback',
    { access: 'public', before: [deps.signInLimiter] },
    passport.authenticate('github', { failureRedirect: '/sign-in?error=provider' }),
    (_req, res) => res.redirect('/'),
  );

  routes.post('/auth/logout', { access: 'user' }, (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((err2) => {
        if (err2) return next(err2);
        res.clearCookie(SESSION_COOKIE);
        res.status(204).end();
      });
    });
  });

  // Public: answers { user: null } when nobody is signed in, so the app can tell without an error.
  routes.get('/auth/me', { access: 'public' }, async (req, res) => {
    if (!req.user) {
      res.json({ user: null, channels: [] } satisfies Me);
      return;
    }
    const user = currentUser(req);
    const rows = await sequelize.query<{ id: string; name: string; time_zone: string; settings: unknown; version: number; role: Me['channels'][number]['role'] }>(
      `SELECT c.id, c.name, c.time_zone, c.settings, c.version, m.role
         FROM memberships m JOIN channels c ON c.id = m.channel_id
        WHERE m.user_id = :userId ORDER BY c.name`,
      { replacements: { userId: user.id }, type: QueryTypes.SELECT },
    );
    const me: Me = {
      user,
      channels: rows.map((r) => ({ id: r.id, name: r.name, timeZone: r.time_zone, settings: ChannelSettingsSchema.parse(r.settings ?? {}), version: r.version, role: r.role })),
    };
    res.json(me);
  });

  // Anyone may fetch a token (the sign-in page needs none, but every write does).
  routes.get('/auth/csrf', { access: 'public' }, (req, res) => {
    res.json({ token: deps.generateCsrfToken(req) });
  });
}

import passport from 'passport';
import { Strategy as GitHubStrategy, type Profile } from 'passport-github2';
import type { Sequelize } from 'sequelize';
import { User } from '@midgray/db';
import type { Env } from '../config/env.ts';
import type { SessionUser } from '../middleware/auth.ts';
import { signInFromProfile } from '../modules/users/users.service.ts';

/** The callback path the provider redirects back to (under the public origin). */
export const OAUTH_CALLBACK_PATH = '/api/auth/github/callback';

/**
 * Returns a fresh Passport instance with the GitHub-style OAuth strategy pointed at the
 * configured endpoints (the local fake by default). One instance per app keeps tests independent.
 */
export function createPassport(env: Env, sequelize: Sequelize) {
  const pp = new passport.Passport();
  pp.use(
    new GitHubStrategy(
      {
        clientID: env.GITHUB_CLIENT_ID,
        clientSecret: env.GITHUB_CLIENT_SECRET,
        callbackURL: new URL(OAUTH_CALLBACK_PATH, env.PUBLIC_URL).toString(),
        authorizationURL: env.OAUTH_AUTHORIZATION_URL!,
        tokenURL: env.OAUTH_TOKEN_URL!,
        userProfileURL: env.OAUTH_USER_PROFILE_URL!,
        userEmailURL: env.OAUTH_USER_EMAIL_URL!,
        scope: ['user:email'],
        state: true,
      } as any,
      ((_accessToken: string, _refreshToken: string, profile: Profile, done: (err: unknown, user?: SessionUser | false) => void) => {
        signInFromProfile(sequelize, {
          provider: 'github',
          providerId: String(profile.id),
          login: profile.username ?? `user${profile.id}`,
          name: profile.displayName || profile.username || 'Unnamed',
          emails: (profile.emails ?? []).map((e) => e.value).filter(Boolean),
          avatarUrl: profile.photos?.[0]?.value ?? null,
        }).then((u) => done(null, u), done);
      }) as any,
    ),
  );
  pp.serializeUser((user, done) => done(null, (user as SessionUser).id));
  pp.deserializeUser((id: string, done) => {
    User.findByPk(id).then(
      (u) => done(null, u ? { id: u.id, name: u.name, login: u.login, email: u.email, avatarUrl: u.avatarUrl } : false),
      done,
    );
  });
  return pp;
}

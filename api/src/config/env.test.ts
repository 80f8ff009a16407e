import { describe, expect, it } from 'vitest';
import { loadEnv } from './env.ts';

const base = { DATABASE_URL: 'postgres://u:p@127.0.0.1:5432/db' };
const production = {
  ...base,
  NODE_ENV: 'production',
  FAKES: 'false',
  SESSION_SECRET: 'a-long-production-secret-value',
  OAUTH_AUTHORIZATION_URL: 'https://signin.example.com/authorize',
  OAUTH_TOKEN_URL: 'https://signin.example.com/token',
  OAUTH_USER_PROFILE_URL: 'https://signin.example.com/user',
  OAUTH_USER_EMAIL_URL: 'https://signin.example.com/user/emails',
  GITHUB_CLIENT_ID: 'client',
  GITHUB_CLIENT_SECRET: 'secret',
  SMTP_HOST: 'mail.example.com',
  SMTP_PORT: '587',
};

describe('loadEnv', () => {
  it('in development fills the sign-in and mail addresses with the local stand-ins', () => {
    const env = loadEnv({ ...base, FAKE_OAUTH_PORT: '4101', FAKE_SMTP_PORT: '2526' });
    expect(env.OAUTH_TOKEN_URL).toBe('http://127.0.0.1:4101/login/oauth/access_token');
    expect(env.SMTP_PORT).toBe(2526);
  });

  it('in production refuses to start until the real provider and mail server are named, listing what is missing', () => {
    expect(loadEnv(production).SMTP_HOST).toBe('mail.example.com');
    const { OAUTH_TOKEN_URL: _t, SMTP_HOST: _h, ...partial } = production;
    expect(() => loadEnv(partial)).toThrow(/in production set OAUTH_TOKEN_URL, SMTP_HOST \(/);
    expect(() => loadEnv({ ...production, FAKES: 'true' })).toThrow(/FAKES must be off/);
    expect(() => loadEnv({ ...production, SESSION_SECRET: undefined })).toThrow(/SESSION_SECRET/);
  });
});

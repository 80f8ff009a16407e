// A small local stand-in for the OAuth 2.0 provider, so sign-in works offline in development and
// tests. It runs the real authorization-code flow the Passport strategy expects:
//   GET  /login/oauth/authorize   → page to pick an account → 302 to redirect_uri?code&state
//   POST /login/oauth/access_token (form or JSON) → { access_token, token_type, scope }
//   GET  /user, GET /user/emails   (Authorization: token|Bearer <access_token>)
// Tests add accounts with POST /_fake/accounts.
import { randomBytes, randomInt } from 'node:crypto';
import type { Server } from 'node:http';
import express from 'express';
import { DEMO_PEOPLE } from '@midgray/db/demo/people';

interface FakeAccount {
  id: string;
  login: string;
  name: string;
  email: string;
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** Builds the fake provider app; `clientId`/`clientSecret` must match the API's settings. */
export function createFakeOAuthApp(opts: { clientId: string; clientSecret: string }) {
  const accounts = new Map<string, FakeAccount>();
  for (const p of DEMO_PEOPLE) accounts.set(p.providerId, { id: p.providerId, login: p.login, name: p.name, email: p.email });
  const codes = new Map<string, { accountId: string; redirectUri: string; expires: number }>();
  const tokens = new Map<string, string>();
  // New accounts get random ids so several fakes (parallel test files) never hand out the same one.
  const newId = () => String(randomInt(100_000_000, 999_999_999));

  const app = express();
  app.disable('x-powered-by');
  app.use(express.urlencoded({ extended: false, limit: '16kb' }));
  app.use(express.json({ limit: '16kb' }));

  const page = (title: string, body: string) => `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1"><title>${esc(title)}</title>
<style>body{font:16px system-ui,sans-serif;background:#f4f4f2;color:#1c1c1a;margin:0;padding:2rem 1rem}
main{max-width:28rem;margin:auto;background:#fff;border:1px solid #d6d6d2;border-radius:10px;padding:1.5rem}
h1{font-size:1.25rem;margin:0 0 .25rem}p{color:#4a4a46;margin:.25rem 0 1rem}
button{display:block;width:100%;text-align:left;padding:.75rem;margin:.5rem 0;border:1px solid #bdbdb8;border-radius:8px;background:#fafaf8;font:inherit;cursor:pointer}
button:focus-visible{outline:3px solid #1f5fbf;outline-offset:2px}small{color:#55554f}
label{display:block;margin:.5rem 0 .2rem}input{width:100%;box-sizing:border-box;padding:.5rem;font:inherit;border:1px solid #8a8a85;border-radius:6px}</style>
</head><body><main>${body}</main></body></html>`;

  app.get('/login/oauth/authorize', (req, res) => {
    const q = req.query as Record<string, string>;
    if (q.client_id !== opts.clientId || !q.redirect_uri) {
      res.status(400).send(page('Unknown application', '<h1>Unknown application</h1><p>client_id or redirect_uri is wrong.</p>'));
      return;
    }
    const hidden = ['redirect_uri', 'state', 'scope'].map((k) => `<input type="hidden" name="${k}" value="${esc(q[k] ?? '')}">`).join('');
    const buttons = [...accounts.values()]
      .map((a) => `<form method="post" action="/login/oauth/authorize">${hidden}<input type="hidden" name="account" value="${esc(a.id)}"><button type="submit"><strong>${esc(a.name)}</strong><br><small>${esc(a.email)}</small></button></form>`)
      .join('');
    res.send(
      page(
        'Local sign-in provider',
        `<h1>Local sign-in provider</h1><p>Development stand-in for the real provider. Pick an account to continue to Midgray.</p>${buttons}
<form method="post" action="/login/oauth/authorize">${hidden}<h2 style="font-size:1rem;margin-top:1.5rem">Or a new account</h2>
<label for="n">Name</label><input id="n" name="name" required maxlength="80"><label for="e">E-mail</label><input id="e" name="email" type="email" required maxlength="254">
<button type="submit" style="margin-top:1rem">Continue as this new account</button></form>`,
      ),
    );
  });

  app.post('/login/oauth/authorize', (req, res) => {
    const b = req.body as Record<string, string>;
    let account = b.account ? accounts.get(b.account) : undefined;
    if (!account && b.name && b.email) {
      const existing = [...accounts.values()].find((a) => a.email.toLowerCase() === b.email.toLowerCase());
      account = existing ?? { id: newId(), login: b.email.split('@')[0], name: b.name.slice(0, 80), email: b.email.slice(0, 254) };
      accounts.set(account.id, account);
    }
    if (!account || !b.redirect_uri) {
      res.status(400).send(page('Sign-in failed', '<h1>Sign-in failed</h1><p>Pick an account.</p>'));
      return;
    }
    const code = randomBytes(16).toString('hex');
    codes.set(code, { accountId: account.id, redirectUri: b.redirect_uri, expires: Date.now() + 60_000 });
    const url = new URL(b.redirect_uri);
    url.searchParams.set('code', code);
    if (b.state) url.searchParams.set('state', b.state);
    res.redirect(302, url.toString());
  });

  app.post('/login/oauth/access_token', (req, res) => {
    const b = req.body as Record<string, string>;
    const entry = codes.get(b.code);
    codes.delete(b.code);
    if (b.client_id !== opts.clientId || b.client_secret !== opts.clientSecret || !entry || entry.expires < Date.now()) {
      res.json({ error: 'bad_verification_code', error_description: 'The code passed is incorrect or expired.' });
      return;
    }
    const token = randomBytes(20).toString('hex');
    tokens.set(token, entry.accountId);
    res.json({ access_token: token, token_type: 'bearer', scope: 'user:email' });
  });

  const accountOf = (req: express.Request) => {
    const m = /^(?:token|bearer)\s+(\S+)$/i.exec(req.headers.authorization ?? '');
    const id = m ? tokens.get(m[1]) : undefined;
    return id ? accounts.get(id) : undefined;
  };
  app.get('/user', (req, res) => {
    const a = accountOf(req);
    if (!a) return void res.status(401).json({ message: 'Bad credentials' });
    res.json({ id: Number(a.id), login: a.login, name: a.name, email: a.email, avatar_url: null });
  });
  app.get('/user/emails', (req, res) => {
    const a = accountOf(req);
    if (!a) return void res.status(401).json({ message: 'Bad credentials' });
    res.json([{ email: a.email, primary: true, verified: true, visibility: 'private' }]);
  });
  app.post('/_fake/accounts', (req, res) => {
    const b = req.body as Partial<FakeAccount>;
    if (!b.name || !b.email) return void res.status(400).json({ message: 'name and email required' });
    const a: FakeAccount = { id: b.id ?? newId(), login: b.login ?? b.email.split('@')[0], name: b.name, email: b.email };
    accounts.set(a.id, a);
    res.status(201).json(a);
  });
  return app;
}

/** Starts the fake provider on 127.0.0.1:`port` (0 = any free port); resolves with the server and its port. */
export function startFakeOAuth(port: number, opts: { clientId: string; clientSecret: string }): Promise<{ server: Server; port: number }> {
  const app = createFakeOAuthApp(opts);
  return new Promise((resolve, reject) => {
    const server = app.listen(port, '127.0.0.1', () => {
      const addr = server.address();
      resolve({ server, port: typeof addr === 'object' && addr ? addr.port : port });
    });
    server.on('error', reject);
  });
}

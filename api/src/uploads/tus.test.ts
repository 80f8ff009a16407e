// The express-session / @tus/server clash: the session middleware wraps res.end(chunk, encoding),
// and the tus server (through srvx) ends responses with res.end(callback).
import express, { type RequestHandler } from 'express';
import session from 'express-session';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { acceptEndCallback } from './tus.ts';

function appWith(extra: RequestHandler[], onEnded: () => void) {
  const app = express();
  // A session that must be saved on every response: the wrapper's writetop/_write path runs.
  app.use(session({ secret: 'test-secret-test-secret', resave: true, saveUninitialized: true, store: new session.MemoryStore() }));
  app.get('/t', ...extra, (_req, res) => {
    res.writeHead(204);
    (res.end as (cb: () => void) => void)(onEnded);
  });
  const errors: unknown[] = [];
  app.use(((err, _req, res, _next) => {
    errors.push(err);
    if (!res.headersSent) res.status(500).end();
    else res.destroy();
  }) as express.ErrorRequestHandler);
  return { app, errors };
}

describe('acceptEndCallback', () => {
  it('without it, res.end(callback) under express-session fails (the reported clash)', async () => {
    let ended = false;
    const { app, errors } = appWith([], () => (ended = true));
    await request(app).get('/t').catch(() => undefined);
    expect(ended).toBe(false);
    expect(String((errors[0] as Error)?.message ?? errors[0])).toMatch(/chunk|argument/i);
  });

  it('with it, the response ends normally and the callback runs once it has finished', async () => {
    let ended = 0;
    const { app, errors } = appWith([acceptEndCallback], () => ended++);
    const res = await request(app).get('/t');
    expect(res.status).toBe(204);
    expect(res.headers['set-cookie']?.[0]).toMatch(/^connect\.sid=/); // the session was still saved
    expect(errors).toEqual([]);
    expect(ended).toBe(1);
  });
});

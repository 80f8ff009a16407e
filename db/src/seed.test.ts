// The demo seed runs on every `npm start`: it must add the demo once, whatever people did to it since.
import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../seeders/demo.ts';
import { createDatabase, migrateUp } from './index.ts';

const base = process.env.DATABASE_URL;
if (!base) throw new Error('DATABASE_URL is not set: run with npm test');
const urlFor = (db: string) => Object.assign(new URL(base), { pathname: `/${db}` }).toString();
const admin = createDatabase(urlFor('postgres'));
const made: string[] = [];

async function freshDatabase() {
  const name = `midgray_seed_${randomUUID().slice(0, 8)}`;
  await admin.query(`CREATE DATABASE "${name}"`);
  made.push(name);
  const db = createDatabase(urlFor(name));
  await migrateUp(db);
  return db;
}
const count = async (db: ReturnType<typeof createDatabase>, sql: string) => Number((await db.query<{ n: string }>(sql, { type: QueryTypes.SELECT }))[0].n);

afterAll(async () => {
  for (const name of made) await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  await admin.close();
});

describe('the demo seed', () => {
  it('adds the demo once, also after the channel was renamed and its admin removed', async () => {
    const db = await freshDatabase();
    expect(await seedDemo(db)).toBe(true);
    const episodes = await count(db, `SELECT count(*) AS n FROM episodes`);
    expect(episodes).toBeGreaterThan(0);
    await db.query(`UPDATE channels SET name = 'Our renamed bench'`);
    await db.query(`DELETE FROM memberships WHERE role = 'admin'`);
    expect(await seedDemo(db)).toBe(false);
    expect(await count(db, `SELECT count(*) AS n FROM channels`)).toBe(1);
    expect(await count(db, `SELECT count(*) AS n FROM episodes`)).toBe(episodes);
    await db.close();
  });

  it('two starts seeding at the same moment add one demo', async () => {
    const db = await freshDatabase();
    const other = createDatabase(urlFor(made.at(-1)!));
    const results = await Promise.all([seedDemo(db), seedDemo(other)]);
    expect(results.sort()).toEqual([false, true]);
    expect(await count(db, `SELECT count(*) AS n FROM channels`)).toBe(1);
    await Promise.all([db.close(), other.close()]);
  });
});

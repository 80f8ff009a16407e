// Migrations only move forward without losing data:
//  1. the previous release's schema (the foundation migration: nothing earlier has shipped) with
//     rows in it, migrated to the latest schema, keeps every row and value;
//  2. a copy of the seeded demo database, migrated again, keeps every row unchanged.
import { randomUUID } from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../seeders/demo.ts';
import { createDatabase, createMigrator, migrateUp } from './index.ts';

const base = process.env.DATABASE_URL;
if (!base) throw new Error('DATABASE_URL is not set: run with npm test');
const urlFor = (db: string) => Object.assign(new URL(base), { pathname: `/${db}` }).toString();
const admin = createDatabase(urlFor('postgres'));
const suffix = randomUUID().slice(0, 8);
const made: string[] = [];
async function freshDb(name: string) {
  const db = `${name}_${suffix}`;
  await admin.query(`CREATE DATABASE "${db}"`);
  made.push(db);
  return db;
}

async function tableChecksums(sequelize: Sequelize, tables?: string[]) {
  const names = tables ?? (await sequelize.query<{ tablename: string }>(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename NOT IN ('session') ORDER BY tablename`, { type: QueryTypes.SELECT })).map((t) => t.tablename);
  const out: Record<string, string> = {};
  for (const t of names) {
    const [r] = await sequelize.query<{ h: string | null; n: string }>(`SELECT md5(string_agg(md5(x::text), '' ORDER BY md5(x::text))) AS h, count(*) AS n FROM "${t}" x`, { type: QueryTypes.SELECT });
    out[t] = `${r.n}:${r.h}`;
  }
  return out;
}

afterAll(async () => {
  for (const db of made) await admin.query(`DROP DATABASE IF EXISTS "${db}" WITH (FORCE)`);
  await admin.close();
});

describe('migrations run forward without loss', () => {
  it('when data written under the previous release schema is migrated to the latest, then every row and value survives', async () => {
    const db = createDatabase(urlFor(await freshDb('midgray_mig_prev')));
    const migrator = createMigrator(db);
    const all = (await migrator.pending()).map((m) => m.name);
    expect(all[0]).toBe('20261202-0001-foundation.ts');
    await migrator.up({ to: all[0] });
    await db.query(`
      INSERT INTO users (id, provider, provider_id, login, name, email) VALUES ('11111111-1111-4111-8111-111111111111', 'github', '77', 'old.user', 'Old User', 'old@crew.test');
      INSERT INTO channels (id, name, time_zone, settings) VALUES ('22222222-2222-4222-8222-222222222222', 'Old Bench', 'Europe/Berlin', '{"snrThresholdDb": 24}');
      INSERT INTO memberships (channel_id, user_id, role) VALUES ('22222222-2222-4222-8222-222222222222', '11111111-1111-4111-8111-111111111111', 'admin');
      INSERT INTO gear (id, channel_id, kind, make, model, source, embargo_at, embargo_zone, due_back_on) VALUES ('33333333-3333-4333-8333-333333333333', '22222222-2222-4222-8222-222222222222', 'body', 'Korvala', 'K1', 'loaner', '2027-01-05T14:00:00Z', 'Europe/Berlin', '2027-01-20');
      INSERT INTO episodes (id, channel_id, title, stage, position, host_id, shoot_date) VALUES ('44444444-4444-4444-8444-444444444444', '22222222-2222-4222-8222-222222222222', 'Old episode', 'shoot', 0, '11111111-1111-4111-8111-111111111111', '2027-01-02');
      INSERT INTO episode_gear (episode_id, gear_id) VALUES ('44444444-4444-4444-8444-444444444444', '33333333-3333-4333-8333-333333333333');
      INSERT INTO activities (channel_id, actor_id, subject_type, subject_id, episode_id, action, from_value, to_value, reason) VALUES ('22222222-2222-4222-8222-222222222222', '11111111-1111-4111-8111-111111111111', 'episode', '44444444-4444-4444-8444-444444444444', '44444444-4444-4444-8444-444444444444', 'episode.moved', 'plan', 'shoot', 'spec sheet complete');
    `);
    const oldTables = ['users', 'channels', 'memberships', 'gear', 'episodes', 'episode_gear', 'activities'];
    const before = await db.query(`SELECT e.title, e.stage, e.shoot_date::text, g.embargo_at, g.embargo_zone, g.due_back_on::text, c.settings, a.reason
       FROM episodes e JOIN episode_gear eg ON eg.episode_id = e.id JOIN gear g ON g.id = eg.gear_id JOIN channels c ON c.id = e.channel_id JOIN activities a ON a.episode_id = e.id`, { type: QueryTypes.SELECT });
    const countsBefore = Object.fromEntries(Object.entries(await tableChecksums(db, oldTables)).map(([k, v]) => [k, v.split(':')[0]]));

    const applied = await migrateUp(db);
    expect(applied).toEqual(all.slice(1));
    const after = await db.query(`SELECT e.title, e.stage, e.shoot_date::text, g.embargo_at, g.embargo_zone, g.due_back_on::text, c.settings, a.reason
       FROM episodes e JOIN episode_gear eg ON eg.episode_id = e.id JOIN gear g ON g.id = eg.gear_id JOIN channels c ON c.id = e.channel_id JOIN activities a ON a.episode_id = e.id`, { type: QueryTypes.SELECT });
    expect(after).toEqual(before);
    const countsAfter = Object.fromEntries(Object.entries(await tableChecksums(db, oldTables)).map(([k, v]) => [k, v.split(':')[0]]));
    expect(countsAfter).toEqual(countsBefore);
    // the old rows work with the new schema: the board query's tables are there
    const [{ n }] = await db.query<{ n: string }>(`SELECT count(*) AS n FROM episodes WHERE archived_at IS NULL`, { type: QueryTypes.SELECT });
    expect(Number(n)).toBe(1);
    await db.close();
  });

  it('when a copy of the seeded demo database is migrated again, then nothing is applied and no row changes', async () => {
    const demoName = await freshDb('midgray_mig_demo');
    const demo = createDatabase(urlFor(demoName));
    await migrateUp(demo);
    await seedDemo(demo);
    const before = await tableChecksums(demo);
    await demo.close();

    const copyName = await freshDb('midgray_mig_copy');
    await admin.query(`DROP DATABASE "${copyName}"`);
    await admin.query(`CREATE DATABASE "${copyName}" TEMPLATE "${demoName}"`);
    const copy = createDatabase(urlFor(copyName));
    expect(await migrateUp(copy)).toEqual([]);
    expect(await tableChecksums(copy)).toEqual(before);
    expect(Number(before.episodes.split(':')[0])).toBeGreaterThan(0);
    // And migrations really run over the demo's rows: the newest two (a column type and an index,
    // whose downs keep every row) step back and forward again, leaving every table as it was.
    const migrator = createMigrator(copy);
    const newest = (await migrator.executed()).slice(-2).map((m) => m.name);
    await migrator.down({ step: 2 });
    expect(await migrateUp(copy)).toEqual(newest);
    expect(await tableChecksums(copy)).toEqual(before);
    const [{ n: indexes }] = await copy.query<{ n: string }>(`SELECT count(*) AS n FROM pg_indexes WHERE indexname = 'spec_sheet_lines_open_idx'`, { type: QueryTypes.SELECT });
    expect(Number(indexes)).toBe(1);
    await copy.close();
  });
});

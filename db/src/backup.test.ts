// Backup and restore round trip: every row of every table comes back, and the uploaded files'
// manifest catches a missing file. Runs against the test PostgreSQL (DATABASE_URL's server).
import { randomUUID } from 'node:crypto';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
// @ts-expect-error plain ESM script without types
import { backup } from '../scripts/backup.mjs';
// @ts-expect-error plain ESM script without types
import { restore } from '../scripts/restore.mjs';
import { seedDemo } from '../seeders/demo.ts';
import { createDatabase, migrateUp } from './index.ts';

const base = process.env.DATABASE_URL;
if (!base) throw new Error('DATABASE_URL is not set: run with npm test');
const dbName = `midgray_backup_${randomUUID().slice(0, 8)}`;
const urlFor = (db: string) => {
  const u = new URL(base);
  u.pathname = `/${db}`;
  return u.toString();
};
const admin = createDatabase(urlFor('postgres'));
const work = mkdtempSync(join(tmpdir(), 'midgray-backup-'));

async function rowCounts(sequelize: Sequelize) {
  const tables = await sequelize.query<{ tablename: string }>(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`, { type: QueryTypes.SELECT });
  const counts: Record<string, number> = {};
  for (const { tablename } of tables) {
    const [r] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM "${tablename}"`, { type: QueryTypes.SELECT });
    counts[tablename] = Number(r.n);
  }
  return counts;
}

afterAll(async () => {
  await admin.query(`DROP DATABASE IF EXISTS "${dbName}" WITH (FORCE)`);
  await admin.close();
  rmSync(work, { recursive: true, force: true });
});

describe('db:backup and db:restore', () => {
  it('when the demo database is backed up, wiped and restored, then every row of every table is back', async () => {
    await admin.query(`CREATE DATABASE "${dbName}"`);
    let db = createDatabase(urlFor(dbName));
    await migrateUp(db);
    await seedDemo(db);
    const before = await rowCounts(db);
    expect(before.episodes).toBeGreaterThan(0);
    expect(before.SequelizeMeta).toBeGreaterThan(0);
    await db.close();

    const storage = join(work, 'storage');
    mkdirSync(join(storage, 'ab'), { recursive: true });
    writeFileSync(join(storage, 'ab', 'clip-0001'), 'not really a clip, but bytes to account for');
    const { manifest } = await backup({ url: urlFor(dbName), outDir: join(work, 'backup'), storageDir: storage });
    expect(manifest.files).toEqual([expect.objectContaining({ path: 'ab/clip-0001', bytes: 43 })]);

    await admin.query(`DROP DATABASE "${dbName}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${dbName}"`);
    const { problems } = await restore({ url: urlFor(dbName), file: join(work, 'backup'), storageDir: storage });
    expect(problems).toEqual([]);

    db = createDatabase(urlFor(dbName));
    expect(await rowCounts(db)).toEqual(before);
    await db.close();
  });

  it('refuses to restore into a database that already has tables', async () => {
    await expect(restore({ url: urlFor(dbName), file: join(work, 'backup'), storageDir: join(work, 'storage') })).rejects.toThrow(/not empty/);
  });

  it('reports uploaded files that are missing after a restore', async () => {
    const other = `${dbName}_b`;
    await admin.query(`CREATE DATABASE "${other}"`);
    try {
      const { problems } = await restore({ url: urlFor(other), file: join(work, 'backup', 'database.dump'), storageDir: join(work, 'empty-storage') });
      expect(problems).toEqual(['missing file ab/clip-0001']);
    } finally {
      await admin.query(`DROP DATABASE "${other}" WITH (FORCE)`);
    }
  });
});

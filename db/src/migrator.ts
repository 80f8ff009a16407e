import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug, type MigrationParams } from 'umzug';

/** Signature of every migration's `up` and `down`: gets Sequelize's QueryInterface as `context`. */
export type MigrationFn = (params: MigrationParams<QueryInterface>) => Promise<void>;

const MIGRATIONS_DIR = join(dirname(fileURLToPath(import.meta.url)), '..', 'migrations');

/** Returns an Umzug migrator over db/migrations/*.ts, recording applied names in `SequelizeMeta`. */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug<QueryInterface>({
    migrations: {
      glob: ['*.ts', { cwd: MIGRATIONS_DIR }],
      resolve: ({ name, path, context }) => ({
        name,
        up: async () => (await import(pathToFileURL(path!).href)).up({ name, path, context }),
        down: async () => (await import(pathToFileURL(path!).href)).down({ name, path, context }),
      }),
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}

/** Applies every pending migration; returns the names applied, in order. */
export async function migrateUp(sequelize: Sequelize): Promise<string[]> {
  const done = await createMigrator(sequelize).up();
  return done.map((m) => m.name);
}

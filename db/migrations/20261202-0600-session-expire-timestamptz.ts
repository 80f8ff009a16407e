import type { MigrationFn } from '../src/migrator.ts';

// The session table came with the session store's own DDL, whose expiry is a plain timestamp;
// every other time in the schema is timestamptz. The store compares it with to_timestamp(…),
// which is timestamptz, so the instant is what matters: converted in the session's time zone,
// the same one it was written in.
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE session ALTER COLUMN expire TYPE timestamptz(6)`);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE session ALTER COLUMN expire TYPE timestamp(6)`);
};

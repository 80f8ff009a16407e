import type { MigrationFn } from '../src/migrator.ts';

// The board (issue #3): the archive page lists a channel's archived episodes newest first, and
// positions inside a board column are never negative (the API keeps them 0…n−1 per column).
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE INDEX episodes_archived_idx ON episodes (channel_id, archived_at DESC) WHERE archived_at IS NOT NULL;
    ALTER TABLE episodes ADD CONSTRAINT episodes_position_not_negative CHECK (position >= 0);
  `);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE episodes DROP CONSTRAINT IF EXISTS episodes_position_not_negative;
    DROP INDEX IF EXISTS episodes_archived_idx;
  `);
};

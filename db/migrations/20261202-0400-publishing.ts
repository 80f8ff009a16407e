import type { MigrationFn } from '../src/migrator.ts';

// Publishing (issue #7): the description parts of an episode with their saved versions, publish
// slots and their approval, the reminders already sent for gear due back, and when a user's
// calendar-feed secret was made (users.calendar_token holds a SHA-256 of the secret, never the secret).
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE descriptions (
      episode_id uuid PRIMARY KEY REFERENCES episodes(id) ON DELETE CASCADE,
      summary text NOT NULL DEFAULT '',
      chapters jsonb NOT NULL DEFAULT '[]' CHECK (jsonb_typeof(chapters) = 'array'),
      gear_links jsonb NOT NULL DEFAULT '[]' CHECK (jsonb_typeof(gear_links) = 'array'),
      disclosure text NOT NULL DEFAULT '',
      version integer NOT NULL DEFAULT 1 CHECK (version >= 1),
      updated_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE description_versions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      episode_id uuid NOT NULL REFERENCES episodes(id) ON DELETE CASCADE,
      version integer NOT NULL,
      snapshot jsonb NOT NULL,
      changed_parts text[] NOT NULL DEFAULT '{}',
      restored_from integer,
      author_id uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (episode_id, version)
    );

    CREATE TABLE publish_slots (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      episode_id uuid NOT NULL REFERENCES episodes(id) ON DELETE CASCADE,
      starts_at timestamptz NOT NULL,
      zone text NOT NULL CHECK (length(zone) BETWEEN 1 AND 64),
      status text NOT NULL DEFAULT 'proposed' CHECK (status IN ('proposed','approved','rejected','superseded')),
      proposal_note text,
      proposed_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      decided_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      decided_at timestamptz,
      comment text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      -- A decision has a time; a superseded slot keeps the decision it had (if any).
      CHECK (status NOT IN ('approved','rejected') OR decided_at IS NOT NULL),
      CHECK (status <> 'proposed' OR decided_at IS NULL)
    );
    -- At most one live slot (proposed or approved) per episode: a new proposal supersedes it.
    CREATE UNIQUE INDEX publish_slots_current_unique ON publish_slots (episode_id) WHERE status IN ('proposed','approved');
    CREATE INDEX publish_slots_episode_idx ON publish_slots (episode_id, created_at DESC);
    CREATE INDEX publish_slots_starts_idx ON publish_slots (starts_at) WHERE status IN ('proposed','approved');

    -- One "due back in 3 days" reminder per gear item and due date, however often the job runs.
    CREATE TABLE gear_due_notices (
      gear_id uuid NOT NULL REFERENCES gear(id) ON DELETE CASCADE,
      due_back_on date NOT NULL,
      sent_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (gear_id, due_back_on)
    );

    ALTER TABLE users ADD COLUMN calendar_token_created_at timestamptz;
    CREATE INDEX gear_due_back_idx ON gear (due_back_on) WHERE due_back_on IS NOT NULL AND archived_at IS NULL;
  `);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP INDEX IF EXISTS gear_due_back_idx;
    ALTER TABLE users DROP COLUMN IF EXISTS calendar_token_created_at;
    DROP TABLE IF EXISTS gear_due_notices, publish_slots, description_versions, descriptions CASCADE;
  `);
};

import type { MigrationFn } from '../src/migrator.ts';

// Foundation schema: people, channels and roles, gear, episodes, the activity log, sessions.
// Written as SQL so constraints (checks, partial unique indexes) are explicit.
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      provider text NOT NULL,
      provider_id text NOT NULL,
      login text NOT NULL,
      name text NOT NULL,
      email text,
      avatar_url text,
      email_opt_outs text[] NOT NULL DEFAULT '{}',
      calendar_token text UNIQUE,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (provider, provider_id)
    );
    CREATE INDEX users_email_idx ON users (lower(email));

    CREATE TABLE channels (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      time_zone text NOT NULL DEFAULT 'UTC',
      settings jsonb NOT NULL DEFAULT '{}',
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE memberships (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      channel_id uuid NOT NULL REFERENCES channels(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      role text NOT NULL CHECK (role IN ('host','editor','producer','admin')),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (channel_id, user_id)
    );
    CREATE INDEX memberships_user_idx ON memberships (user_id);

    CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      channel_id uuid NOT NULL REFERENCES channels(id) ON DELETE CASCADE,
      email text NOT NULL,
      role text NOT NULL CHECK (role IN ('host','editor','producer','admin')),
      invited_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      accepted_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      accepted_at timestamptz,
      revoked_at timestamptz,
      expires_at timestamptz NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX invitations_open_unique ON invitations (channel_id, lower(email))
      WHERE accepted_at IS NULL AND revoked_at IS NULL;
    CREATE INDEX invitations_email_idx ON invitations (lower(email));

    CREATE TABLE gear (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      channel_id uuid NOT NULL REFERENCES channels(id) ON DELETE CASCADE,
      kind text NOT NULL CHECK (kind IN ('body','lens','light','recorder','other')),
      make text NOT NULL,
      model text NOT NULL,
      serial text,
      source text NOT NULL CHECK (source IN ('loaner','rental','owned','purchased')),
      sponsored boolean NOT NULL DEFAULT false,
      received_on date,
      due_back_on date,
      embargo_at timestamptz,
      embargo_zone text,
      notes text NOT NULL DEFAULT '',
      archived_at timestamptz,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((embargo_at IS NULL) = (embargo_zone IS NULL))
    );
    CREATE INDEX gear_channel_idx ON gear (channel_id);

    CREATE TABLE episodes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      channel_id uuid NOT NULL REFERENCES channels(id) ON DELETE CASCADE,
      title text NOT NULL CHECK (length(title) BETWEEN 1 AND 200),
      stage text NOT NULL DEFAULT 'plan' CHECK (stage IN ('plan','shoot','grade','approval','scheduled','live')),
      position integer NOT NULL DEFAULT 0,
      version integer NOT NULL DEFAULT 1,
      host_id uuid REFERENCES users(id) ON DELETE SET NULL,
      editor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      target_publish_week date,
      shoot_date date,
      public_url text,
      archived_at timestamptz,
      created_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX episodes_board_idx ON episodes (channel_id, stage, position) WHERE archived_at IS NULL;

    CREATE TABLE episode_gear (
      episode_id uuid NOT NULL REFERENCES episodes(id) ON DELETE CASCADE,
      gear_id uuid NOT NULL REFERENCES gear(id) ON DELETE CASCADE,
      PRIMARY KEY (episode_id, gear_id)
    );
    CREATE INDEX episode_gear_gear_idx ON episode_gear (gear_id);

    CREATE TABLE activities (
      id bigserial PRIMARY KEY,
      channel_id uuid NOT NULL REFERENCES channels(id) ON DELETE CASCADE,
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      subject_type text NOT NULL,
      subject_id text NOT NULL,
      episode_id uuid REFERENCES episodes(id) ON DELETE CASCADE,
      action text NOT NULL,
      from_value text,
      to_value text,
      reason text,
      details jsonb NOT NULL DEFAULT '{}',
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX activities_episode_idx ON activities (episode_id, created_at DESC);
    CREATE INDEX activities_channel_idx ON activities (channel_id, created_at DESC);

    -- connect-pg-simple's table (its table.sql), created here so migrations own the schema.
    CREATE TABLE session (
      sid varchar NOT NULL COLLATE "default" PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL
    );
    CREATE INDEX "IDX_session_expire" ON session (expire);
  `);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS session, activities, episode_gear, episodes, gear, invitations, memberships, channels, users CASCADE;
  `);
};

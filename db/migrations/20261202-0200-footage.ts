import type { MigrationFn } from '../src/migrator.ts';

// Footage: files uploaded to an episode (camera originals, graded renders, frame grabs) and the
// resumable uploads (tus) they arrive through. `uploads` is the upload server's metadata store:
// one row per upload, written in one statement, so a crash never leaves it half-written; the
// bytes live in the storage folder under the upload's id (the file's size there is the offset).
// Runs after 20261202-0100-test-plans (file names sort): footage may point at a test step.
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE footage (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      channel_id uuid NOT NULL REFERENCES channels(id) ON DELETE CASCADE,
      episode_id uuid NOT NULL REFERENCES episodes(id) ON DELETE CASCADE,
      step_id uuid REFERENCES test_steps(id) ON DELETE SET NULL,
      upload_id text UNIQUE,
      kind text NOT NULL CHECK (kind IN ('camera_original','graded_render','frame_grab')),
      status text NOT NULL DEFAULT 'received' CHECK (status IN ('receiving','received','verified','flagged')),
      uploader_id uuid REFERENCES users(id) ON DELETE SET NULL,
      original_name text NOT NULL CHECK (length(original_name) BETWEEN 1 AND 255),
      -- the container or image format found by sniffing the first bytes (mp4, mov, mxf, …)
      format text NOT NULL,
      size_bytes bigint NOT NULL CHECK (size_bytes >= 0),
      -- relative to the storage folder; never built from a client's input
      storage_key text NOT NULL,
      client_sha256 text CHECK (client_sha256 ~ '^[0-9a-f]{64}$'),
      server_sha256 text CHECK (server_sha256 ~ '^[0-9a-f]{64}$'),
      probe jsonb,
      probe_error text,
      -- null until compared with the spec sheet; [] when everything matched
      spec_mismatches jsonb,
      thumbnail_key text,
      held_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      held_since timestamptz,
      checked_at timestamptz,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX footage_episode_idx ON footage (episode_id, created_at);
    CREATE INDEX footage_channel_idx ON footage (channel_id);

    CREATE TABLE uploads (
      id text PRIMARY KEY CHECK (id ~ '^[0-9a-f]{32}$'),
      owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      channel_id uuid NOT NULL REFERENCES channels(id) ON DELETE CASCADE,
      episode_id uuid NOT NULL REFERENCES episodes(id) ON DELETE CASCADE,
      step_id uuid REFERENCES test_steps(id) ON DELETE SET NULL,
      kind text NOT NULL CHECK (kind IN ('camera_original','graded_render','frame_grab')),
      original_name text NOT NULL CHECK (length(original_name) BETWEEN 1 AND 255),
      "offset" bigint NOT NULL DEFAULT 0 CHECK ("offset" >= 0),
      length bigint NOT NULL CHECK (length >= 0 AND "offset" <= length),
      -- the tus Upload-Metadata as received (after sanitising), echoed on HEAD
      metadata jsonb NOT NULL DEFAULT '{}',
      format text,
      client_sha256 text CHECK (client_sha256 ~ '^[0-9a-f]{64}$'),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz NOT NULL,
      completed_at timestamptz,
      footage_id uuid REFERENCES footage(id) ON DELETE SET NULL
    );
    CREATE INDEX uploads_owner_open_idx ON uploads (owner_id) WHERE completed_at IS NULL;
    CREATE INDEX uploads_episode_open_idx ON uploads (episode_id) WHERE completed_at IS NULL;
    CREATE INDEX uploads_expiry_idx ON uploads (expires_at) WHERE completed_at IS NULL;
  `);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE IF EXISTS uploads, footage CASCADE;`);
};

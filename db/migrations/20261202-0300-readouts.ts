import type { MigrationFn } from '../src/migrator.ts';

// Readouts: measurements of a test step's frame (noise on a region for ISO sweeps, recovery
// against the 0-stop frame for latitude brackets). Every run is a new row: a re-run never
// overwrites an older result, and "the latest" of a step is its newest `done` row of a kind.
// Parameters and the software version travel with the results so two runs can be compared.
// The per-test measuring region is tests.readout_region (created with the test plans).
// Runs after 20261202-0200-footage (file names sort): a readout points at footage.
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE tests ADD COLUMN IF NOT EXISTS readout_region jsonb;

    CREATE TABLE readouts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      channel_id uuid NOT NULL REFERENCES channels(id) ON DELETE CASCADE,
      test_id uuid NOT NULL REFERENCES tests(id) ON DELETE CASCADE,
      step_id uuid NOT NULL REFERENCES test_steps(id) ON DELETE CASCADE,
      -- the frame source; kept as history (null) when the file is deleted later
      footage_id uuid REFERENCES footage(id) ON DELETE SET NULL,
      -- recovery readouts: the 0-stop step's file the frame was compared with
      reference_footage_id uuid REFERENCES footage(id) ON DELETE SET NULL,
      kind text NOT NULL CHECK (kind IN ('noise','recovery')),
      status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued','running','done','failed')),
      -- region, grid, transfer, frame time, stride, thresholds in force when requested
      params jsonb NOT NULL CHECK (jsonb_typeof(params) = 'object'),
      software_version text NOT NULL CHECK (length(software_version) BETWEEN 1 AND 200),
      -- figures (and the per-patch grid) once done
      results jsonb CHECK (results IS NULL OR jsonb_typeof(results) = 'object'),
      -- storage keys (relative to the storage folder) of images the readout wrote
      difference_map_key text,
      frame_key text,
      reference_frame_key text,
      error text,
      requested_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      started_at timestamptz,
      finished_at timestamptz,
      CHECK ((status = 'done') = (results IS NOT NULL)),
      CHECK ((status IN ('done','failed')) = (finished_at IS NOT NULL)),
      CHECK (status <> 'failed' OR error IS NOT NULL)
    );
    CREATE INDEX readouts_step_kind_idx ON readouts (step_id, kind, created_at DESC);
    CREATE INDEX readouts_test_idx ON readouts (test_id, created_at DESC);
    CREATE INDEX readouts_channel_idx ON readouts (channel_id);
  `);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE IF EXISTS readouts CASCADE;`);
};

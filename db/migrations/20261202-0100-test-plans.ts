import type { MigrationFn } from '../src/migrator.ts';

// Test plans: the tests of an episode (ISO sweep, latitude bracket, custom), their steps as planned
// and as shot, the spec-sheet lines of each test, and the lighting on set (circuits and fixtures)
// used for the lighting-load check. Every row carries `version` where people edit it concurrently.
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE tests (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      episode_id uuid NOT NULL REFERENCES episodes(id) ON DELETE CASCADE,
      kind text NOT NULL CHECK (kind IN ('iso_sweep','latitude_bracket','custom')),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      position integer NOT NULL DEFAULT 0,
      -- the generator input (IsoSweepInput / LatitudeBracketInput; {} for custom)
      inputs jsonb NOT NULL DEFAULT '{}',
      -- {x,y,w,h} as fractions of the frame, where readouts are measured
      readout_region jsonb,
      -- planned seconds of recording per step, used by the storage estimate
      seconds_per_step numeric NOT NULL DEFAULT 10 CHECK (seconds_per_step > 0),
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (readout_region IS NULL OR jsonb_typeof(readout_region) = 'object')
    );
    CREATE INDEX tests_episode_idx ON tests (episode_id, position);

    CREATE TABLE test_steps (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      test_id uuid NOT NULL REFERENCES tests(id) ON DELETE CASCADE,
      index integer NOT NULL CHECK (index >= 0),
      label text NOT NULL DEFAULT '',
      iso integer CHECK (iso IS NULL OR iso > 0),
      offset_stops numeric,
      -- settings from the generator (or typed in, for custom tests)
      planned jsonb NOT NULL DEFAULT '{}',
      -- settings as shot
      actual jsonb,
      shot_at timestamptz,
      shot_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      observation text NOT NULL DEFAULT '',
      rating smallint CHECK (rating IS NULL OR rating BETWEEN 1 AND 5),
      planned_seconds numeric NOT NULL DEFAULT 10 CHECK (planned_seconds > 0),
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (test_id, index)
    );

    CREATE TABLE spec_sheet_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      test_id uuid NOT NULL REFERENCES tests(id) ON DELETE CASCADE,
      key text NOT NULL,
      label text NOT NULL CHECK (length(label) BETWEEN 1 AND 120),
      value text NOT NULL DEFAULT '',
      checked boolean NOT NULL DEFAULT false,
      in_description boolean NOT NULL DEFAULT false,
      required boolean NOT NULL DEFAULT false,
      position integer NOT NULL DEFAULT 0,
      custom boolean NOT NULL DEFAULT false,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (test_id, key)
    );
    CREATE INDEX spec_sheet_lines_test_idx ON spec_sheet_lines (test_id, position);

    CREATE TABLE lighting_circuits (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      test_id uuid NOT NULL REFERENCES tests(id) ON DELETE CASCADE,
      label text NOT NULL CHECK (length(label) BETWEEN 1 AND 80),
      volts numeric NOT NULL CHECK (volts > 0),
      breaker_amps numeric NOT NULL CHECK (breaker_amps > 0),
      position integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX lighting_circuits_test_idx ON lighting_circuits (test_id, position);

    CREATE TABLE lighting_fixtures (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      test_id uuid NOT NULL REFERENCES tests(id) ON DELETE CASCADE,
      circuit_id uuid REFERENCES lighting_circuits(id) ON DELETE SET NULL,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 80),
      watts numeric NOT NULL CHECK (watts > 0),
      quantity integer NOT NULL DEFAULT 1 CHECK (quantity >= 1),
      position integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX lighting_fixtures_test_idx ON lighting_fixtures (test_id, position);
  `);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS lighting_fixtures, lighting_circuits, spec_sheet_lines, test_steps, tests CASCADE;
  `);
};

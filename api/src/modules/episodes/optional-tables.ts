/**
 * Which tables of later features exist in this database, and with which columns.
 *
 * Why: the board and the stage rules read facts owned by other features (tests and spec-sheet
 * lines, footage, descriptions and publish slots). Each lands with its own migration. Probing once
 * lets moves and the board work before a table exists (its facts count as "not there yet") and
 * pick it up when it does, without a query per table per request. Migrations run before the
 * server starts, so one probe per Sequelize instance (per process) is enough; a schema change
 * while the process runs needs a restart, as any deploy does.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

/** The tables and columns the board and the stage rules may read. */
const WANTED: Record<string, readonly string[]> = {
  tests: ['id', 'episode_id', 'name', 'position'],
  spec_sheet_lines: ['test_id', 'label', 'value', 'required', 'checked', 'position'],
  footage: ['episode_id', 'kind', 'status', 'deleted_at'],
  publish_slots: ['episode_id', 'starts_at', 'zone', 'status'],
  descriptions: ['episode_id', 'summary', 'chapters', 'gear_links', 'disclosure'],
};

/** What the probe found: `has('footage', 'kind')` is true when that column exists. */
export interface OptionalTables {
  has(table: string, ...columns: string[]): boolean;
}

const probes = new WeakMap<Sequelize, Promise<OptionalTables>>();

async function probe(sequelize: Sequelize, transaction?: Transaction): Promise<OptionalTables> {
  const rows = await sequelize.query<{ table_name: string; column_name: string }>(
    `SELECT table_name, column_name FROM information_schema.columns
      WHERE table_schema = current_schema() AND table_name IN (:tables)`,
    { replacements: { tables: Object.keys(WANTED) }, type: QueryTypes.SELECT, transaction },
  );
  const found = new Map<string, Set<string>>();
  for (const r of rows) {
    if (!found.has(r.table_name)) found.set(r.table_name, new Set());
    found.get(r.table_name)!.add(r.column_name);
  }
  return {
    has: (table, ...columns) => {
      const cols = found.get(table);
      return !!cols && columns.every((c) => cols.has(c));
    },
  };
}

/**
 * The optional tables of `sequelize`'s database, probed once (a failed probe is retried next call).
 * Pass the caller's transaction when there is one, so the probe never waits for a second connection.
 */
export function optionalTables(sequelize: Sequelize, transaction?: Transaction): Promise<OptionalTables> {
  let p = probes.get(sequelize);
  if (!p) {
    p = probe(sequelize, transaction);
    probes.set(sequelize, p);
    p.catch(() => probes.delete(sequelize));
  }
  return p;
}

/** Forgets the probe (tests that create or drop optional tables call this). */
export function forgetOptionalTables(sequelize: Sequelize): void {
  probes.delete(sequelize);
}

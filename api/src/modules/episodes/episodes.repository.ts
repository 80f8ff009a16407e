/**
 * SQL for the board, the episode page and stage moves. Every read here is ONE statement whatever
 * the number of episodes: counts come from aggregated subqueries joined once, never a query per
 * card. Facts owned by later features are read only when their tables exist (optional-tables.ts).
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { lockUntilCommit } from '@midgray/db';
import { STAGES, type ActivityEntry, type ArchivedEpisode, type BoardQuery, type BoardSlot, type Stage, type StageFacts } from '@midgray/shared';
import { optionalTables, type OptionalTables } from './optional-tables.ts';

/** The Sequelize instance a transaction belongs to (set at runtime, missing from Sequelize's types). */
const dbOf = (transaction: Transaction) => (transaction as unknown as { sequelize: Sequelize }).sequelize;

/** ISO-8601 UTC text of a timestamptz column, e.g. 2026-05-02T13:00:00.000Z (stable in JSON). */
const iso = (col: string) => `to_char(${col} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

const STAGE_ORDER = `array_position(ARRAY[${STAGES.map((s) => `'${s}'`).join(',')}]::text[], e.stage)`;

/** A spec-sheet line is open until it has a value and is ticked as checked on set. */
// Keep in step with the partial index spec_sheet_lines_open_idx (migration 0500), which serves this count.
const OPEN_LINE = `(btrim(l.value) = '' OR NOT l.checked)`;

function footageFilter(t: OptionalTables): string {
  return t.has('footage', 'deleted_at') ? 'AND f.deleted_at IS NULL' : '';
}

/**
 * Per-card aggregates as LATERAL subqueries on the card's own rows: gear ids, footage count, open
 * spec-sheet lines and the live publish slots. Each follows an index on episode_id (test_id for
 * the lines), so the cost grows with this channel's cards, not with every channel's rows; and it
 * is still one statement. Optional tables that do not exist yet give NULL counts and no slots.
 */
function cardAggregates(t: OptionalTables): { joins: string[]; fields: string[] } {
  const joins = [`LEFT JOIN LATERAL (SELECT COALESCE(json_agg(x.gear_id ORDER BY x.gear_id), '[]'::json) AS ids FROM episode_gear x WHERE x.episode_id = e.id) eg ON true`];
  const fields = [`'gearIds', eg.ids`];
  if (t.has('footage', 'episode_id')) {
    joins.push(`LEFT JOIN LATERAL (SELECT count(*)::int AS n FROM footage f WHERE f.episode_id = e.id ${footageFilter(t)}) fc ON true`);
    fields.push(`'footageCount', fc.n`);
  } else fields.push(`'footageCount', NULL`);
  if (t.has('tests', 'id', 'episode_id') && t.has('spec_sheet_lines', 'test_id', 'value', 'checked')) {
    joins.push(`LEFT JOIN LATERAL (SELECT count(*)::int AS n FROM tests t JOIN spec_sheet_lines l ON l.test_id = t.id WHERE t.episode_id = e.id AND ${OPEN_LINE}) sl ON true`);
    fields.push(`'openSpecLines', sl.n`);
  } else fields.push(`'openSpecLines', NULL`);
  if (hasSlotTable(t)) {
    joins.push(`LEFT JOIN LATERAL (SELECT ${slotsJsonAgg(t, 'e.id')} AS slots) ps ON true`);
    fields.push(`'slots', ps.slots`);
  } else fields.push(`'slots', '[]'::json`);
  return { joins, fields };
}

/**
 * The publish-slot plug: a JSON array of the episode's live slots (proposed or approved) from
 * issue 7's `publish_slots`, or '[]' while that table does not exist. Date flags and the next key
 * date read slots from here on the board and the episode page.
 */
function slotsJsonAgg(t: OptionalTables, episodeIdSql: string): string {
  if (!hasSlotTable(t)) return `'[]'::json`;
  return `COALESCE((SELECT json_agg(${SLOT_JSON} ORDER BY p.starts_at)
                      FROM publish_slots p WHERE p.episode_id = ${episodeIdSql} AND p.status IN ('proposed','approved')), '[]'::json)`;
}

const hasSlotTable = (t: OptionalTables) => t.has('publish_slots', 'episode_id', 'starts_at', 'zone', 'status');
const SLOT_JSON = `json_build_object('startsAt', ${iso('p.starts_at')}, 'zone', p.zone, 'status', p.status)`;

/** A search word with `%`, `_` and the backslash taken literally in a LIKE pattern (ESCAPE backslash). */
const likeLiteral = (word: string) => word.replace(/[\\%_]/g, (c) => `\\${c}`);

/**
 * The WHERE conditions of the board's filters, with their replacements. `me` is the caller (for
 * "mine"). Every search word must appear in the title, in any case.
 */
function boardFilters(query: BoardQuery, me: string): { sql: string; replacements: Record<string, unknown> } {
  const parts: string[] = [];
  const replacements: Record<string, unknown> = {};
  query.q
    .split(' ')
    .filter(Boolean)
    .forEach((word, i) => {
      parts.push(`e.title ILIKE :w${i} ESCAPE '\\'`);
      replacements[`w${i}`] = `%${likeLiteral(word)}%`;
    });
  if (query.gearId) {
    parts.push(`EXISTS (SELECT 1 FROM episode_gear fg WHERE fg.episode_id = e.id AND fg.gear_id = :gearId)`);
    replacements.gearId = query.gearId;
  }
  if (query.personId) {
    parts.push(`(e.host_id = :personId OR e.editor_id = :personId)`);
    replacements.personId = query.personId;
  }
  if (query.mine) {
    parts.push(`(e.host_id = :me OR e.editor_id = :me)`);
    replacements.me = me;
  }
  return { sql: parts.map((p) => `AND ${p}`).join(' '), replacements };
}

/**
 * The board of a channel as JSON text, built by PostgreSQL in one statement: the first cards of
 * each column that pass the filters (stage order, then position; per-card aggregates only for
 * those), each column's total and matching counts, the gear cards may name and the channel's
 * people. Returned as text so the API passes it through without parsing and re-serialising.
 * Its cost follows the cards sent (at most `limit` per column), not the channel's size.
 */
export async function boardJson(sequelize: Sequelize, channelId: string, query: BoardQuery, me: string, tables?: OptionalTables): Promise<string | null> {
  const t = tables ?? (await optionalTables(sequelize));
  const card = cardAggregates(t);
  const filters = boardFilters(query, me);
  const limitOf = `CASE f.stage ${STAGES.map((s) => `WHEN '${s}' THEN ${query.show[s] ?? query.limit}`).join(' ')} ELSE ${query.limit} END`;
  const sql = `
    WITH matching AS (
      SELECT e.id, e.stage,
             row_number() OVER (PARTITION BY e.stage ORDER BY e.position, e.created_at, e.id) AS rn
        FROM episodes e
       WHERE e.channel_id = :channelId AND e.archived_at IS NULL ${filters.sql}
    ), shown AS (
      SELECT f.id FROM matching f WHERE f.rn <= ${limitOf}
    ), counts AS (
      SELECT s.stage,
             (SELECT count(*)::int FROM episodes x WHERE x.channel_id = :channelId AND x.archived_at IS NULL AND x.stage = s.stage) AS total,
             (SELECT count(*)::int FROM matching f WHERE f.stage = s.stage) AS matching
        FROM unnest(ARRAY[${STAGES.map((s) => `'${s}'`).join(',')}]::text[]) AS s(stage)
    )
    SELECT json_build_object(
      'channelId', c.id,
      'timeZone', c.time_zone,
      'readAt', ${iso('now()')},
      'episodes', COALESCE((
        SELECT json_agg(json_build_object(
                 'id', e.id, 'title', e.title, 'stage', e.stage, 'position', e.position, 'version', e.version,
                 'hostId', e.host_id, 'editorId', e.editor_id, 'shootDate', e.shoot_date, 'targetPublishWeek', e.target_publish_week,
                 ${card.fields.join(', ')})
               ORDER BY ${STAGE_ORDER}, e.position, e.created_at, e.id)
          FROM shown JOIN episodes e ON e.id = shown.id ${card.joins.join(' ')}), '[]'::json),
      'columns', (SELECT json_object_agg(stage, json_build_object('total', total, 'matching', matching)) FROM counts),
      'gear', COALESCE((
        SELECT json_agg(json_build_object(
                 'id', g.id, 'kind', g.kind, 'name', g.make || ' ' || g.model, 'source', g.source, 'archived', g.archived_at IS NOT NULL,
                 'dueBackOn', g.due_back_on, 'embargoAt', ${iso('g.embargo_at')}, 'embargoZone', g.embargo_zone)
               ORDER BY g.make, g.model, g.id)
          FROM gear g
         WHERE g.channel_id = c.id
           AND (g.archived_at IS NULL OR EXISTS (
                 SELECT 1 FROM episode_gear x JOIN episodes xe ON xe.id = x.episode_id WHERE x.gear_id = g.id AND xe.archived_at IS NULL))), '[]'::json),
      'people', COALESCE((
        SELECT json_agg(json_build_object('userId', u.id, 'name', u.name, 'role', m.role) ORDER BY u.name, u.id)
          FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.channel_id = c.id), '[]'::json)
    )::text AS board
    FROM channels c WHERE c.id = :channelId`;
  const row = await sequelize.query<{ board: string }>(sql, { replacements: { channelId, ...filters.replacements }, type: QueryTypes.SELECT, plain: true });
  return row?.board ?? null;
}

/**
 * Everything `checkStageMove` needs about one episode, read in the move's transaction in ONE
 * statement (except `now`, which the caller adds). Facts of features whose tables do not exist yet
 * read as absent: no tests, no footage, no description, no slot. `tables` overrides the probe (tests).
 */
export async function stageFacts(episodeId: string, transaction: Transaction, tables?: OptionalTables): Promise<Omit<StageFacts, 'now'>> {
  const sequelize = dbOf(transaction);
  const t = tables ?? (await optionalTables(sequelize, transaction));
  const hasTests = t.has('tests', 'id', 'episode_id', 'name', 'position');
  const hasLines = hasTests && t.has('spec_sheet_lines', 'test_id', 'label', 'value', 'required', 'position');
  const hasFootage = t.has('footage', 'episode_id', 'kind', 'status');
  const hasSlots = t.has('publish_slots', 'episode_id', 'starts_at', 'status');
  const hasDescriptions = t.has('descriptions', 'episode_id', 'summary', 'chapters', 'gear_links', 'disclosure');
  const f = hasFootage ? 'f' : '';
  const sql = `
    SELECT e.public_url,
      COALESCE((SELECT json_agg(json_build_object('gearName', g.make || ' ' || g.model, 'embargoAt', ${iso('g.embargo_at')}, 'zone', g.embargo_zone)
                                ORDER BY g.embargo_at, g.make, g.model)
                  FROM episode_gear eg JOIN gear g ON g.id = eg.gear_id
                 WHERE eg.episode_id = e.id AND g.embargo_at IS NOT NULL AND g.embargo_zone IS NOT NULL), '[]'::json) AS embargoes,
      EXISTS (SELECT 1 FROM episode_gear eg JOIN gear g ON g.id = eg.gear_id WHERE eg.episode_id = e.id AND (g.source = 'loaner' OR g.sponsored)) AS gear_needs_disclosure,
      COALESCE(btrim(c.settings->>'defaultDisclosure'), '') <> '' AS has_default_disclosure,
      ${hasTests ? '(SELECT count(*)::int FROM tests t WHERE t.episode_id = e.id)' : '0'} AS test_count,
      ${
        hasLines
          ? `COALESCE((SELECT json_agg(CASE WHEN (SELECT count(*) FROM tests t2 WHERE t2.episode_id = e.id) > 1 THEN t.name || ': ' || l.label ELSE l.label END
                                       ORDER BY t.position, t.created_at, t.id, l.position, l.id)
                         FROM spec_sheet_lines l JOIN tests t ON t.id = l.test_id
                        WHERE t.episode_id = e.id AND l.required AND btrim(l.value) = ''), '[]'::json)`
          : `'[]'::json`
      } AS required_empty,
      ${
        hasFootage
          ? `(SELECT count(*)::int FROM footage ${f} WHERE ${f}.episode_id = e.id AND ${f}.kind = 'camera_original' AND ${f}.status IN ('received','verified') ${footageFilter(t)})`
          : '0'
      } AS camera_originals,
      ${
        hasDescriptions
          ? `(SELECT btrim(d.summary) <> '' OR jsonb_array_length(d.chapters) > 0 OR jsonb_array_length(d.gear_links) > 0 OR btrim(d.disclosure) <> '' FROM descriptions d WHERE d.episode_id = e.id)`
          : 'false'
      } AS has_description,
      ${hasDescriptions ? `(SELECT btrim(d.disclosure) <> '' FROM descriptions d WHERE d.episode_id = e.id)` : 'false'} AS own_disclosure,
      ${hasDescriptions ? `(SELECT d.gear_links @> '[{"commission": true}]'::jsonb FROM descriptions d WHERE d.episode_id = e.id)` : 'false'} AS commission_links,
      ${hasSlots ? `EXISTS (SELECT 1 FROM publish_slots p WHERE p.episode_id = e.id AND p.status IN ('proposed','approved'))` : 'false'} AS has_slot,
      ${hasSlots ? `(SELECT ${iso('p.starts_at')} FROM publish_slots p WHERE p.episode_id = e.id AND p.status = 'approved' ORDER BY p.starts_at DESC LIMIT 1)` : 'NULL'} AS approved_at
    FROM episodes e JOIN channels c ON c.id = e.channel_id
    WHERE e.id = :episodeId`;
  const r = await sequelize.query<{
    public_url: string | null;
    embargoes: { gearName: string; embargoAt: string; zone: string }[];
    gear_needs_disclosure: boolean;
    has_default_disclosure: boolean;
    test_count: number;
    required_empty: string[];
    camera_originals: number;
    has_description: boolean | null;
    own_disclosure: boolean | null;
    commission_links: boolean | null;
    has_slot: boolean;
    approved_at: string | null;
  }>(sql, { replacements: { episodeId }, type: QueryTypes.SELECT, plain: true, transaction });
  if (!r) throw new Error(`episode ${episodeId} not found`);
  const disclosureRequired = r.gear_needs_disclosure || !!r.commission_links;
  return {
    testCount: r.test_count,
    requiredSpecLinesEmpty: r.required_empty,
    cameraOriginalsReceived: r.camera_originals,
    hasDescriptionDraft: !!r.has_description,
    hasProposedSlot: r.has_slot,
    ...(r.approved_at ? { approvedSlotAt: r.approved_at } : {}),
    embargoes: r.embargoes,
    disclosureRequired,
    // The description carries its own disclosure, or the channel's default fills in when one is required.
    disclosurePresent: !!r.own_disclosure || (disclosureRequired && r.has_default_disclosure),
    ...(r.public_url ? { publicUrl: r.public_url } : {}),
  };
}

// ---------------------------------------------------------------------------------------------------
// Board columns

/**
 * Serialises every write to the order of one channel's board (moves, creation, archive) until the
 * transaction ends, so concurrent moves see each other's positions and columns stay 0…n−1.
 */
export async function lockBoard(channelId: string, transaction: Transaction): Promise<void> {
  await lockUntilCommit(transaction, 'midgray.board', channelId);
}

/** Ids of the episodes (not archived) in `stages` of a channel, per stage, in board order. */
export async function columnIds(channelId: string, stages: Stage[], transaction: Transaction): Promise<Map<Stage, string[]>> {
  const rows = await dbOf(transaction).query<{ id: string; stage: Stage }>(
    `SELECT id, stage FROM episodes WHERE channel_id = :channelId AND archived_at IS NULL AND stage IN (:stages)
      ORDER BY position, created_at, id`,
    { replacements: { channelId, stages }, type: QueryTypes.SELECT, transaction },
  );
  const columns = new Map<Stage, string[]>(stages.map((s) => [s, []]));
  for (const r of rows) columns.get(r.stage)!.push(r.id);
  return columns;
}

/**
 * Writes positions 0…n−1 for each given column in one UPDATE (only rows whose position or stage
 * changes are touched). `stage` of every listed id is set to its column's stage.
 */
export async function writeColumns(columns: Map<Stage, string[]>, transaction: Transaction): Promise<void> {
  const ids: string[] = [];
  const stages: string[] = [];
  const positions: number[] = [];
  for (const [stage, list] of columns) {
    list.forEach((id, index) => {
      ids.push(id);
      stages.push(stage);
      positions.push(index);
    });
  }
  if (ids.length === 0) return;
  await dbOf(transaction).query(
    `UPDATE episodes e SET position = v.position, stage = v.stage
       FROM unnest(ARRAY[:ids]::uuid[], ARRAY[:stages]::text[], ARRAY[:positions]::int[]) AS v(id, stage, position)
      WHERE e.id = v.id AND (e.position <> v.position OR e.stage <> v.stage)`,
    { replacements: { ids, stages, positions }, transaction },
  );
}

// ---------------------------------------------------------------------------------------------------
// Episode page and archive

/** Footage count, open spec-sheet lines and live slots of one episode (one statement). */
export async function episodeExtras(sequelize: Sequelize, episodeId: string): Promise<{ footageCount: number | null; openSpecLines: number | null; slots: BoardSlot[] }> {
  const t = await optionalTables(sequelize);
  const footage = t.has('footage', 'episode_id') ? `(SELECT count(*)::int FROM footage f WHERE f.episode_id = e.id ${footageFilter(t)})` : 'NULL::int';
  const lines =
    t.has('tests', 'id', 'episode_id') && t.has('spec_sheet_lines', 'test_id', 'value', 'checked')
      ? `(SELECT count(*)::int FROM spec_sheet_lines l JOIN tests t ON t.id = l.test_id WHERE t.episode_id = e.id AND ${OPEN_LINE})`
      : 'NULL::int';
  const row = await sequelize.query<{ footage_count: number | null; open_spec_lines: number | null; slots: BoardSlot[] }>(
    `SELECT ${footage} AS footage_count, ${lines} AS open_spec_lines, ${slotsJsonAgg(t, 'e.id')} AS slots FROM episodes e WHERE e.id = :episodeId`,
    { replacements: { episodeId }, type: QueryTypes.SELECT, plain: true },
  );
  return { footageCount: row?.footage_count ?? null, openSpecLines: row?.open_spec_lines ?? null, slots: row?.slots ?? [] };
}

/** The newest `limit` activity lines of an episode, with the actor's name. */
export async function episodeActivity(sequelize: Sequelize, episodeId: string, limit = 200): Promise<ActivityEntry[]> {
  const rows = await sequelize.query<{ id: string; action: string; actor_name: string | null; created_at: Date; from_value: string | null; to_value: string | null; reason: string | null; details: Record<string, unknown> }>(
    `SELECT a.id::text AS id, a.action, u.name AS actor_name, a.created_at, a.from_value, a.to_value, a.reason, a.details
       FROM activities a LEFT JOIN users u ON u.id = a.actor_id
      WHERE a.episode_id = :episodeId ORDER BY a.created_at DESC, a.id DESC LIMIT :limit`,
    { replacements: { episodeId, limit }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    id: r.id,
    action: r.action,
    actorName: r.actor_name,
    createdAt: new Date(r.created_at).toISOString(),
    fromValue: r.from_value,
    toValue: r.to_value,
    reason: r.reason,
    details: r.details ?? {},
  }));
}

/** The channel's archived episodes, most recently archived first, with who archived them. */
export async function archivedEpisodes(sequelize: Sequelize, channelId: string): Promise<ArchivedEpisode[]> {
  const rows = await sequelize.query<{ id: string; title: string; stage: Stage; version: number; archived_at: Date; archived_by: string | null; host_name: string | null; editor_name: string | null }>(
    `SELECT e.id, e.title, e.stage, e.version, e.archived_at, h.name AS host_name, ed.name AS editor_name,
            (SELECT u.name FROM activities a JOIN users u ON u.id = a.actor_id
              WHERE a.episode_id = e.id AND a.action = 'episode.archived' ORDER BY a.created_at DESC, a.id DESC LIMIT 1) AS archived_by
       FROM episodes e LEFT JOIN users h ON h.id = e.host_id LEFT JOIN users ed ON ed.id = e.editor_id
      WHERE e.channel_id = :channelId AND e.archived_at IS NOT NULL
      ORDER BY e.archived_at DESC, e.id`,
    { replacements: { channelId }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    id: r.id,
    title: r.title,
    stage: r.stage,
    version: r.version,
    archivedAt: new Date(r.archived_at).toISOString(),
    archivedBy: r.archived_by,
    hostName: r.host_name,
    editorName: r.editor_name,
  }));
}

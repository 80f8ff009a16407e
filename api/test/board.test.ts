// The board, episodes, stage moves and gear (issue 3), against the real PostgreSQL. Stage rules
// are PRODUCT.md's table; the messages come from shared/src/stages.ts. All names are fictional.
import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Activity, Episode, EpisodeGear, Gear, SpecSheetLine, Test } from '@midgray/db';
import { BOARD_COLUMN_PAGE, BoardQuerySchema, BoardSchema, EpisodeDetailSchema, GearSchema, MOVE_INDEX_END, SPEC_SHEET_LINES, type Board, type Stage } from '@midgray/shared';
import { boardJson, stageFacts } from '../src/modules/episodes/episodes.repository.ts';
import type { OptionalTables } from '../src/modules/episodes/optional-tables.ts';
import { channelWithTeam, startTestApp, type Client, type TestContext } from './helpers.ts';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx?.close());

/** Episodes of `titles` placed straight in the database in `stage`, positions 0…n−1. */
async function place(channelId: string, stage: Stage, titles: string[], extra: Partial<{ hostId: string; editorId: string }> = {}) {
  const start = await Episode.count({ where: { channelId, stage, archivedAt: null } });
  const out: Episode[] = [];
  for (const [i, title] of titles.entries()) out.push(await Episode.create({ channelId, title, stage, position: start + i, ...extra }));
  return out;
}

/** A test on `episodeId` with every standard line; `empty` lists labels of required lines left blank. */
async function testWithLines(episodeId: string, name: string, empty: string[] = [], position = 0) {
  const t = await Test.create({ episodeId, kind: 'custom', name, position });
  await SpecSheetLine.bulkCreate(
    SPEC_SHEET_LINES.map((l) => ({ testId: t.id, key: l.key, label: l.label, position: l.position, required: l.requiredByDefault, value: empty.includes(l.label) ? '' : `${l.label} value`, checked: !empty.includes(l.label) })),
  );
  return t;
}

async function board(c: Client, channelId: string, query = ''): Promise<Board> {
  const res = await c.get(`/api/channels/${channelId}/board${query}`).expect(200);
  expect(res.headers['content-type']).toMatch(/application\/json/);
  return BoardSchema.parse(res.body);
}

/** Positions per stage column, as read from the database. */
async function positions(channelId: string) {
  const rows = await Episode.findAll({ where: { channelId, archivedAt: null }, order: [['position', 'ASC']] });
  const out: Record<string, number[]> = {};
  for (const r of rows) (out[r.stage] ??= []).push(r.position);
  return out;
}

function expectGapFree(cols: Record<string, number[]>) {
  for (const [stage, list] of Object.entries(cols)) expect(list, `column ${stage}`).toEqual(list.map((_, i) => i));
}

describe('the board', () => {
  it('returns every card in stage order, then position, with gear, people, counts and slots', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const gear = await Gear.create({ channelId, kind: 'body', make: 'Korvala', model: 'K9 Cine', source: 'loaner', dueBackOn: '2026-05-08', embargoAt: new Date('2026-05-12T13:00:00Z'), embargoZone: 'Europe/Berlin' });
    const [b, a] = await place(channelId, 'plan', ['Second card', 'First card']);
    await b.update({ position: 1 });
    await a.update({ position: 0 });
    const [shot] = await place(channelId, 'shoot', ['On set'], { hostId: team.host.userId, editorId: team.editor.userId });
    await EpisodeGear.create({ episodeId: shot.id, gearId: gear.id });
    await testWithLines(shot.id, 'Sweep', ['Frame rate', 'Codec']);
    await ctx.sequelize.query(`INSERT INTO footage (channel_id, episode_id, kind, status, original_name, format, size_bytes, storage_key) VALUES (:c, :e, 'camera_original', 'received', 'A001.mov', 'mov', 10, 'k1'), (:c, :e, 'frame_grab', 'received', 'g.png', 'png', 10, 'k2')`, {
      replacements: { c: channelId, e: shot.id },
    });
    await ctx.sequelize.query(`INSERT INTO publish_slots (episode_id, starts_at, zone, status) VALUES (:e, '2026-05-11T10:00:00Z', 'America/Los_Angeles', 'proposed')`, { replacements: { e: shot.id } });

    const data = await board(team.editor, channelId);
    expect(data.episodes.map((e) => e.title)).toEqual(['First card', 'Second card', 'On set']);
    const card = data.episodes[2];
    expect(card).toMatchObject({ stage: 'shoot', hostId: team.host.userId, editorId: team.editor.userId, gearIds: [gear.id], footageCount: 2, slots: [{ startsAt: '2026-05-11T10:00:00.000Z', zone: 'America/Los_Angeles', status: 'proposed' }] });
    // 19 standard lines: 2 left blank and unchecked are open, the 17 filled and checked are not.
    expect(card.openSpecLines).toBe(2);
    expect(data.gear).toEqual([{ id: gear.id, kind: 'body', name: 'Korvala K9 Cine', source: 'loaner', archived: false, dueBackOn: '2026-05-08', embargoAt: '2026-05-12T13:00:00.000Z', embargoZone: 'Europe/Berlin' }]);
    expect(data.people.map((p) => p.role).sort()).toEqual(['admin', 'editor', 'host', 'producer']);
    expect(data.timeZone).toBe('Europe/Berlin');
  });

  it('answers in the same number of SQL queries for 10 and for 1,000 episodes', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const gear = await Gear.create({ channelId, kind: 'lens', make: 'Brightwell', model: 'Prime 50', source: 'rental' });
    const seed = async (count: number) => {
      // Episodes spread over the stages, each with gear, a test with lines, footage and a slot, so every join has rows.
      await ctx.sequelize.query(
        `WITH made AS (
           INSERT INTO episodes (channel_id, title, stage, position)
           SELECT :c, 'Bulk ' || n, (ARRAY['plan','shoot','grade','approval','scheduled','live'])[1 + n % 6], n / 6
             FROM generate_series(:from, :to) AS n RETURNING id),
         g AS (INSERT INTO episode_gear (episode_id, gear_id) SELECT id, :g FROM made),
         t AS (INSERT INTO tests (episode_id, kind, name) SELECT id, 'custom', 'Bulk test' FROM made RETURNING id),
         l AS (INSERT INTO spec_sheet_lines (test_id, key, label, required) SELECT t.id, 'codec', 'Codec', true FROM t),
         f AS (INSERT INTO footage (channel_id, episode_id, kind, status, original_name, format, size_bytes, storage_key)
               SELECT :c, id, 'camera_original', 'verified', 'A.mov', 'mov', 1, 'k-' || id FROM made)
         INSERT INTO publish_slots (episode_id, starts_at, zone, status) SELECT id, now() + interval '9 days', 'UTC', 'proposed' FROM made`,
        { replacements: { c: channelId, g: gear.id, from: (await Episode.count({ where: { channelId } })) + 1, to: count } },
      );
    };
    const counted = async () => {
      // Sequelize reads `options.logging` on every statement: count the statements of one request.
      const sql: string[] = [];
      const options = (ctx.sequelize as unknown as { options: { logging: unknown } }).options;
      const before = options.logging;
      options.logging = (s: string) => void sql.push(s);
      try {
        const data = await board(team.host, channelId, '?limit=1000');
        return { queries: sql.length, cards: data.episodes.length, sql };
      } finally {
        options.logging = before;
      }
    };
    await seed(10);
    await counted(); // warm-up: the optional-table probe runs once per process
    const small = await counted();
    await seed(1000);
    const large = await counted();
    expect(small.cards).toBe(10);
    expect(large.cards).toBe(1000);
    expect(large.queries, large.sql.join('\n')).toBe(small.queries);
    // Signed-in user, membership, and the board statement itself.
    expect(small.queries).toBeLessThanOrEqual(3);
  });

  it('sends the first cards of each column with every column’s counts, and more of a column on request', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    await place(channelId, 'plan', Array.from({ length: 45 }, (_, i) => `Plan ${i}`));
    await place(channelId, 'grade', ['Grade 0', 'Grade 1', 'Grade 2']);
    const first = await board(team.editor, channelId);
    expect(first.episodes.filter((e) => e.stage === 'plan').map((e) => e.position)).toEqual(Array.from({ length: BOARD_COLUMN_PAGE }, (_, i) => i));
    expect(first.episodes.filter((e) => e.stage === 'grade').map((e) => e.title)).toEqual(['Grade 0', 'Grade 1', 'Grade 2']);
    expect(first.columns).toEqual({ plan: { total: 45, matching: 45 }, shoot: { total: 0, matching: 0 }, grade: { total: 3, matching: 3 }, approval: { total: 0, matching: 0 }, scheduled: { total: 0, matching: 0 }, live: { total: 0, matching: 0 } });
    const more = await board(team.editor, channelId, '?show=plan:40');
    expect(more.episodes.filter((e) => e.stage === 'plan').map((e) => e.title)).toEqual(Array.from({ length: 40 }, (_, i) => `Plan ${i}`));
    const few = await board(team.editor, channelId, '?limit=2&show=plan:3');
    expect(few.episodes.map((e) => e.title)).toEqual(['Plan 0', 'Plan 1', 'Plan 2', 'Grade 0', 'Grade 1']);
    expect(few.columns.plan).toEqual({ total: 45, matching: 45 });
  });

  it('filters on title words, gear, person and “mine”, keeping each card’s place in its whole column', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const k9 = await Gear.create({ channelId, kind: 'body', make: 'Korvala', model: 'K9 Cine', source: 'loaner' });
    const eps = await place(channelId, 'plan', ['K9 noise floor', 'Prime 50 flare', 'k9 LATITUDE test', '100% crop_test', '100 percent crop']);
    await EpisodeGear.create({ episodeId: eps[1].id, gearId: k9.id });
    await eps[2].update({ hostId: team.host.userId });
    await eps[4].update({ editorId: team.editor.userId });
    const titles = (b: Board) => b.episodes.map((e) => `${e.title}@${e.position}`);

    // Every word must appear, in any case; % and _ are literal characters, not patterns.
    const words = await board(team.producer, channelId, `?q=${encodeURIComponent('  latitude   K9 ')}`);
    expect(titles(words)).toEqual(['k9 LATITUDE test@2']);
    expect(words.columns.plan).toEqual({ total: 5, matching: 1 });
    expect(titles(await board(team.producer, channelId, `?q=${encodeURIComponent('100%')}`))).toEqual(['100% crop_test@3']);
    expect(titles(await board(team.producer, channelId, `?q=${encodeURIComponent('t_c')}`))).toEqual([]);
    expect(titles(await board(team.producer, channelId, `?gearId=${k9.id}`))).toEqual(['Prime 50 flare@1']);
    expect(titles(await board(team.producer, channelId, `?personId=${team.editor.userId}`))).toEqual(['100 percent crop@4']);
    expect(titles(await board(team.host, channelId, '?mine=true'))).toEqual(['k9 LATITUDE test@2']);
    expect(titles(await board(team.editor, channelId, '?mine=true'))).toEqual(['100 percent crop@4']);
    expect(titles(await board(team.producer, channelId, '?mine=true'))).toEqual([]);
    // Filters combine.
    expect(titles(await board(team.producer, channelId, `?q=k9&personId=${team.host.userId}`))).toEqual(['k9 LATITUDE test@2']);
  });

  it('refuses a malformed board query with a message naming the fix', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const refused = async (query: string, message: RegExp) => {
      const res = await team.host.get(`/api/channels/${channelId}/board${query}`).expect(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(JSON.stringify(res.body.error)).toMatch(message);
    };
    await refused('?limit=0', /at least 1 card/);
    await refused('?limit=abc', /number of cards/);
    await refused('?limit=5000', /at most 1000 cards/);
    await refused('?show=review:40', /show=stage:count/);
    await refused('?show=plan:0', /show=stage:count/);
    await refused('?mine=yes', /mine=true or mine=false/);
    await refused('?gearId=not-a-uuid', /gearId/);
    await refused(`?q=${'x'.repeat(201)}`, /under 200 characters/);
    await refused('?q=a&q=b', /search once/);
    await refused('?sort=title', /sort/);
  });

  it('answers any query string with the board or a 400 naming the problem, never a server error (fast-check)', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    await place(channelId, 'plan', ['100% crop_test', 'K9 noise']);
    const key = fc.constantFrom('q', 'gearId', 'personId', 'mine', 'limit', 'show', '__proto__', 'q[]', 'show[plan]');
    const value = fc.oneof(fc.string({ maxLength: 30 }), fc.string({ unit: 'grapheme', maxLength: 10 }), fc.constantFrom("' OR 1=1 --", '%', '_', '\\', 'plan:5', 'plan:5,plan:6', 'live:1000', 'true', '20', '-1', '1e9', 'x'.repeat(300)), fc.uuid());
    await fc.assert(
      fc.asyncProperty(fc.array(fc.tuple(key, value), { maxLength: 4 }), async (pairs) => {
        const search = new URLSearchParams(pairs).toString();
        const res = await team.host.get(`/api/channels/${channelId}/board?${search}`);
        expect([200, 400], `${search} → ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`).toContain(res.status);
        if (res.status === 400) expect(res.body.error.message.length).toBeGreaterThan(0);
        else expect(BoardSchema.parse(res.body).columns.plan.total).toBe(2);
      }),
      { numRuns: 80 },
    );
  });

  it('leaves out archived episodes and other channels’ episodes', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const other = await channelWithTeam(ctx);
    await place(channelId, 'plan', ['Mine']);
    const [gone] = await place(channelId, 'plan', ['Archived one']);
    await gone.update({ archivedAt: new Date() });
    await place(other.channelId, 'plan', ['Theirs']);
    expect((await board(team.host, channelId)).episodes.map((e) => e.title)).toEqual(['Mine']);
    await team.host.get(`/api/channels/${other.channelId}/board`).expect(404);
  });
});

describe('creating and editing episodes', () => {
  it('a host creates an episode at the end of Plan with gear, people and the Monday of the target week', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    await place(channelId, 'plan', ['Already there']);
    const gear = await Gear.create({ channelId, kind: 'body', make: 'Korvala', model: 'K7 Mark II', source: 'owned' });
    const res = await team.host
      .post(`/api/channels/${channelId}/episodes`, { title: '  K7: rolling shutter  ', gearIds: [gear.id, gear.id], hostId: team.host.userId, editorId: team.editor.userId, targetPublishWeek: '2026-W19', shootDate: '2026-04-30' })
      .expect(201);
    const ep = EpisodeDetailSchema.parse(res.body);
    expect(ep).toMatchObject({ title: 'K7: rolling shutter', stage: 'plan', position: 1, version: 1, targetPublishWeek: '2026-05-04', shootDate: '2026-04-30', host: { id: team.host.userId, name: 'Test host' }, editor: { name: 'Test editor' } });
    expect(ep.gear.map((g) => g.model)).toEqual(['K7 Mark II']);
    expect(ep.activity).toEqual([expect.objectContaining({ action: 'episode.created', actorName: 'Test host', toValue: 'plan' })]);
    // A date in the week works too: Wednesday 2026-05-06 is in the week of Monday 2026-05-04.
    const byDate = await team.producer.post(`/api/channels/${channelId}/episodes`, { title: 'By date', targetPublishWeek: '2026-05-06' }).expect(201);
    expect(byDate.body.targetPublishWeek).toBe('2026-05-04');
  });

  it('refuses bad input with field messages a person can act on', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const other = await channelWithTeam(ctx);
    const theirGear = await Gear.create({ channelId: other.channelId, kind: 'lens', make: 'Brightwell', model: 'Zoom', source: 'owned' });
    const empty = await team.host.post(`/api/channels/${channelId}/episodes`, { title: '   ' }).expect(400);
    expect(empty.body.error).toMatchObject({ code: 'validation_failed', message: 'Check title: Give the episode a title' });
    const week = await team.host.post(`/api/channels/${channelId}/episodes`, { title: 'X', targetPublishWeek: '2025-W53' }).expect(400);
    expect(week.body.error.details.fieldErrors['body.targetPublishWeek'][0]).toMatch(/week like 2026-W19/);
    const gear = await team.host.post(`/api/channels/${channelId}/episodes`, { title: 'X', gearIds: [theirGear.id] }).expect(400);
    expect(gear.body.error.details.fieldErrors['body.gearIds']).toEqual(['Pick gear from this channel’s gear list']);
    const host = await team.host.post(`/api/channels/${channelId}/episodes`, { title: 'X', hostId: other.team.host.userId }).expect(400);
    expect(host.body.error.message).toBe('Check hostId: The host must be a member of this channel');
    const unknown = await team.host.post(`/api/channels/${channelId}/episodes`, { title: 'X', stage: 'live' }).expect(400);
    expect(unknown.body.error.code).toBe('validation_failed');
    expect(await Episode.count({ where: { channelId } })).toBe(0);
  });

  it('only hosts, producers and admins create and edit; only producers and admins record the public URL', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    await team.editor.post(`/api/channels/${channelId}/episodes`, { title: 'Editor idea' }).expect(403);
    const ep = (await team.host.post(`/api/channels/${channelId}/episodes`, { title: 'Host idea' }).expect(201)).body;
    await team.editor.patch(`/api/episodes/${ep.id}`, { version: 1, title: 'Renamed' }).expect(403);
    const url = await team.host.patch(`/api/episodes/${ep.id}`, { version: 1, publicUrl: 'https://video.example/watch/1' }).expect(403);
    expect(url.body.error.message).toMatch(/Only a producer or admin records the public URL/);
    await team.producer.patch(`/api/episodes/${ep.id}`, { version: 1, publicUrl: 'https://video.example/watch/1' }).expect(200);
  });

  it('logs every edit and assignment with from → to, and refuses a stale version', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const a = await Gear.create({ channelId, kind: 'body', make: 'Korvala', model: 'K9 Cine', source: 'loaner' });
    const b = await Gear.create({ channelId, kind: 'light', make: 'Lumetra', model: 'Panel 600', source: 'purchased' });
    const ep = (await team.host.post(`/api/channels/${channelId}/episodes`, { title: 'Old title', gearIds: [a.id], hostId: team.host.userId }).expect(201)).body;
    const res = await team.host.patch(`/api/episodes/${ep.id}`, { version: 1, title: 'New title', gearIds: [b.id], hostId: team.producer.userId, editorId: team.editor.userId, shootDate: '2026-06-01' }).expect(200);
    expect(res.body).toMatchObject({ version: 2, title: 'New title', host: { name: 'Test producer' }, editor: { name: 'Test editor' }, shootDate: '2026-06-01' });
    const lines = (res.body.activity as { action: string; fromValue: string | null; toValue: string | null; details: { field?: string } }[]).map((l) => [l.action, l.details.field, l.fromValue, l.toValue]);
    expect(lines).toEqual(
      expect.arrayContaining([
        ['episode.updated', 'title', 'Old title', 'New title'],
        ['episode.updated', 'shoot date', null, '2026-06-01'],
        ['episode.assigned', 'host', 'Test host', 'Test producer'],
        ['episode.assigned', 'editor', null, 'Test editor'],
        ['episode.updated', 'gear', 'Korvala K9 Cine', 'Lumetra Panel 600'],
      ]),
    );
    const stale = await team.host.patch(`/api/episodes/${ep.id}`, { version: 1, title: 'Lost update' }).expect(409);
    expect(stale.body.error).toMatchObject({ code: 'stale_version', details: { currentVersion: 2 } });
    expect(stale.body.error.message).toMatch(/Someone changed "New title" meanwhile/);
  });

  it('answers 404 for another channel’s episode, whatever the route', async () => {
    const { team } = await channelWithTeam(ctx);
    const other = await channelWithTeam(ctx);
    const [theirs] = await place(other.channelId, 'plan', ['Not yours']);
    await team.admin.get(`/api/episodes/${theirs.id}`).expect(404);
    await team.admin.patch(`/api/episodes/${theirs.id}`, { version: 1, title: 'Mine now' }).expect(404);
    const move = await team.admin.post(`/api/episodes/${theirs.id}/move`, { toStage: 'plan', toIndex: 0, version: 1 }).expect(404);
    expect(move.body.error.message).toBe('Episode not found');
    await team.admin.post(`/api/episodes/${theirs.id}/archive`, { version: 1 }).expect(404);
    expect((await Episode.findByPk(theirs.id))!.title).toBe('Not yours');
  });
});

describe('moving cards', () => {
  it('a refused move lists exactly what is missing and changes nothing', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const [ep] = await place(channelId, 'plan', ['K9 noise']);
    const none = await team.host.post(`/api/episodes/${ep.id}/move`, { toStage: 'shoot', toIndex: 0, version: 1 }).expect(422);
    expect(none.body.error).toMatchObject({ code: 'stage_rule_failed', details: { missing: ['No test in the plan yet: add an ISO sweep, a latitude bracket or a custom test'] } });

    await testWithLines(ep.id, 'ISO sweep', ['Frame rate', 'Codec']);
    const lines = await team.host.post(`/api/episodes/${ep.id}/move`, { toStage: 'shoot', toIndex: 0, version: 1 }).expect(422);
    expect(lines.body.error.details.missing).toEqual(['2 spec-sheet lines empty: Frame rate, Codec']);
    expect(lines.body.error.message).toBe('"K9 noise" cannot move to Shoot: 2 spec-sheet lines empty: Frame rate, Codec');

    // With two tests, each empty line names its test.
    await testWithLines(ep.id, 'Latitude', ['ISO'], 1);
    const two = await team.editor.post(`/api/episodes/${ep.id}/move`, { toStage: 'shoot', toIndex: 0, version: 1 }).expect(422);
    expect(two.body.error.details.missing).toEqual([
      'Only a host, producer or admin can move an episode from Plan to Shoot (your role here is editor)',
      '3 spec-sheet lines empty: ISO sweep: Frame rate, ISO sweep: Codec, Latitude: ISO',
    ]);
    const after = (await Episode.findByPk(ep.id))!;
    expect([after.stage, after.position, after.version]).toEqual(['plan', 0, 1]);
    expect(await Activity.count({ where: { episodeId: ep.id, action: 'episode.moved' } })).toBe(0);

    await SpecSheetLine.update({ value: 'filled' }, { where: { testId: (await Test.findAll({ where: { episodeId: ep.id } })).map((t) => t.id) } });
    const ok = await team.host.post(`/api/episodes/${ep.id}/move`, { toStage: 'shoot', toIndex: 0, version: 1 }).expect(200);
    expect(ok.body).toEqual({ id: ep.id, stage: 'shoot', position: 0, version: 2 });
  });

  it('reads footage, description and publish slots for the later rules', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const [shoot] = await place(channelId, 'shoot', ['Recorder codecs']);
    expect((await team.editor.post(`/api/episodes/${shoot.id}/move`, { toStage: 'grade', toIndex: 0, version: 1 }).expect(422)).body.error.details.missing).toEqual(['No camera original received yet']);
    // A frame grab, or a camera original still arriving, does not count.
    await ctx.sequelize.query(
      `INSERT INTO footage (channel_id, episode_id, kind, status, original_name, format, size_bytes, storage_key) VALUES (:c, :e, 'frame_grab', 'verified', 'g.png', 'png', 1, 'a'), (:c, :e, 'camera_original', 'receiving', 'A.mov', 'mov', 1, 'b')`,
      { replacements: { c: channelId, e: shoot.id } },
    );
    await team.editor.post(`/api/episodes/${shoot.id}/move`, { toStage: 'grade', toIndex: 0, version: 1 }).expect(422);
    await ctx.sequelize.query(`UPDATE footage SET status = 'verified' WHERE episode_id = :e AND kind = 'camera_original'`, { replacements: { e: shoot.id } });
    await team.editor.post(`/api/episodes/${shoot.id}/move`, { toStage: 'grade', toIndex: 0, version: 1 }).expect(200);

    expect((await team.editor.post(`/api/episodes/${shoot.id}/move`, { toStage: 'approval', toIndex: 0, version: 2 }).expect(422)).body.error.details.missing).toEqual(['No description draft yet', 'No publish slot proposed yet']);
    await ctx.sequelize.query(`INSERT INTO descriptions (episode_id, summary) VALUES (:e, 'Codecs side by side.')`, { replacements: { e: shoot.id } });
    await ctx.sequelize.query(`INSERT INTO publish_slots (episode_id, starts_at, zone, status) VALUES (:e, '2026-05-12T12:00:00Z', 'UTC', 'proposed')`, { replacements: { e: shoot.id } });
    await team.editor.post(`/api/episodes/${shoot.id}/move`, { toStage: 'approval', toIndex: 0, version: 2 }).expect(200);

    // Approval → Scheduled: an approved slot not before any embargo, and a disclosure for a loaner.
    const loaner = await Gear.create({ channelId, kind: 'recorder', make: 'Datavault', model: 'Field 7', source: 'loaner', embargoAt: new Date('2026-05-12T13:00:00Z'), embargoZone: 'Europe/Berlin' });
    await EpisodeGear.create({ episodeId: shoot.id, gearId: loaner.id });
    await ctx.sequelize.query(`UPDATE publish_slots SET status = 'approved', decided_at = now() WHERE episode_id = :e`, { replacements: { e: shoot.id } });
    const early = await team.producer.post(`/api/episodes/${shoot.id}/move`, { toStage: 'scheduled', toIndex: 0, version: 3 }).expect(422);
    expect(early.body.error.details.missing).toEqual([
      'Approved slot 2026-05-12 12:00 UTC is before the embargo of Datavault Field 7 (2026-05-12 15:00 Europe/Berlin)',
      'The description has no disclosure, and it needs one: gear was loaned or sponsored, or a link earns a commission',
    ]);
    await ctx.sequelize.query(`UPDATE publish_slots SET starts_at = '2026-05-12T13:00:00Z' WHERE episode_id = :e`, { replacements: { e: shoot.id } });
    await ctx.sequelize.query(`UPDATE descriptions SET disclosure = 'Lent to us by its maker.' WHERE episode_id = :e`, { replacements: { e: shoot.id } });
    await team.producer.post(`/api/episodes/${shoot.id}/move`, { toStage: 'scheduled', toIndex: 0, version: 3 }).expect(200);

    // Scheduled → Live: the slot has come (it is in the past here), but no public URL yet.
    expect((await team.producer.post(`/api/episodes/${shoot.id}/move`, { toStage: 'live', toIndex: 0, version: 4 }).expect(422)).body.error.details.missing).toEqual(['No public URL recorded yet']);
    await team.producer.patch(`/api/episodes/${shoot.id}`, { version: 4, publicUrl: 'https://video.example/watch/field7' }).expect(200);
    await team.producer.post(`/api/episodes/${shoot.id}/move`, { toStage: 'live', toIndex: 0, version: 5 }).expect(200);
  });

  it('a back move needs a reason, and the reason is kept in the activity list', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const [ep] = await place(channelId, 'grade', ['Panel flicker']);
    const noReason = await team.editor.post(`/api/episodes/${ep.id}/move`, { toStage: 'shoot', toIndex: 0, version: 1 }).expect(422);
    expect(noReason.body.error.details).toMatchObject({ missing: ['Give a reason for moving the episode back to Shoot'], needsReason: true });
    const blank = await team.editor.post(`/api/episodes/${ep.id}/move`, { toStage: 'shoot', toIndex: 0, version: 1, reason: '   ' }).expect(422);
    expect(blank.body.error.details.missing).toEqual(['Give a reason for moving the episode back to Shoot']);
    await team.editor.post(`/api/episodes/${ep.id}/move`, { toStage: 'shoot', toIndex: 0, version: 1, reason: ' Flicker at 50 Hz: reshoot with the panel at 100 % ' }).expect(200);
    const detail = (await team.host.get(`/api/episodes/${ep.id}`).expect(200)).body;
    expect(detail.activity[0]).toMatchObject({ action: 'episode.moved', actorName: 'Test editor', fromValue: 'grade', toValue: 'shoot', reason: 'Flicker at 50 Hz: reshoot with the panel at 100 %', details: { direction: 'back' } });
    // Back to Plan is for hosts, producers and admins only.
    const role = await team.editor.post(`/api/episodes/${ep.id}/move`, { toStage: 'plan', toIndex: 0, version: 2, reason: 'Replan' }).expect(422);
    expect(role.body.error.details.missing).toEqual(['Only a host, producer or admin can move an episode back to Plan (your role here is editor)']);
  });

  it('refuses skipping a stage, a stale version (409) and moving an archived episode', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const [ep] = await place(channelId, 'plan', ['Skipper']);
    const skip = await team.admin.post(`/api/episodes/${ep.id}/move`, { toStage: 'grade', toIndex: 0, version: 1 }).expect(422);
    expect(skip.body.error.details.missing).toEqual(['Episodes move forward one stage at a time: from Plan the next stage is Shoot']);
    const stale = await team.admin.post(`/api/episodes/${ep.id}/move`, { toStage: 'plan', toIndex: 0, version: 7 }).expect(409);
    expect(stale.body.error).toMatchObject({ code: 'stale_version', details: { currentVersion: 1, stage: 'plan' } });
    const bad = await team.admin.post(`/api/episodes/${ep.id}/move`, { toStage: 'editing', toIndex: -1, version: 1 }).expect(400);
    expect(Object.keys(bad.body.error.details.fieldErrors).sort()).toEqual(['body.toIndex', 'body.toStage']);
    await ep.update({ archivedAt: new Date() });
    const archived = await team.admin.post(`/api/episodes/${ep.id}/move`, { toStage: 'plan', toIndex: 0, version: 1 }).expect(409);
    expect(archived.body.error.message).toMatch(/archived: restore it/);
  });

  it('reorders within a column and keeps positions 0…n−1 in both columns of a move', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const plan = await place(channelId, 'plan', ['A', 'B', 'C', 'D']);
    const [x] = await place(channelId, 'grade', ['X']);
    await team.host.post(`/api/episodes/${plan[3].id}/move`, { toStage: 'plan', toIndex: 0, version: 1 }).expect(200);
    expect((await board(team.host, channelId)).episodes.filter((e) => e.stage === 'plan').map((e) => e.title)).toEqual(['D', 'A', 'B', 'C']);
    // Back move of X into the middle of Plan; an index past the end means "last".
    await team.host.post(`/api/episodes/${x.id}/move`, { toStage: 'plan', toIndex: 2, version: 1, reason: 'Plan again' }).expect(200);
    await team.host.post(`/api/episodes/${plan[0].id}/move`, { toStage: 'plan', toIndex: MOVE_INDEX_END, version: 1 }).expect(200);
    const tooFar = await team.host.post(`/api/episodes/${plan[1].id}/move`, { toStage: 'plan', toIndex: MOVE_INDEX_END + 1, version: 1 }).expect(400);
    expect(tooFar.body.error.message).toMatch(/past the end of the column means last/);
    const titles = (await board(team.host, channelId)).episodes.map((e) => `${e.stage}:${e.title}:${e.position}`);
    expect(titles).toEqual(['plan:D:0', 'plan:X:1', 'plan:B:2', 'plan:C:3', 'plan:A:4']);
    expectGapFree(await positions(channelId));
    // Reorders are not stage moves: the activity list only has the back move.
    expect(await Activity.count({ where: { action: 'episode.moved', channelId } })).toBe(1);
  });

  it('two moves of the same card with the same version: one wins, the other gets 409; columns stay gap-free', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const plan = await place(channelId, 'plan', ['P0', 'P1', 'P2', 'P3', 'P4']);
    await place(channelId, 'shoot', ['S0', 'S1']);
    const target = plan[2];
    for (const t of ['Sweep']) await testWithLines(target.id, t);
    const [a, b] = await Promise.all([
      team.host.post(`/api/episodes/${target.id}/move`, { toStage: 'shoot', toIndex: 1, version: 1 }),
      team.producer.post(`/api/episodes/${target.id}/move`, { toStage: 'plan', toIndex: 4, version: 1 }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    expect(loser.body.error.code).toBe('stale_version');
    expect((await Episode.findByPk(target.id))!.version).toBe(2);
    expectGapFree(await positions(channelId));
  });

  it('many people moving different cards at once: every move lands and every column stays 0…n−1', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const plan = await place(channelId, 'plan', Array.from({ length: 8 }, (_, i) => `Plan ${i}`));
    const grade = await place(channelId, 'grade', Array.from({ length: 6 }, (_, i) => `Grade ${i}`));
    const movers = [team.host, team.producer, team.admin];
    const results = await Promise.all([
      ...plan.map((e, i) => movers[i % 3].post(`/api/episodes/${e.id}/move`, { toStage: 'plan', toIndex: (i * 5) % 8, version: 1 })),
      ...grade.map((e, i) => movers[i % 3].post(`/api/episodes/${e.id}/move`, { toStage: 'shoot', toIndex: i % 2, version: 1, reason: `Reshoot ${i}` })),
    ]);
    expect(results.map((r) => r.status)).toEqual(results.map(() => 200));
    const cols = await positions(channelId);
    expectGapFree(cols);
    expect(cols.plan).toHaveLength(8);
    expect(cols.shoot).toHaveLength(6);
    expect(cols.grade).toBeUndefined();
  });
});

describe('archive', () => {
  it('archiving takes a card off the board, closes the gap, lists it, and restoring puts it back at the end', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const [a, b, c] = await place(channelId, 'shoot', ['A', 'B', 'C']);
    await team.editor.post(`/api/episodes/${b.id}/archive`, { version: 1 }).expect(403);
    const archived = await team.host.post(`/api/episodes/${b.id}/archive`, { version: 1 }).expect(200);
    expect(archived.body).toMatchObject({ version: 2, archivedAt: expect.any(String) });
    expect((await board(team.editor, channelId)).episodes.map((e) => [e.title, e.position])).toEqual([['A', 0], ['C', 1]]);
    const list = (await team.editor.get(`/api/channels/${channelId}/episodes/archived`).expect(200)).body;
    expect(list).toEqual([expect.objectContaining({ id: b.id, title: 'B', stage: 'shoot', archivedBy: 'Test host', version: 2 })]);
    await team.host.post(`/api/episodes/${b.id}/archive`, { version: 2 }).expect(409);
    await team.host.patch(`/api/episodes/${b.id}`, { version: 2, title: 'Edited while archived' }).expect(409);

    await team.producer.post(`/api/episodes/${b.id}/unarchive`, { version: 1 }).expect(409);
    await team.producer.post(`/api/episodes/${b.id}/unarchive`, { version: 2 }).expect(200);
    expect((await board(team.editor, channelId)).episodes.map((e) => [e.title, e.position])).toEqual([['A', 0], ['C', 1], ['B', 2]]);
    expect((await team.editor.get(`/api/channels/${channelId}/episodes/archived`).expect(200)).body).toEqual([]);
    const actions = (await team.host.get(`/api/episodes/${b.id}`).expect(200)).body.activity.map((l: { action: string }) => l.action);
    expect(actions).toEqual(['episode.unarchived', 'episode.archived']);
    // Nothing was deleted.
    expect(await Episode.count({ where: { id: [a.id, b.id, c.id] } })).toBe(3);
  });
});

describe('gear', () => {
  const k9 = { kind: 'body', make: 'Korvala', model: 'K9 Cine', serial: 'KV9-0001', source: 'loaner', receivedOn: '2026-04-20', dueBackOn: '2026-05-08', embargoAt: '2026-05-12T13:00:00Z', embargoZone: 'Europe/Berlin', notes: 'Pre-production firmware.' };

  it('producers create and edit gear with its embargo instant and zone; everyone reads it', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    await team.host.post(`/api/channels/${channelId}/gear`, k9).expect(403);
    const created = GearSchema.parse((await team.producer.post(`/api/channels/${channelId}/gear`, k9).expect(201)).body);
    expect(created).toMatchObject({ make: 'Korvala', embargoAt: '2026-05-12T13:00:00.000Z', embargoZone: 'Europe/Berlin', version: 1, archivedAt: null, episodeCount: 0, sponsored: false });
    const list = (await team.editor.get(`/api/channels/${channelId}/gear`).expect(200)).body;
    expect(list.map((g: { id: string }) => g.id)).toEqual([created.id]);

    const edited = (await team.admin.patch(`/api/gear/${created.id}`, { version: 1, dueBackOn: '2026-05-15', embargoAt: null, embargoZone: null }).expect(200)).body;
    expect(edited).toMatchObject({ version: 2, dueBackOn: '2026-05-15', embargoAt: null, embargoZone: null });
    const stale = await team.admin.patch(`/api/gear/${created.id}`, { version: 1, notes: 'late' }).expect(409);
    expect(stale.body.error.code).toBe('stale_version');
    const log = await Activity.findAll({ where: { subjectId: created.id }, order: [['id', 'ASC']] });
    expect(log.map((l) => [l.action, l.details])).toEqual([
      ['gear.created', {}],
      ['gear.updated', { fields: ['dueBackOn', 'embargoAt', 'embargoZone'] }],
    ]);
  });

  it('refuses an embargo without its zone, an unknown zone and a due-back date before receipt', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const noZone = await team.producer.post(`/api/channels/${channelId}/gear`, { ...k9, embargoZone: null }).expect(400);
    expect(noZone.body.error.details.fieldErrors['body.embargoZone']).toEqual(['Give the time zone the embargo was announced in, e.g. Europe/Berlin']);
    const zone = await team.producer.post(`/api/channels/${channelId}/gear`, { ...k9, embargoZone: 'Europe/Atlantis' }).expect(400);
    expect(zone.body.error.message).toMatch(/IANA/);
    const dates = await team.producer.post(`/api/channels/${channelId}/gear`, { ...k9, dueBackOn: '2026-04-01' }).expect(400);
    expect(dates.body.error.details.fieldErrors['body.dueBackOn'][0]).toMatch(/before the date it was received \(2026-04-20\)/);
    const created = (await team.producer.post(`/api/channels/${channelId}/gear`, k9).expect(201)).body;
    const half = await team.producer.patch(`/api/gear/${created.id}`, { version: 1, embargoAt: '2026-06-01T10:00:00Z' }).expect(400);
    expect(half.body.error.message).toMatch(/embargo date-time and its time zone together/);
    const merged = await team.producer.patch(`/api/gear/${created.id}`, { version: 1, dueBackOn: '2026-04-19' }).expect(400);
    expect(merged.body.error.details.fieldErrors['body.dueBackOn'][0]).toMatch(/before the date it was received/);
    expect(await Gear.count({ where: { channelId } })).toBe(1);
  });

  it('gear in use is archived, not deleted; unused gear can be deleted; archived gear cannot be added to an episode', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const used = (await team.producer.post(`/api/channels/${channelId}/gear`, k9).expect(201)).body;
    const spare = (await team.producer.post(`/api/channels/${channelId}/gear`, { ...k9, model: 'Spare' }).expect(201)).body;
    const ep = (await team.host.post(`/api/channels/${channelId}/episodes`, { title: 'Uses K9', gearIds: [used.id] }).expect(201)).body;
    const refused = await team.producer.delete(`/api/gear/${used.id}`).expect(409);
    expect(refused.body.error.message).toBe('Korvala K9 Cine is used by 1 episode: archive it instead, so those episodes keep it');
    await team.producer.delete(`/api/gear/${spare.id}`).expect(204);
    const archived = (await team.producer.patch(`/api/gear/${used.id}`, { version: 1, archived: true }).expect(200)).body;
    expect(archived.archivedAt).not.toBeNull();
    expect((await team.host.get(`/api/channels/${channelId}/gear`).expect(200)).body).toEqual([]);
    expect((await team.host.get(`/api/channels/${channelId}/gear?archived=true`).expect(200)).body).toHaveLength(1);
    // The episode keeps its archived gear, and the board still names it.
    expect((await team.host.get(`/api/episodes/${ep.id}`).expect(200)).body.gear.map((g: { id: string }) => g.id)).toEqual([used.id]);
    expect((await board(team.host, channelId)).gear).toEqual([expect.objectContaining({ id: used.id, archived: true })]);
    const add = await team.host.post(`/api/channels/${channelId}/episodes`, { title: 'New', gearIds: [used.id] }).expect(400);
    expect(add.body.error.message).toMatch(/Korvala K9 Cine is archived/);
    // Other channels see none of it.
    const other = await channelWithTeam(ctx);
    await other.team.producer.patch(`/api/gear/${used.id}`, { version: 2, notes: 'x' }).expect(404);
  });
});

describe('optional tables', () => {
  it('the board and the stage facts still answer when the later features’ tables are absent', async () => {
    const { channelId } = await channelWithTeam(ctx);
    const [ep] = await place(channelId, 'plan', ['Before the plans feature']);
    await testWithLines(ep.id, 'Sweep', ['Codec']);
    const none: OptionalTables = { has: () => false };
    const data = BoardSchema.parse(JSON.parse((await boardJson(ctx.sequelize, channelId, BoardQuerySchema.parse({}), ep.id, none))!));
    expect(data.episodes[0]).toMatchObject({ footageCount: null, openSpecLines: null, slots: [] });
    const facts = await ctx.sequelize.transaction((transaction) => stageFacts(ep.id, transaction, none));
    expect(facts).toMatchObject({ testCount: 0, requiredSpecLinesEmpty: [], cameraOriginalsReceived: 0, hasDescriptionDraft: false, hasProposedSlot: false });
    // With the tables the same episode has its test and its empty line.
    const real = await ctx.sequelize.transaction((transaction) => stageFacts(ep.id, transaction));
    expect(real).toMatchObject({ testCount: 1, requiredSpecLinesEmpty: ['Codec'] });
    const [{ n }] = await ctx.sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM tests WHERE episode_id = :e`, { replacements: { e: ep.id }, type: QueryTypes.SELECT });
    expect(n).toBe(1);
  });
});


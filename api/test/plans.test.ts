// Test plans through the API: when a host adds, edits and shoots a test, then the rows,
// versions, activity and plan facts follow; other roles and channels are refused.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Activity, SpecSheetLine, Test, TestStep } from '@midgray/db';
import type { TestDto } from '@midgray/shared';
import { planFacts } from '../src/modules/plans/plans.repository.ts';
import { channelWithTeam, newUser, startTestApp, type Client, type TestContext } from './helpers.ts';
import { BRACKET_INPUT, ISO_SWEEP_INPUT, makeEpisode } from './plan-fixtures.ts';

let ctx: TestContext;
let team: Awaited<ReturnType<typeof channelWithTeam>>['team'];
let channelId: string;
let outsider: Client;

beforeAll(async () => {
  ctx = await startTestApp();
  ({ team, channelId } = await channelWithTeam(ctx));
  outsider = await newUser(ctx, 'Olu Outsider');
  await outsider.post('/api/channels', { name: 'Elsewhere', timeZone: 'UTC' }).expect(201);
});
afterAll(() => ctx?.close());

async function sweep(episodeId: string, inputs: object = ISO_SWEEP_INPUT, name = 'ISO sweep 100–1600'): Promise<TestDto> {
  const res = await team.host.post(`/api/episodes/${episodeId}/tests`, { kind: 'iso_sweep', name, inputs });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

describe('creating tests', () => {
  it('when a host adds an ISO sweep, then its steps are one per full stop and the spec sheet is pre-filled', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    expect(test.steps.map((s) => s.iso)).toEqual([100, 200, 400, 800, 1600]);
    expect(test.steps.map((s) => s.label)).toEqual(['ISO 100', 'ISO 200', 'ISO 400', 'ISO 800', 'ISO 1600']);
    // ND first: each stop of ISO is taken back by 0.3 of ND (ND 0.3 ≈ one stop, common practice).
    expect(test.steps.map((s) => s.planned.ndDensity)).toEqual([0, 0.3, 0.6, 0.9, 1.2]);
    expect(test.steps.every((s) => s.planned.fNumber === 4 && s.planned.shutterAngleDeg === 180 && s.shotAt === null)).toBe(true);
    expect(test.specLines).toHaveLength(19);
    const byKey = Object.fromEntries(test.specLines.map((l) => [l.key, l]));
    expect(byKey.iso.value).toBe('100–1600, full stops');
    expect(byKey.frame_rate.value).toBe('24 fps');
    expect(byKey.body).toMatchObject({ value: '', required: true, custom: false });
    expect(byKey.monitoring_lut.required).toBe(false);
    const activity = await Activity.findAll({ where: { subjectId: test.id } });
    expect(activity.map((a) => a.action)).toEqual(['test.created']);
  });

  it('when a host adds a latitude bracket, then each step carries the grade correction', async () => {
    const ep = await makeEpisode(channelId);
    const res = await team.producer.post(`/api/episodes/${ep.id}/tests`, { kind: 'latitude_bracket', name: 'Bracket ±2', inputs: BRACKET_INPUT }).expect(201);
    const steps = (res.body as TestDto).steps;
    expect(steps.map((s) => s.offsetStops)).toEqual([-2, -1, 0, 1, 2]);
    expect(steps[0].planned.gradeCorrectionLabel).toBe('+2 stops in the grade');
    expect(steps[2].label).toBe('0 (reference)');
    expect(steps.map((s) => s.planned.ndDensity)).toEqual([1.2, 0.9, 0.6, 0.3, 0]);
  });

  it('when a custom test lists free steps, then they are saved in order with open settings left empty', async () => {
    const ep = await makeEpisode(channelId);
    const res = await team.admin
      .post(`/api/episodes/${ep.id}/tests`, { kind: 'custom', name: 'Rolling shutter', inputs: { fps: 25, steps: [{ label: 'Whip pan', iso: 800, shutterAngleDeg: 180 }, { label: 'Strobe', notes: 'Flash at 5 Hz' }] } })
      .expect(201);
    const test = res.body as TestDto;
    expect(test.steps.map((s) => s.label)).toEqual(['Whip pan', 'Strobe']);
    expect(test.steps[0].planned.shutterSeconds).toBeCloseTo(1 / 50, 12); // 180° at 25 fps = 1/50 s
    expect(test.steps[1].planned).toMatchObject({ iso: null, fNumber: null, notes: 'Flash at 5 Hz' });
    expect(test.specLines.find((l) => l.key === 'frame_rate')!.value).toBe('25 fps');
  });

  it('when the generator refuses the input, then the answer is 422 with its message and nothing is saved', async () => {
    const ep = await makeEpisode(channelId);
    const res = await team.host.post(`/api/episodes/${ep.id}/tests`, { kind: 'iso_sweep', name: 'Reversed', inputs: { ...ISO_SWEEP_INPUT, minIso: 3200, maxIso: 100 } });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.message).toBe('The ISO range is reversed: lowest ISO 3200 is above highest ISO 100; swap them.');
    expect(res.body.error.details).toEqual({ field: 'minIso' });
    expect(await Test.count({ where: { episodeId: ep.id } })).toBe(0);

    const angle = await team.host.post(`/api/episodes/${ep.id}/tests`, { kind: 'iso_sweep', name: 'Angle', inputs: { ...ISO_SWEEP_INPUT, base: { ...ISO_SWEEP_INPUT.base, shutter: { kind: 'angle', angleDeg: 400 } } } });
    expect(angle.status).toBe(422);
    expect(angle.body.error.message).toMatch(/Shutter angle must be a number of degrees above 0 and at most 360 \(got 400\)/);

    const custom = await team.host.post(`/api/episodes/${ep.id}/tests`, { kind: 'custom', name: 'Bad step', inputs: { fps: 24, steps: [{ label: 'ok' }, { label: 'bad', iso: -5 }] } });
    expect(custom.status).toBe(422);
    expect(custom.body.error.message).toBe('Step 2: ISO must be a number from 3 to 409600');
  });

  it('when the body itself is malformed, then validation answers 400 naming the field', async () => {
    const ep = await makeEpisode(channelId);
    const res = await team.host.post(`/api/episodes/${ep.id}/tests`, { kind: 'zoom_test', name: '', inputs: {} }).expect(400);
    expect(res.body.error.details.fieldErrors).toHaveProperty(['body.kind']);
  });
});

describe('who may do what', () => {
  it('lets an editor read the plan but not change it', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const list = await team.editor.get(`/api/episodes/${ep.id}/tests`).expect(200);
    expect(list.body.canEdit).toBe(false);
    expect(list.body.tests).toHaveLength(1);
    expect((await team.host.get(`/api/episodes/${ep.id}/tests`).expect(200)).body.canEdit).toBe(true);
    const refused = await team.editor.post(`/api/episodes/${ep.id}/tests`, { kind: 'iso_sweep', name: 'x', inputs: ISO_SWEEP_INPUT }).expect(403);
    expect(refused.body.error.message).toMatch(/editor/);
    await team.editor.post(`/api/steps/${test.steps[0].id}/shot`, { version: 1, actual: { iso: 100, fNumber: 4, shutterAngleDeg: 180, ndDensity: 0 } }).expect(403);
    await team.editor.patch(`/api/spec-lines/${test.specLines[0].id}`, { version: 1, value: 'K9' }).expect(403);
  });

  it('answers 404 to a member of another channel, for every kind of record', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    for (const path of [`/api/episodes/${ep.id}/tests`, `/api/tests/${test.id}`, `/api/episodes/${ep.id}/shot-list.csv`]) {
      const res = await outsider.get(path).expect(404);
      expect(res.body.error.code).toBe('not_found');
    }
    await outsider.patch(`/api/spec-lines/${test.specLines[0].id}`, { version: 1, value: 'x' }).expect(404);
    await outsider.post(`/api/steps/${test.steps[0].id}/shot`, { version: 1, actual: { iso: 100, fNumber: 4, shutterAngleDeg: 180, ndDensity: 0 } }).expect(404);
    expect((await SpecSheetLine.findByPk(test.specLines[0].id))!.value).toBe('');
  });
});

describe('editing a test', () => {
  it('when inputs widen the range, then kept steps keep their rows and the plan-filled lines follow', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const isoLine = test.specLines.find((l) => l.key === 'iso')!;
    const ndLine = test.specLines.find((l) => l.key === 'nd')!;
    // A person's own wording of the ND line must survive the change.
    await team.host.patch(`/api/spec-lines/${ndLine.id}`, { version: ndLine.version, value: 'Internal ND wheel' }).expect(200);
    const res = await team.host.patch(`/api/tests/${test.id}`, { version: test.version, inputs: { ...ISO_SWEEP_INPUT, maxIso: 3200, kit: { ...ISO_SWEEP_INPUT.kit, ndDensities: [0.3, 0.6, 0.9, 1.2, 1.5] } } }).expect(200);
    const updated = res.body as TestDto;
    expect(updated.version).toBe(test.version + 1);
    expect(updated.steps.map((s) => s.iso)).toEqual([100, 200, 400, 800, 1600, 3200]);
    expect(updated.steps.slice(0, 5).map((s) => s.id)).toEqual(test.steps.map((s) => s.id));
    expect(updated.specLines.find((l) => l.id === isoLine.id)!.value).toBe('100–3200, full stops');
    expect(updated.specLines.find((l) => l.id === ndLine.id)!.value).toBe('Internal ND wheel');

    // Narrowing from below re-numbers the steps that stay.
    const narrowed = (await team.host.patch(`/api/tests/${test.id}`, { version: updated.version, inputs: { ...ISO_SWEEP_INPUT, minIso: 400 } }).expect(200)).body as TestDto;
    expect(narrowed.steps.map((s) => [s.index, s.iso])).toEqual([[0, 400], [1, 800], [2, 1600]]);
    expect(narrowed.steps[0].id).toBe(test.steps[2].id);
  });

  it('when a stale version is sent, then 409 and nothing changes', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    await team.host.patch(`/api/tests/${test.id}`, { version: test.version, name: 'First rename' }).expect(200);
    const res = await team.producer.patch(`/api/tests/${test.id}`, { version: test.version, name: 'Second rename' }).expect(409);
    expect(res.body.error).toMatchObject({ code: 'stale_version', details: { currentVersion: test.version + 1 } });
    expect(res.body.error.message).toMatch(/reload/);
    expect((await Test.findByPk(test.id))!.name).toBe('First rename');
    await team.host.delete(`/api/tests/${test.id}?version=${test.version}`).expect(409);
  });

  it('when new inputs would drop a step already shot, then 409 names it and the steps stay', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const last = test.steps.at(-1)!;
    await team.host.post(`/api/steps/${last.id}/shot`, { version: last.version, actual: { iso: 1600, fNumber: 4, shutterAngleDeg: 180, ndDensity: 1.2 } }).expect(200);
    const res = await team.host.patch(`/api/tests/${test.id}`, { version: test.version, inputs: { ...ISO_SWEEP_INPUT, maxIso: 800 } }).expect(409);
    expect(res.body.error.message).toMatch(/already shot \(ISO 1600\)/);
    expect(await TestStep.count({ where: { testId: test.id } })).toBe(5);
  });

  it('when inputs are invalid on update, then 422 and the saved plan is untouched', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const res = await team.host.patch(`/api/tests/${test.id}`, { version: test.version, inputs: { ...ISO_SWEEP_INPUT, baseIso: 110 } }).expect(422);
    expect(res.body.error.message).toBe('Base ISO 110 is not a marked ISO speed; use 100 or 125.');
    expect((await Test.findByPk(test.id))!.version).toBe(test.version);
  });

  it('saves a readout region and refuses one outside the frame', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const ok = await team.host.patch(`/api/tests/${test.id}`, { version: test.version, readoutRegion: { x: 0.4, y: 0.4, w: 0.2, h: 0.2 } }).expect(200);
    expect(ok.body.readoutRegion).toEqual({ x: 0.4, y: 0.4, w: 0.2, h: 0.2 });
    const bad = await team.host.patch(`/api/tests/${test.id}`, { version: ok.body.version, readoutRegion: { x: 0.9, y: 0, w: 0.2, h: 0.2 } }).expect(400);
    expect(bad.body.error.message).toMatch(/inside the frame/);
  });

  it('regenerates from saved inputs and deletes a test with everything under it', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const again = await team.host.post(`/api/tests/${test.id}/regenerate`, { version: test.version }).expect(200);
    expect(again.body.steps.map((s: { id: string }) => s.id)).toEqual(test.steps.map((s) => s.id));
    await team.host.delete(`/api/tests/${test.id}?version=${again.body.version}`).expect(204);
    expect(await TestStep.count({ where: { testId: test.id } })).toBe(0);
    expect(await SpecSheetLine.count({ where: { testId: test.id } })).toBe(0);
    expect((await Activity.findAll({ where: { subjectId: test.id }, order: [['id', 'ASC']] })).map((a) => a.action)).toEqual(['test.created', 'test.regenerated', 'test.deleted']);
  });
});

describe('spec sheet', () => {
  it('updates values and flags, adds and removes custom lines, keeps standard lines', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const body = test.specLines.find((l) => l.key === 'body')!;
    const upd = await team.host.patch(`/api/spec-lines/${body.id}`, { version: body.version, value: 'Korvala K9 Cine, firmware 0.9', checked: true, inDescription: false }).expect(200);
    expect(upd.body).toMatchObject({ value: 'Korvala K9 Cine, firmware 0.9', checked: true, inDescription: false, version: 2 });
    await team.host.patch(`/api/spec-lines/${body.id}`, { version: 1, value: 'older' }).expect(409);
    await team.host.patch(`/api/spec-lines/${body.id}`, { version: 2, label: 'Camera' }).expect(409);
    await team.host.delete(`/api/spec-lines/${body.id}?version=2`).expect(409);

    const added = await team.host.post(`/api/tests/${test.id}/spec-lines`, { label: 'Timecode', value: 'Free run', required: true }).expect(201);
    expect(added.body).toMatchObject({ label: 'Timecode', value: 'Free run', required: true, custom: true, position: 19 });
    const renamed = await team.host.patch(`/api/spec-lines/${added.body.id}`, { version: 1, label: 'Timecode source' }).expect(200);
    expect(renamed.body.label).toBe('Timecode source');
    await team.host.delete(`/api/spec-lines/${added.body.id}?version=${renamed.body.version}`).expect(204);
    expect(await SpecSheetLine.count({ where: { testId: test.id } })).toBe(19);
  });

  it('planFacts counts tests and lists required lines still empty, until they are filled', async () => {
    const ep = await makeEpisode(channelId);
    expect(await planFacts(ep.id)).toEqual({ testCount: 0, requiredSpecLinesEmpty: [] });
    const test = await sweep(ep.id, ISO_SWEEP_INPUT, 'Sweep A');
    const before = await planFacts(ep.id);
    expect(before.testCount).toBe(1);
    // Plan-filled lines (frame rate, shutter, aperture, ND, ISO) are already filled.
    expect(before.requiredSpecLinesEmpty).toContain('Sweep A: Body');
    expect(before.requiredSpecLinesEmpty).not.toContain('Sweep A: ISO');
    expect(before.requiredSpecLinesEmpty).not.toContain('Sweep A: Monitoring LUT');
    for (const line of test.specLines.filter((l) => l.required && !l.value)) {
      await team.host.patch(`/api/spec-lines/${line.id}`, { version: line.version, value: line.key === 'white_balance' ? '   ' : `filled ${line.key}` }).expect(200);
    }
    // Whitespace is not a value.
    expect((await planFacts(ep.id)).requiredSpecLinesEmpty).toEqual(['Sweep A: White balance']);
    const transaction = await ctx.sequelize.transaction();
    try {
      expect((await planFacts(ep.id, transaction)).testCount).toBe(1);
    } finally {
      await transaction.rollback();
    }
  });
});

describe('shooting a step', () => {
  it('marks a step shot with the actual settings, observation and rating; corrects and takes it back', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const step = test.steps[3];
    const actual = { iso: 800, fNumber: 5.6, shutterAngleDeg: 180, ndDensity: 0.6 };
    const shot = await team.host.post(`/api/steps/${step.id}/shot`, { version: step.version, actual, observation: 'Slight green cast, clean shadows', rating: 4 }).expect(200);
    expect(shot.body).toMatchObject({ actual: { ...actual, lightChangeStops: 0 }, observation: 'Slight green cast, clean shadows', rating: 4, version: step.version + 1 });
    expect(shot.body.shotBy.name).toBe('Test host');
    expect(Date.parse(shot.body.shotAt)).toBeGreaterThan(Date.now() - 60_000);

    await team.producer.post(`/api/steps/${step.id}/shot`, { version: step.version, actual }).expect(409);
    const corrected = await team.producer.post(`/api/steps/${step.id}/shot`, { version: shot.body.version, actual, observation: 'Green cast from the practical', rating: 3 }).expect(200);
    expect(corrected.body.shotAt).toBe(shot.body.shotAt);
    expect(corrected.body.shotBy.name).toBe('Test host');

    const badRating = await team.host.post(`/api/steps/${step.id}/shot`, { version: corrected.body.version, actual, rating: 6 }).expect(400);
    expect(badRating.body.error.message).toMatch(/Rating must be a whole number from 1 to 5/);
    await team.host.post(`/api/steps/${step.id}/shot`, { version: corrected.body.version, actual: { ...actual, shutterAngleDeg: 400 } }).expect(400);

    const note = await team.host.patch(`/api/steps/${step.id}`, { version: corrected.body.version, observation: 'Re-checked on the big monitor' }).expect(200);
    const undone = await team.host.delete(`/api/steps/${step.id}/shot?version=${note.body.version}`).expect(200);
    expect(undone.body).toMatchObject({ shotAt: null, actual: null, shotBy: null, observation: 'Re-checked on the big monitor' });
    await team.host.delete(`/api/steps/${step.id}/shot?version=${undone.body.version}`).expect(409);
    const actions = (await Activity.findAll({ where: { subjectId: step.id }, order: [['id', 'ASC']] })).map((a) => a.action);
    expect(actions).toEqual(['step.shot', 'step.shot_corrected', 'step.updated', 'step.unshot']);
  });
});

describe('lighting', () => {
  it('replaces circuits and fixtures, and refuses a fixture on an unknown circuit', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const res = await team.host
      .put(`/api/tests/${test.id}/lighting`, {
        version: test.version,
        circuits: [{ key: 'a', label: 'Wall A', volts: 230, breakerAmps: 16 }],
        fixtures: [
          { name: 'Panel 600', watts: 600, quantity: 2, circuitKey: 'a' },
          { name: 'Practical', watts: 60, circuitKey: null },
        ],
      })
      .expect(200);
    const t = res.body as TestDto;
    expect(t.lighting.circuits).toHaveLength(1);
    expect(t.lighting.fixtures.map((f) => [f.name, f.quantity, f.circuitId])).toEqual([['Panel 600', 2, t.lighting.circuits[0].id], ['Practical', 1, null]]);
    const bad = await team.host.put(`/api/tests/${test.id}/lighting`, { version: t.version, circuits: [], fixtures: [{ name: 'Lost', watts: 100, circuitKey: 'b' }] }).expect(400);
    expect(bad.body.error.message).toMatch(/"Lost" is on a circuit that is not in the list/);
  });
});

describe('lighting fills the spec sheet', () => {
  it('writes the Lighting line while it is empty or still the plan’s own text, and keeps a typed value', async () => {
    const ep = await makeEpisode(channelId);
    const test = await sweep(ep.id);
    const lightingOf = (t: TestDto) => t.specLines.find((l) => l.key === 'lighting')!;
    expect(lightingOf(test).value).toBe('');
    const put = (version: number, fixtures: unknown[]) =>
      team.host.put(`/api/tests/${test.id}/lighting`, { version, circuits: [{ key: 'a', label: 'A', volts: 230, breakerAmps: 16 }], fixtures }).expect(200);
    const first = (await put(test.version, [{ name: 'Fresnel', watts: 650, quantity: 2, circuitKey: 'a' }])).body as TestDto;
    expect(lightingOf(first).value).toBe('2 × Fresnel 650 W (circuit A) · 1.3 kW in all');
    // The plan changes: the line follows, since nobody edited it.
    const second = (await put(first.version, [{ name: 'Fresnel', watts: 650, circuitKey: 'a' }, { name: 'Practical', watts: 60, circuitKey: null }])).body as TestDto;
    expect(lightingOf(second).value).toBe('Fresnel 650 W (circuit A); Practical 60 W (no circuit yet) · 710 W in all');
    // Someone types their own: later plan changes leave it alone.
    const line = lightingOf(second);
    await team.host.patch(`/api/spec-lines/${line.id}`, { version: line.version, value: 'Window light, bounced' }).expect(200);
    const third = (await put(second.version, [{ name: 'Panel', watts: 200, circuitKey: 'a' }])).body as TestDto;
    expect(lightingOf(third).value).toBe('Window light, bounced');
  });
});

describe('shot list CSV', () => {
  it('exports every step with RFC 4180 quoting and defused formulas', async () => {
    const ep = await makeEpisode(channelId, 'K9: "noise", part 1');
    const test = await sweep(ep.id, ISO_SWEEP_INPUT, '=HYPERLINK("x")');
    await team.host.post(`/api/steps/${test.steps[0].id}/shot`, { version: 1, actual: { iso: 100, fNumber: 4, shutterAngleDeg: 180, ndDensity: 0 }, observation: 'Clean, "no" banding\nchart edge soft', rating: 5 }).expect(200);
    const res = await team.editor.get(`/api/episodes/${ep.id}/shot-list.csv`).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv; charset=utf-8/);
    expect(res.headers['content-disposition']).toBe('attachment; filename=shot-list-k9-noise-part-1.csv');
    const text = res.text;
    expect(text.startsWith('\uFEFFTest,Kind,Step,Label,ISO,')).toBe(true);
    const records = text.slice(1).split('\r\n');
    expect(records).toHaveLength(1 + 5 + 1); // header, five steps, empty after the final CRLF
    expect(records[1]).toBe(`"'=HYPERLINK(""x"")",ISO sweep,1,ISO 100,100,,0.0,f/4,180°,1/48 s,0,10,,,yes,100,f/4,180°,0.0,5,"Clean, ""no"" banding\nchart edge soft"`);
    expect(records[2].endsWith(',,,,,,,')).toBe(true);
  });
});

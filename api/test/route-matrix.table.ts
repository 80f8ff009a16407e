// The expected status of every API route per caller. Bodies for writes are chosen so that a
// caller who passes the access check gets a harmless, predictable answer (usually 400 from
// validation), never a change other rows depend on.
import { randomBytes } from 'node:crypto';
import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { Episode, EpisodeGear, Footage, Gear, UploadRecord } from '@midgray/db';
import type { Role } from '@midgray/shared';
import type { Client, TestContext } from './helpers.ts';
import { ISO_SWEEP_INPUT, makeEpisode } from './plan-fixtures.ts';
import { daysFromNow, proposedSlot, publishingEpisode } from './publishing-fixtures.ts';
import { readoutScene, storageOf } from './readout-fixtures.ts';

export type Caller = 'anon' | 'outsider' | Role;

export interface MatrixFixture {
  ctx: TestContext;
  channelId: string;
  hostMemberId: string;
  invitationId: string;
  team: Record<Role, Client>;
  /** Ids made by rows' setup functions. */
  [key: string]: unknown;
}

export interface MatrixRow {
  expect: Record<Caller, number>;
  params?: (fx: MatrixFixture) => Record<string, string>;
  body?: (fx: MatrixFixture) => unknown;
  setup?: (fx: MatrixFixture) => Promise<void>;
  /** For routes registered as ALL (the tus endpoint): the method and headers the matrix sends. */
  send?: { method: 'HEAD' | 'POST' | 'PATCH' | 'DELETE'; headers?: (fx: MatrixFixture) => Record<string, string> };
}

/** Expected statuses when only members with `allowed` roles pass; the others get 403. */
export function only(allowed: readonly Role[], ok: number, extra: Partial<Record<Caller, number>> = {}): Record<Caller, number> {
  const r = (role: Role) => (allowed.includes(role) ? ok : 403);
  return { anon: 401, outsider: 404, host: r('host'), editor: r('editor'), producer: r('producer'), admin: r('admin'), ...extra };
}
const everyone = (ok: number) => only(['host', 'editor', 'producer', 'admin'], ok);
const INVALID = { unknownField: true };
const NIL = '00000000-0000-4000-8000-000000000000';

const PLAN_EDIT = ['host', 'producer', 'admin'] as const;
/** An episode with one ISO sweep test; its ids go on the fixture for the plan rows. */
async function setupPlan(fx: MatrixFixture) {
  const episode = await makeEpisode(fx.channelId, 'Matrix plan episode');
  const created = await fx.team.host.post(`/api/episodes/${episode.id}/tests`, { kind: 'iso_sweep', name: 'Matrix sweep', inputs: ISO_SWEEP_INPUT });
  if (created.status !== 201) throw new Error(`matrix plan setup failed: ${created.status} ${JSON.stringify(created.body)}`);
  fx.planEpisodeId = episode.id;
  fx.planTestId = created.body.id;
  fx.planLineId = created.body.specLines[0].id;
  fx.planStepId = created.body.steps[0].id;
}

const DECIDE = ['producer', 'admin'] as const;
/** An episode in Approval with a proposed slot a week ahead; its ids go on the fixture for the publishing rows. */
async function setupPublishing(fx: MatrixFixture) {
  const episode = await publishingEpisode(fx.channelId, { title: 'Matrix publishing episode' });
  const slot = await proposedSlot(episode.id, daysFromNow(7), 'Europe/Berlin');
  fx.pubEpisodeId = episode.id;
  fx.pubSlotId = slot.id;
}
const pubEpisode = (fx: MatrixFixture) => ({ id: fx.pubEpisodeId as string });
const pubSlot = (fx: MatrixFixture) => ({ id: fx.pubSlotId as string });
const signedIn = (ok: number, anon: number) => ({ anon, outsider: ok, host: ok, editor: ok, producer: ok, admin: ok });

const EPISODE_WRITE = ['host', 'producer', 'admin'] as const;
const GEAR_MANAGE = ['producer', 'admin'] as const;
/** An episode in Plan using one gear item; their ids go on the fixture for the board rows. */
async function setupBoard(fx: MatrixFixture) {
  const gear = await Gear.create({ channelId: fx.channelId, kind: 'lens', make: 'Brightwell', model: 'Matrix 35', source: 'owned' });
  const episode = await Episode.create({ channelId: fx.channelId, title: 'Matrix board episode', stage: 'plan', position: 0 });
  await EpisodeGear.create({ episodeId: episode.id, gearId: gear.id });
  fx.boardEpisodeId = episode.id;
  fx.boardGearId = gear.id;
}
const boardEpisode = (fx: MatrixFixture) => ({ id: fx.boardEpisodeId as string });
const boardGear = (fx: MatrixFixture) => ({ id: fx.boardGearId as string });

const PICKUP = ['editor', 'producer', 'admin'] as const;
const ASSIGN = ['producer', 'admin'] as const;
/**
 * An episode with one received footage file (bytes and thumbnail on disk) and one unfinished
 * upload started by the host; their ids go on the fixture for the footage and upload rows.
 */
async function setupFootage(fx: MatrixFixture) {
  const storage = join(fx.ctx.mailboxDir, 'storage');
  const episode = await Episode.create({ channelId: fx.channelId, title: 'Matrix footage episode', stage: 'shoot', position: 0 });
  const base = { channelId: fx.channelId, episodeId: episode.id, kind: 'camera_original', originalName: 'A001_C001.mov' } as const;
  const doneId = randomBytes(16).toString('hex');
  const openId = randomBytes(16).toString('hex');
  const done = await Footage.create({ ...base, uploadId: doneId, status: 'verified', uploaderId: fx.team.host.userId, format: 'isobmff', sizeBytes: 8, storageKey: `uploads/${doneId}`, thumbnailKey: null });
  await done.update({ thumbnailKey: `thumbnails/${done.id}.jpg` });
  const open = await Footage.create({ ...base, uploadId: openId, status: 'receiving', uploaderId: fx.team.host.userId, format: 'isobmff', sizeBytes: 100, storageKey: `uploads/${openId}` });
  const later = new Date(Date.now() + 86_400_000);
  await UploadRecord.create({ ...base, id: doneId, ownerId: fx.team.host.userId, offset: 8, length: 8, expiresAt: later, completedAt: new Date(), footageId: done.id });
  await UploadRecord.create({ ...base, id: openId, ownerId: fx.team.host.userId, offset: 0, length: 100, expiresAt: later, footageId: open.id });
  await mkdir(join(storage, 'uploads'), { recursive: true });
  await mkdir(join(storage, 'thumbnails'), { recursive: true });
  await writeFile(join(storage, 'uploads', doneId), '\0\0\0\x08ftyp');
  await writeFile(join(storage, 'uploads', openId), '');
  await writeFile(join(storage, 'thumbnails', `${done.id}.jpg`), Buffer.from([0xff, 0xd8, 0xff, 0xd9]));
  fx.footageEpisodeId = episode.id;
  fx.footageId = done.id;
  fx.openUploadId = openId;
}
const footageRow = (fx: MatrixFixture) => ({ id: fx.footageId as string });
const tusMetadata = (fx: MatrixFixture) =>
  [['episodeId', fx.footageEpisodeId as string], ['kind', 'camera_original'], ['filename', 'A002_C001.mov']].map(([k, v]) => `${k} ${Buffer.from(v).toString('base64')}`).join(',');

const READOUT_RUN = ['editor', 'admin'] as const;
/** Two ISO sweeps, a frame grab on the first step and a done readout with its images (issue 6). */
async function setupReadouts(fx: MatrixFixture) {
  const scene = await readoutScene({ channelId: fx.channelId, host: fx.team.host, storageDir: storageOf(fx.ctx), title: 'Matrix readouts episode' });
  fx.readouts = scene;
}
const ro = (fx: MatrixFixture) => fx.readouts as Awaited<ReturnType<typeof readoutScene>>;

export const MATRIX: Record<string, MatrixRow> = {
  'GET /api/health': { expect: { anon: 200, outsider: 200, host: 200, editor: 200, producer: 200, admin: 200 } },
  'GET /api/auth/github': { expect: { anon: 302, outsider: 302, host: 302, editor: 302, producer: 302, admin: 302 } },
  // Without a code the provider strategy restarts the flow (302 to the provider).
  'GET /api/auth/github/callback': { expect: { anon: 302, outsider: 302, host: 302, editor: 302, producer: 302, admin: 302 } },
  'GET /api/auth/me': { expect: { anon: 200, outsider: 200, host: 200, editor: 200, producer: 200, admin: 200 } },
  'GET /api/auth/csrf': { expect: { anon: 200, outsider: 200, host: 200, editor: 200, producer: 200, admin: 200 } },
  // A write without a session has no CSRF token: 403 before anything else. The matrix runs
  // this row last, since it really signs each caller out.
  'POST /api/auth/logout': { expect: { anon: 403, outsider: 204, host: 204, editor: 204, producer: 204, admin: 204 } },
  'POST /api/channels': { expect: { anon: 403, outsider: 400, host: 400, editor: 400, producer: 400, admin: 400 }, body: () => INVALID },
  'GET /api/channels/:channelId': { expect: everyone(200) },
  'PATCH /api/channels/:channelId': { expect: only(['admin'], 400, { anon: 403 }), body: () => INVALID },
  'GET /api/channels/:channelId/members': { expect: everyone(200) },
  'PATCH /api/channels/:channelId/members/:memberId': {
    expect: only(['admin'], 400, { anon: 403 }),
    params: (fx) => ({ channelId: fx.channelId, memberId: fx.hostMemberId }),
    body: () => ({ role: 'janitor' }),
  },
  'DELETE /api/channels/:channelId/members/:memberId': {
    // An admin reaches the service, which answers 404 for an id that is not a member.
    expect: only(['admin'], 404, { anon: 403 }),
    params: (fx) => ({ channelId: fx.channelId, memberId: NIL }),
  },
  'GET /api/channels/:channelId/invitations': { expect: only(['admin'], 200) },
  'POST /api/channels/:channelId/invitations': { expect: only(['admin'], 400, { anon: 403 }), body: () => ({ email: 'not-an-address', role: 'editor' }) },
  'DELETE /api/channels/:channelId/invitations/:invitationId': {
    expect: only(['admin'], 404, { anon: 403 }),
    params: (fx) => ({ channelId: fx.channelId, invitationId: NIL }),
  },
  'GET /api/dev/mailbox': { expect: { anon: 200, outsider: 200, host: 200, editor: 200, producer: 200, admin: 200 } },
  'GET /api/dev/mailbox/:id/html': { expect: { anon: 404, outsider: 404, host: 404, editor: 404, producer: 404, admin: 404 }, params: () => ({ id: 'nope' }) },
  // Test plans (issue 4): a test with its lines and steps is made once by the setup below.
  'GET /api/episodes/:id/tests': { expect: everyone(200), params: (fx) => ({ id: fx.planEpisodeId as string }), setup: setupPlan },
  'POST /api/episodes/:id/tests': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planEpisodeId as string }), body: () => INVALID },
  'GET /api/episodes/:id/shot-list.csv': { expect: everyone(200), params: (fx) => ({ id: fx.planEpisodeId as string }) },
  'GET /api/tests/:id': { expect: everyone(200), params: (fx) => ({ id: fx.planTestId as string }) },
  'PATCH /api/tests/:id': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planTestId as string }), body: () => INVALID },
  // Without ?version= an allowed caller gets 400 from validation.
  'DELETE /api/tests/:id': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planTestId as string }) },
  'POST /api/tests/:id/regenerate': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planTestId as string }), body: () => INVALID },
  'PUT /api/tests/:id/lighting': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planTestId as string }), body: () => INVALID },
  'POST /api/tests/:id/spec-lines': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planTestId as string }), body: () => INVALID },
  'PATCH /api/spec-lines/:id': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planLineId as string }), body: () => INVALID },
  'DELETE /api/spec-lines/:id': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planLineId as string }) },
  'PATCH /api/steps/:id': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planStepId as string }), body: () => INVALID },
  'POST /api/steps/:id/shot': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planStepId as string }), body: () => INVALID },
  'DELETE /api/steps/:id/shot': { expect: only(PLAN_EDIT, 400, { anon: 403 }), params: (fx) => ({ id: fx.planStepId as string }) },
  // Publishing (issue 7): description, slots, approval queue, calendar and feed, profile.
  'GET /api/episodes/:id/description': { expect: everyone(200), params: pubEpisode, setup: setupPublishing },
  'PUT /api/episodes/:id/description': { expect: only(['host', 'editor', 'producer', 'admin'], 400, { anon: 403 }), params: pubEpisode, body: () => INVALID },
  'GET /api/episodes/:id/description/versions': { expect: everyone(200), params: pubEpisode },
  'POST /api/episodes/:id/description/versions/:versionId/restore': { expect: only(['host', 'editor', 'producer', 'admin'], 400, { anon: 403 }), params: (fx) => ({ id: fx.pubEpisodeId as string, versionId: NIL }), body: () => INVALID },
  'POST /api/episodes/:id/description/chapters/parse': { expect: only(['host', 'editor', 'producer', 'admin'], 200, { anon: 403 }), params: pubEpisode, body: () => ({ text: '0:00 Intro\n1:30 ISO sweep' }) },
  'POST /api/episodes/:id/description/preview': { expect: only(['host', 'editor', 'producer', 'admin'], 200, { anon: 403 }), params: pubEpisode, body: () => ({ summary: 'Matrix', chapters: [], gearLinks: [], disclosure: '' }) },
  'GET /api/episodes/:id/schedule': { expect: everyone(200), params: pubEpisode },
  'POST /api/episodes/:id/slots': { expect: only(['host', 'editor', 'producer', 'admin'], 400, { anon: 403 }), params: pubEpisode, body: () => INVALID },
  'POST /api/slots/:id/approve': { expect: only(DECIDE, 400, { anon: 403 }), params: pubSlot, body: () => INVALID },
  'POST /api/slots/:id/reject': { expect: only(DECIDE, 400, { anon: 403 }), params: pubSlot, body: () => ({}) },
  'POST /api/episodes/:id/live': { expect: only(DECIDE, 400, { anon: 403 }), params: pubEpisode, body: () => INVALID },
  'GET /api/channels/:channelId/approvals': { expect: only(DECIDE, 200) },
  // The query string rides on the path parameter: the matrix has no query of its own.
  'GET /api/channels/:channelId/calendar': { expect: everyone(200), params: (fx) => ({ channelId: `${fx.channelId}?from=2026-01-01&to=2026-03-31` }) },
  // Public, the secret is the credential: an unknown token is 404 for everyone.
  'GET /api/calendar/:token.ics': { expect: { anon: 404, outsider: 404, host: 404, editor: 404, producer: 404, admin: 404 }, params: () => ({ token: 'not-a-feed-token-but-long-enough' }) },
  'GET /api/me/profile': { expect: signedIn(200, 401) },
  'PUT /api/me/email-preferences': { expect: signedIn(400, 403), body: () => INVALID },
  'POST /api/me/calendar-feed': { expect: signedIn(201, 403) },
  'DELETE /api/me/calendar-feed': { expect: signedIn(204, 403) },
  // The board, episodes and gear (issue 3): one episode using one gear item, made by the setup below.
  'GET /api/channels/:channelId/board': { expect: everyone(200), setup: setupBoard },
  'POST /api/channels/:channelId/episodes': { expect: only(EPISODE_WRITE, 400, { anon: 403 }), body: () => INVALID },
  'GET /api/channels/:channelId/episodes/archived': { expect: everyone(200) },
  'GET /api/episodes/:id': { expect: everyone(200), params: boardEpisode },
  'PATCH /api/episodes/:id': { expect: only(EPISODE_WRITE, 400, { anon: 403 }), params: boardEpisode, body: () => INVALID },
  // Every member may ask for a move; the stage rules answer (422) once the body is valid.
  'POST /api/episodes/:id/move': { expect: { ...everyone(400), anon: 403 }, params: boardEpisode, body: () => INVALID },
  'POST /api/episodes/:id/archive': { expect: only(EPISODE_WRITE, 400, { anon: 403 }), params: boardEpisode, body: () => INVALID },
  'POST /api/episodes/:id/unarchive': { expect: only(EPISODE_WRITE, 400, { anon: 403 }), params: boardEpisode, body: () => INVALID },
  'GET /api/channels/:channelId/gear': { expect: everyone(200) },
  'POST /api/channels/:channelId/gear': { expect: only(GEAR_MANAGE, 400, { anon: 403 }), body: () => INVALID },
  'PATCH /api/gear/:id': { expect: only(GEAR_MANAGE, 400, { anon: 403 }), params: boardGear, body: () => INVALID },
  // The item is used by the setup's episode, so a manager is told to archive it instead (409).
  'DELETE /api/gear/:id': { expect: only(GEAR_MANAGE, 409, { anon: 403 }), params: boardGear },
  'GET /api/episodes/:id/footage': { expect: everyone(200), params: (fx) => ({ id: fx.footageEpisodeId as string }), setup: setupFootage },
  'GET /api/footage/:id': { expect: everyone(200), params: footageRow },
  'POST /api/footage/:id/pickup': { expect: only(PICKUP, 400, { anon: 403 }), params: footageRow, body: () => INVALID },
  'POST /api/footage/:id/release': { expect: only(['host', 'editor', 'producer', 'admin'], 400, { anon: 403 }), params: footageRow, body: () => INVALID },
  'POST /api/footage/:id/reassign': { expect: only(ASSIGN, 400, { anon: 403 }), params: footageRow, body: () => INVALID },
  'GET /api/footage/:id/download': { expect: everyone(200), params: footageRow },
  'GET /api/footage/:id/thumbnail': { expect: everyone(200), params: footageRow },
  'PUT /api/upload-checksums/:uploadId': { expect: only(['host', 'editor', 'producer', 'admin'], 400, { anon: 403 }), params: (fx) => ({ uploadId: fx.openUploadId as string }), body: () => INVALID },
  // tus creation with a length over the limit: members reach the size check (413), nothing is stored.
  'ALL /api/uploads': {
    expect: everyone(413),
    send: { method: 'POST', headers: (fx) => ({ 'Tus-Resumable': '1.0.0', 'Upload-Length': String(2 ** 50), 'Upload-Metadata': tusMetadata(fx) }) },
  },
  // tus HEAD of the host's unfinished upload: only its owner may read or continue it.
  'ALL /api/uploads/:uploadId': {
    expect: { anon: 401, outsider: 404, host: 200, editor: 403, producer: 403, admin: 403 },
    params: (fx) => ({ uploadId: fx.openUploadId as string }),
    send: { method: 'HEAD', headers: () => ({ 'Tus-Resumable': '1.0.0' }) },
  },
  // Readouts (issue 6): members read; editors and admins ('readout.run') run readouts and set the region.
  'GET /api/episodes/:id/readouts': { expect: everyone(200), params: (fx) => ({ id: ro(fx).episodeId }), setup: setupReadouts },
  'GET /api/tests/:id/readouts': { expect: everyone(200), params: (fx) => ({ id: ro(fx).testId }) },
  'GET /api/tests/:id/readouts.csv': { expect: everyone(200), params: (fx) => ({ id: ro(fx).testId }) },
  'POST /api/tests/:id/readouts': { expect: only(READOUT_RUN, 400, { anon: 403 }), params: (fx) => ({ id: ro(fx).testId }), body: () => INVALID },
  'POST /api/steps/:id/readouts': { expect: only(READOUT_RUN, 400, { anon: 403 }), params: (fx) => ({ id: ro(fx).stepId }), body: () => INVALID },
  'PUT /api/tests/:id/readout-region': { expect: only(READOUT_RUN, 400, { anon: 403 }), params: (fx) => ({ id: ro(fx).testId }), body: () => INVALID },
  'GET /api/steps/:id/frame.jpg': { expect: everyone(200), params: (fx) => ({ id: ro(fx).stepId }) },
  'GET /api/readouts/:id/difference-map.png': { expect: everyone(200), params: (fx) => ({ id: ro(fx).readoutId }) },
  'GET /api/readouts/:id/frame.jpg': { expect: everyone(200), params: (fx) => ({ id: ro(fx).readoutId }) },
  'GET /api/readouts/:id/reference-frame.jpg': { expect: everyone(200), params: (fx) => ({ id: ro(fx).readoutId }) },
  'GET /api/channels/:channelId/readouts/tests': { expect: everyone(200) },
  // The query string rides on the path parameter, as for the calendar.
  'GET /api/channels/:channelId/readouts/compare': { expect: everyone(200), params: (fx) => ({ channelId: `${fx.channelId}?tests=${ro(fx).testId},${ro(fx).otherTestId}` }) },
};

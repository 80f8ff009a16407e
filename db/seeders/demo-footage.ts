// Demo footage on the K7 re-test (in grade): camera originals of the first ISO steps, one held by
// the editor, one flagged because it was recorded in HD, and a graded render. Every value is
// invented; the demo has no bytes for them (a download says the file is missing from storage).
import { randomBytes } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { compareProbeWithSpec, PROBE_COMPARED_KEYS, type FootageKind, type ProbeSummary } from '@midgray/shared';
import { Activity, Footage, UploadRecord } from '../src/index.ts';
import type { DemoStep } from './demo.ts';

const hex = (n: number) => randomBytes(n).toString('hex');
const DAY = 86_400_000;

const uhd: ProbeSummary = {
  container: 'mov,mp4,m4a,3gp,3g2,mj2',
  codec: 'hevc',
  codecLongName: 'H.265 / HEVC (High Efficiency Video Coding)',
  profile: 'Main 10',
  width: 3840,
  height: 2160,
  frameRate: '25/1',
  fps: 25,
  bitDepth: 10,
  chromaSubsampling: '4:2:0',
  pixelFormat: 'yuv420p10le',
  durationSeconds: 6.04,
  bitrateBitsPerSecond: 151_200_000,
  timecode: '14:02:11:00',
  audioStreams: 1,
};

export const demoFootage: DemoStep = async (ctx) => {
  const { sequelize, transaction, channelId, now } = ctx;
  const episodeId = ctx.episodes.k7iso;
  if (!episodeId) return;
  const steps = await sequelize.query<{ id: string; label: string; test_id: string }>(
    `SELECT s.id, s.label, s.test_id FROM test_steps s JOIN tests t ON t.id = s.test_id WHERE t.episode_id = :episodeId ORDER BY t.position, s.index LIMIT 3`,
    { replacements: { episodeId }, type: QueryTypes.SELECT, transaction },
  );
  if (steps.length < 3) return;
  const lines = await sequelize.query<{ key: string; value: string }>('SELECT key, value FROM spec_sheet_lines WHERE test_id = :testId AND key IN (:keys)', {
    replacements: { testId: steps[0].test_id, keys: [...PROBE_COMPARED_KEYS] },
    type: QueryTypes.SELECT,
    transaction,
  });
  const [{ name: testName }] = await sequelize.query<{ name: string }>('SELECT name FROM tests WHERE id = :id', { replacements: { id: steps[0].test_id }, type: QueryTypes.SELECT, transaction });
  const sheet = Object.fromEntries(lines.map((l) => [l.key, l.value]));
  const host = ctx.people['ilse.marrow'];
  const editor = ctx.people['dario.fenwick'];
  const files: { name: string; kind: FootageKind; step: number | null; probe: ProbeSummary; size: number; by: string; daysAgo: number; heldBy?: string }[] = [
    { name: 'K7_A014_C001_ISO400.mp4', kind: 'camera_original', step: 0, probe: uhd, size: 114_231_552, by: host, daysAgo: 4 },
    { name: 'K7_A014_C002_ISO500.mp4', kind: 'camera_original', step: 1, probe: { ...uhd, timecode: '14:03:02:00' }, size: 113_904_128, by: host, daysAgo: 4, heldBy: editor },
    // Recorded in HD by mistake: the probe flags it against the sheet's 3840×2160.
    { name: 'K7_A014_C003_ISO640.mp4', kind: 'camera_original', step: 2, probe: { ...uhd, width: 1920, height: 1080, bitrateBitsPerSecond: 50_300_000, timecode: '14:03:40:00' }, size: 38_010_880, by: host, daysAgo: 4 },
    { name: 'K7_sweep_grade_v1.mp4', kind: 'graded_render', step: null, probe: { ...uhd, codec: 'h264', codecLongName: 'H.264 / AVC / MPEG-4 AVC / MPEG-4 part 10', profile: 'High', bitDepth: 8, pixelFormat: 'yuv420p', durationSeconds: 84.2, bitrateBitsPerSecond: 40_000_000, timecode: null }, size: 421_003_264, by: editor, daysAgo: 1 },
  ];
  for (const f of files) {
    const uploadId = hex(16);
    const at = new Date(+now - f.daysAgo * DAY);
    const cmp = compareProbeWithSpec(f.probe, sheet, f.kind);
    const sha = hex(32);
    const row = await Footage.create(
      {
        channelId,
        episodeId,
        stepId: f.step === null ? null : steps[f.step].id,
        uploadId,
        kind: f.kind,
        status: cmp.mismatches.length ? 'flagged' : 'verified',
        uploaderId: f.by,
        originalName: f.name,
        format: 'isobmff',
        sizeBytes: f.size,
        storageKey: `uploads/${uploadId}`,
        clientSha256: sha,
        serverSha256: sha,
        probe: { ...f.probe, spec: { testName, skipped: cmp.skipped } },
        specMismatches: cmp.mismatches,
        heldById: f.heldBy ?? null,
        heldSince: f.heldBy ? new Date(+now - 2 * DAY) : null,
        checkedAt: new Date(+at + 60_000),
        createdAt: at,
      },
      { transaction },
    );
    await UploadRecord.create(
      { id: uploadId, ownerId: f.by, channelId, episodeId, stepId: row.stepId, kind: f.kind, originalName: f.name, offset: f.size, length: f.size, metadata: {}, clientSha256: sha, expiresAt: new Date(+at + 3 * DAY), completedAt: at, footageId: row.id, createdAt: at },
      { transaction },
    );
    await Activity.create({ channelId, actorId: f.by, subjectType: 'footage', subjectId: row.id, episodeId, action: 'footage.received', toValue: 'received', details: { kind: f.kind, name: f.name, sizeBytes: f.size } }, { transaction });
    await Activity.create(
      { channelId, actorId: null, subjectType: 'footage', subjectId: row.id, episodeId, action: `footage.${row.status}`, fromValue: 'received', toValue: row.status, reason: cmp.mismatches.length === 1 ? '1 value differs from the spec sheet' : cmp.mismatches.length ? `${cmp.mismatches.length} values differ from the spec sheet` : null, details: { mismatches: cmp.mismatches } },
      { transaction },
    );
    if (f.heldBy) await Activity.create({ channelId, actorId: f.heldBy, subjectType: 'footage', subjectId: row.id, episodeId, action: 'footage.picked_up', toValue: f.heldBy, details: {} }, { transaction });
  }
};

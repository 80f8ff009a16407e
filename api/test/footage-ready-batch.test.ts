// "Footage ready" mails, batched: an app of its own with a one-second window (the other tests mail at once).
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { channelWithTeam, startTestApp, type TestContext } from './helpers.ts';
import { publishingEpisode } from './publishing-fixtures.ts';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp({ env: { FOOTAGE_READY_BATCH_SECONDS: '1' } });
});
afterAll(() => ctx?.close());

describe('footage ready, batched', () => {
  it('files of one episode verified within the window reach each editor in one mail', async () => {
    const t = await channelWithTeam(ctx);
    const ep = await publishingEpisode(t.channelId, { stage: 'shoot', hostId: t.team.host.userId, editorId: t.team.editor.userId, title: 'Batched footage' });
    const ready = (name: string) => ctx.built.footage.events.emitReady({ footageId: ep.id, channelId: t.channelId, episodeId: ep.id, kind: 'camera_original', originalName: name, uploaderId: null });
    await ready('A001_C001.mov');
    await ready('A001_C002.mov');
    await ready('A001_C003.mov');
    const toEditor = async () => (await ctx.mails()).filter((m) => m.to.includes(t.team.editor.email));
    expect(await toEditor()).toEqual([]);
    await vi.waitFor(async () => expect(await toEditor()).toHaveLength(1), { timeout: 5000, interval: 100 });
    const [mail] = await toEditor();
    expect(mail.text).toContain('3 files are ready for pickup');
    expect(mail.text).toContain('A001_C001.mov (camera original), A001_C002.mov (camera original), A001_C003.mov (camera original)');
    // Nothing more comes for those files.
    await new Promise((r) => setTimeout(r, 1500));
    expect(await toEditor()).toHaveLength(1);
  });
});

// Records for the publishing tests and the route matrix, made straight in the database (the board
// and gear APIs are other features'): episodes in a given stage, gear with embargoes, slots.
import { Episode, EpisodeGear, Gear, PublishSlot } from '@midgray/db';

/** An episode of `channelId` in `stage`, at the end of that column, optionally with a host and editor. */
export async function publishingEpisode(channelId: string, opts: { title?: string; stage?: Episode['stage']; hostId?: string; editorId?: string; shootDate?: string } = {}) {
  const stage = opts.stage ?? 'approval';
  const position = await Episode.count({ where: { channelId, stage } });
  return Episode.create({
    channelId,
    title: opts.title ?? 'Publishing test episode',
    stage,
    position,
    hostId: opts.hostId ?? null,
    editorId: opts.editorId ?? null,
    shootDate: opts.shootDate ?? null,
  });
}

/** A gear item (make "Korvala", fictional) attached to `episodeId`. */
export async function attachGear(
  channelId: string,
  episodeId: string,
  g: { model?: string; source?: Gear['source']; sponsored?: boolean; embargoAt?: string; embargoZone?: string; dueBackOn?: string },
) {
  const gear = await Gear.create({
    channelId,
    kind: 'body',
    make: 'Korvala',
    model: g.model ?? 'K9 Cine',
    source: g.source ?? 'owned',
    sponsored: g.sponsored ?? false,
    embargoAt: g.embargoAt ? new Date(g.embargoAt) : null,
    embargoZone: g.embargoZone ?? null,
    dueBackOn: g.dueBackOn ?? null,
  });
  await EpisodeGear.create({ episodeId, gearId: gear.id });
  return gear;
}

/** A proposed slot of `episodeId` at `startsAt` (ISO) entered in `zone`. */
export async function proposedSlot(episodeId: string, startsAt: string, zone = 'UTC', proposedById: string | null = null) {
  return PublishSlot.create({ episodeId, startsAt: new Date(startsAt), zone, status: 'proposed', proposedById });
}

/** An ISO instant `days` from now, at a whole minute. */
export function daysFromNow(days: number): string {
  const ms = Date.now() + days * 86_400_000;
  return new Date(Math.floor(ms / 60_000) * 60_000).toISOString();
}

// The calendar: publish slots (proposed and approved), embargo lifts, gear due-back dates and shoot
// days, for the Calendar page (one channel) and for each user's private iCalendar feed (every channel
// they belong to). The feed is RFC 5545 text written by the `ics` package; timed events are written
// as UTC instants ("…Z"), which every calendar app shows in its own zone, so no VTIMEZONE is needed.
import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';
import { createEvents, type EventAttributes } from 'ics';
import { QueryTypes, type Sequelize } from 'sequelize';
import { User } from '@midgray/db';
import { CALENDAR_EVENT_LABELS, formatInstantWithZoneName, type CalendarEvent, type CalendarFeedCreated } from '@midgray/shared';
import { AppError } from '../../errors.ts';
import { episodeUrl } from '../../mail/notifications.ts';

const DAY_MS = 86_400_000;
/** How far back and ahead the feed reaches, in days. */
export const FEED_DAYS_BACK = 90;
export const FEED_DAYS_AHEAD = 400;
/** Minutes a publish slot and an embargo lift occupy in a calendar app (an instant has no length). */
const SLOT_MINUTES = 30;
const EMBARGO_MINUTES = 15;

const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** SHA-256 (hex) of a feed secret: what users.calendar_token stores. */
export const hashFeedToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

/** The calendar of channels, and each user's feed. */
export class CalendarService {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly publicUrl: string,
  ) {}

  /**
   * Events of `channelIds` between the dates `from` and `to` (inclusive). Instants are widened by a
   * day each side, so a viewer in any zone gets every event that falls on those days for them.
   */
  async events(channelIds: string[], from: string, to: string): Promise<CalendarEvent[]> {
    if (channelIds.length === 0) return [];
    const start = new Date(Date.parse(`${from}T00:00:00Z`) - DAY_MS);
    const end = new Date(Date.parse(`${to}T00:00:00Z`) + 2 * DAY_MS);
    const r = { channelIds, start, end, from, to };
    const [slots, embargoes, dueBack, shoots] = await Promise.all([
      this.sequelize.query<{ id: string; status: 'proposed' | 'approved'; starts_at: Date; zone: string; episode_id: string; title: string; channel_id: string; channel_name: string }>(
        `SELECT s.id, s.status, s.starts_at, s.zone, e.id AS episode_id, e.title, c.id AS channel_id, c.name AS channel_name
           FROM publish_slots s JOIN episodes e ON e.id = s.episode_id JOIN channels c ON c.id = e.channel_id
          WHERE e.channel_id IN (:channelIds) AND e.archived_at IS NULL AND s.status IN ('proposed','approved')
            AND s.starts_at >= :start AND s.starts_at < :end`,
        { replacements: r, type: QueryTypes.SELECT },
      ),
      this.sequelize.query<{ id: string; make: string; model: string; embargo_at: Date; embargo_zone: string; channel_id: string; channel_name: string; episode_id: string | null }>(
        `SELECT g.id, g.make, g.model, g.embargo_at, g.embargo_zone, c.id AS channel_id, c.name AS channel_name, ep.episode_id
           FROM gear g JOIN channels c ON c.id = g.channel_id
           LEFT JOIN LATERAL (SELECT e.id AS episode_id FROM episode_gear eg JOIN episodes e ON e.id = eg.episode_id
                               WHERE eg.gear_id = g.id AND e.archived_at IS NULL ORDER BY e.created_at, e.id LIMIT 1) ep ON true
          WHERE g.channel_id IN (:channelIds) AND g.archived_at IS NULL AND g.embargo_at >= :start AND g.embargo_at < :end`,
        { replacements: r, type: QueryTypes.SELECT },
      ),
      this.sequelize.query<{ id: string; make: string; model: string; due_back_on: string; channel_id: string; channel_name: string; episode_id: string | null }>(
        `SELECT g.id, g.make, g.model, g.due_back_on::text AS due_back_on, c.id AS channel_id, c.name AS channel_name, ep.episode_id
           FROM gear g JOIN channels c ON c.id = g.channel_id
           LEFT JOIN LATERAL (SELECT e.id AS episode_id FROM episode_gear eg JOIN episodes e ON e.id = eg.episode_id
                               WHERE eg.gear_id = g.id AND e.archived_at IS NULL ORDER BY e.created_at, e.id LIMIT 1) ep ON true
          WHERE g.channel_id IN (:channelIds) AND g.archived_at IS NULL AND g.due_back_on BETWEEN :from::date AND :to::date`,
        { replacements: r, type: QueryTypes.SELECT },
      ),
      this.sequelize.query<{ id: string; title: string; shoot_date: string; channel_id: string; channel_name: string }>(
        `SELECT e.id, e.title, e.shoot_date::text AS shoot_date, c.id AS channel_id, c.name AS channel_name
           FROM episodes e JOIN channels c ON c.id = e.channel_id
          WHERE e.channel_id IN (:channelIds) AND e.archived_at IS NULL AND e.shoot_date BETWEEN :from::date AND :to::date`,
        { replacements: r, type: QueryTypes.SELECT },
      ),
    ]);
    const events: CalendarEvent[] = [
      ...slots.map((s) => ({
        id: `slot-${s.id}`,
        kind: s.status === 'approved' ? ('slot_approved' as const) : ('slot_proposed' as const),
        title: s.title,
        channelId: s.channel_id,
        channelName: s.channel_name,
        episodeId: s.episode_id,
        gearId: null,
        at: new Date(s.starts_at).toISOString(),
        zone: s.zone,
        date: null,
      })),
      ...embargoes.map((g) => ({
        id: `embargo-${g.id}`,
        kind: 'embargo_lift' as const,
        title: `${g.make} ${g.model}`,
        channelId: g.channel_id,
        channelName: g.channel_name,
        episodeId: g.episode_id,
        gearId: g.id,
        at: new Date(g.embargo_at).toISOString(),
        zone: g.embargo_zone,
        date: null,
      })),
      ...dueBack.map((g) => ({
        id: `due-${g.id}`,
        kind: 'gear_due_back' as const,
        title: `${g.make} ${g.model}`,
        channelId: g.channel_id,
        channelName: g.channel_name,
        episodeId: g.episode_id,
        gearId: g.id,
        at: null,
        zone: null,
        date: g.due_back_on,
      })),
      ...shoots.map((e) => ({
        id: `shoot-${e.id}`,
        kind: 'shoot_day' as const,
        title: e.title,
        channelId: e.channel_id,
        channelName: e.channel_name,
        episodeId: e.id,
        gearId: null,
        at: null,
        zone: null,
        date: e.shoot_date,
      })),
    ];
    // Chronological: a whole-day event sorts at the start of its day (UTC), then by kind and id.
    const key = (e: CalendarEvent) => (e.at ? Date.parse(e.at) : Date.parse(`${e.date}T00:00:00Z`));
    return events.sort((a, b) => key(a) - key(b) || a.kind.localeCompare(b.kind) || a.id.localeCompare(b.id));
  }

  /** Makes (or replaces) the user's feed secret; returns the feed URL once. The old URL stops working. */
  async resetFeed(userId: string, now = new Date()): Promise<CalendarFeedCreated> {
    const token = randomBytes(32).toString('base64url');
    const [count] = await User.update({ calendarToken: hashFeedToken(token), calendarTokenCreatedAt: now }, { where: { id: userId } });
    if (count !== 1) throw new AppError('not_found', 'User not found');
    return { url: new URL(`/api/calendar/${token}.ics`, this.publicUrl).toString(), createdAt: now.toISOString() };
  }

  /** Turns the user's feed off: the URL stops working. */
  async disableFeed(userId: string): Promise<void> {
    await User.update({ calendarToken: null, calendarTokenCreatedAt: null }, { where: { id: userId } });
  }

  /** The user whose feed secret is `token`, or null. The stored hash is compared in constant time. */
  async userForFeedToken(token: string): Promise<{ id: string; name: string } | null> {
    if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
    const hash = hashFeedToken(token);
    const user = await User.findOne({ where: { calendarToken: hash } });
    if (!user?.calendarToken) return null;
    const a = Buffer.from(user.calendarToken, 'hex');
    const b = Buffer.from(hash, 'hex');
    return a.length === b.length && timingSafeEqual(a, b) ? { id: user.id, name: user.name } : null;
  }

  /** The RFC 5545 text of a user's feed: every channel they belong to, 90 days back to 400 ahead. */
  async feed(user: { id: string; name: string }, now = new Date()): Promise<string> {
    const channels = await this.sequelize.query<{ channel_id: string }>('SELECT channel_id FROM memberships WHERE user_id = :userId', {
      replacements: { userId: user.id },
      type: QueryTypes.SELECT,
    });
    const from = isoDay(+now - FEED_DAYS_BACK * DAY_MS);
    const to = isoDay(+now + FEED_DAYS_AHEAD * DAY_MS);
    const events = await this.events(channels.map((c) => c.channel_id), from, to);
    const attributes = events.map((e) => this.toIcs(e));
    const { error, value } = createEvents(attributes, { productId: '-//Midgray//Publishing calendar//EN', method: 'PUBLISH', calName: `Midgray – ${user.name}` });
    if (error || !value) throw new Error(`calendar feed could not be written: ${error?.message ?? 'empty'}`);
    return value;
  }

  private toIcs(e: CalendarEvent): EventAttributes {
    const label = CALENDAR_EVENT_LABELS[e.kind];
    const url = e.episodeId ? episodeUrl(this.publicUrl, e.episodeId, e.kind.startsWith('slot') ? 'schedule' : undefined) : new URL('/gear', this.publicUrl).toString();
    const common = {
      uid: `${e.id}@midgray`,
      title: `${label}: ${e.title}`,
      description: [
        `${label} — ${e.channelName}`,
        ...(e.at && e.zone ? [`Entered as ${formatInstantWithZoneName(e.at, e.zone)}`] : []),
        `Open in Midgray: ${url}`,
      ].join('\n'),
      url,
      categories: [label, e.channelName],
      status: e.kind === 'slot_proposed' ? ('TENTATIVE' as const) : ('CONFIRMED' as const),
      transp: 'TRANSPARENT' as const,
    };
    if (e.at) {
      return {
        ...common,
        start: Date.parse(e.at),
        startInputType: 'utc',
        startOutputType: 'utc',
        duration: { minutes: e.kind === 'embargo_lift' ? EMBARGO_MINUTES : SLOT_MINUTES },
      };
    }
    // A whole day: DTSTART;VALUE=DATE and an exclusive DTEND the next day (RFC 5545 §3.6.1).
    const day = Date.parse(`${e.date}T00:00:00Z`);
    const parts = (ms: number): [number, number, number] => {
      const d = new Date(ms);
      return [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate()];
    };
    return { ...common, start: parts(day), end: parts(day + DAY_MS) };
  }
}

// The notification e-mails (issue #7). Each kind goes to the people who act on it, one message per
// person, both parts laid out by `layoutMail`, with the channel's name, a link to the episode and a
// footer pointing at the profile, where each kind can be switched off. Opted-out users get nothing
// of that kind. Mail is sent after the change committed; a failed send is logged, never rolled back.
import { QueryTypes, type Sequelize } from 'sequelize';
import { formatInstantWithZoneName, MAIL_KIND_TEXT, type MailKind, type Role } from '@midgray/shared';
import { layoutMail, type Mailer } from './mailer.ts';

/** What sending a notification needs; app.ts builds it once. */
export interface MailDeps {
  sequelize: Sequelize;
  mailer: Mailer;
  /** Public origin for links, e.g. http://127.0.0.1:4100 */
  publicUrl: string;
}

/** A person a notification may go to. */
interface Recipient {
  userId: string;
  name: string;
  email: string;
  optOuts: string[];
  role: Role | null;
}

/** Where the episode page is: the link every notification carries. */
export const episodeUrl = (publicUrl: string, episodeId: string, tab?: string) =>
  new URL(`/episodes/${episodeId}${tab ? `?tab=${tab}` : ''}`, publicUrl).toString();
export const profileUrl = (publicUrl: string) => new URL('/profile', publicUrl).toString();

function footerFor(deps: MailDeps, kind: MailKind, channelName: string, r: Recipient): string {
  const why = r.role ? `you are ${/^[aeiou]/.test(r.role) ? 'an' : 'a'} ${r.role} in ${channelName}` : `you work on ${channelName}`;
  return `You get “${MAIL_KIND_TEXT[kind].label}” e-mails because ${why} on Midgray. To stop this kind of e-mail, untick it on your profile: ${profileUrl(deps.publicUrl)}`;
}

/** Members of the channel with one of `roles` and an e-mail address, who have not opted out of `kind`. */
async function membersWithRoles(sequelize: Sequelize, channelId: string, roles: readonly Role[]): Promise<Recipient[]> {
  const rows = await sequelize.query<{ user_id: string; name: string; email: string | null; email_opt_outs: string[]; role: Role }>(
    `SELECT u.id AS user_id, u.name, u.email, u.email_opt_outs, m.role
       FROM memberships m JOIN users u ON u.id = m.user_id
      WHERE m.channel_id = :channelId AND m.role IN (:roles)
      ORDER BY u.name, u.id`,
    { replacements: { channelId, roles: [...roles] }, type: QueryTypes.SELECT },
  );
  return rows.filter((r) => r.email).map((r) => ({ userId: r.user_id, name: r.name, email: r.email!, optOuts: r.email_opt_outs ?? [], role: r.role }));
}

/** Sends one message per recipient who has not opted out of `kind`; returns how many were sent. */
async function deliver(
  deps: MailDeps,
  kind: MailKind,
  channelName: string,
  recipients: Recipient[],
  build: (r: Recipient) => { subject: string; heading: string; paragraphs: string[]; action: { label: string; url: string } },
): Promise<number> {
  const seen = new Set<string>();
  let sent = 0;
  for (const r of recipients) {
    if (seen.has(r.email.toLowerCase()) || r.optOuts.includes(kind)) continue;
    seen.add(r.email.toLowerCase());
    const m = build(r);
    const body = layoutMail({ channelName, heading: m.heading, paragraphs: m.paragraphs, action: m.action, footer: footerFor(deps, kind, channelName, r) });
    try {
      await deps.mailer.send({ to: r.email, subject: m.subject, ...body });
      sent++;
    } catch (err) {
      console.error(`[mail] ${kind} to ${r.email} not sent:`, (err as Error).message);
    }
  }
  return sent;
}

/** "2026-05-02 15:00 Europe/Berlin", plus the zone it was proposed in when that differs. */
function slotText(startsAt: string, zone: string, channelZone: string): string {
  const inChannel = formatInstantWithZoneName(startsAt, channelZone);
  return zone === channelZone ? inChannel : `${inChannel} (${formatInstantWithZoneName(startsAt, zone)})`;
}

interface SlotMailFacts {
  episodeId: string;
  title: string;
  channelId: string;
  channelName: string;
  channelTimeZone: string;
  hostId: string | null;
  editorId: string | null;
  startsAt: string;
  zone: string;
  status: string;
  comment: string | null;
  proposalNote: string | null;
  proposedBy: string | null;
  decidedBy: string | null;
}

async function slotFacts(sequelize: Sequelize, slotId: string): Promise<SlotMailFacts | null> {
  const rows = await sequelize.query<{
    episode_id: string; title: string; channel_id: string; channel_name: string; time_zone: string; host_id: string | null; editor_id: string | null;
    starts_at: Date; zone: string; status: string; comment: string | null; proposal_note: string | null; proposed_by: string | null; decided_by: string | null;
  }>(
    `SELECT e.id AS episode_id, e.title, c.id AS channel_id, c.name AS channel_name, c.time_zone, e.host_id, e.editor_id,
            s.starts_at, s.zone, s.status, s.comment, s.proposal_note, pu.name AS proposed_by, du.name AS decided_by
       FROM publish_slots s JOIN episodes e ON e.id = s.episode_id JOIN channels c ON c.id = e.channel_id
       LEFT JOIN users pu ON pu.id = s.proposed_by_id LEFT JOIN users du ON du.id = s.decided_by_id
      WHERE s.id = :slotId`,
    { replacements: { slotId }, type: QueryTypes.SELECT },
  );
  const r = rows[0];
  if (!r) return null;
  return {
    episodeId: r.episode_id, title: r.title, channelId: r.channel_id, channelName: r.channel_name, channelTimeZone: r.time_zone,
    hostId: r.host_id, editorId: r.editor_id, startsAt: new Date(r.starts_at).toISOString(), zone: r.zone, status: r.status,
    comment: r.comment, proposalNote: r.proposal_note, proposedBy: r.proposed_by, decidedBy: r.decided_by,
  };
}

/**
 * "Approval requested": to the channel's producers (to its admins when it has no producer), when an
 * episode in Approval has a newly proposed slot, or a board move (by `movedById`) took the episode
 * into Approval with its proposed slot. Returns the number of messages sent.
 */
export async function notifyApprovalRequested(deps: MailDeps, input: { slotId: string; movedById?: string }): Promise<number> {
  const f = await slotFacts(deps.sequelize, input.slotId);
  if (!f) return 0;
  const mover = input.movedById
    ? (await deps.sequelize.query<{ name: string }>('SELECT name FROM users WHERE id = :id', { replacements: { id: input.movedById }, type: QueryTypes.SELECT }))[0]?.name ?? 'Someone'
    : null;
  let recipients = await membersWithRoles(deps.sequelize, f.channelId, ['producer']);
  if (recipients.length === 0) recipients = await membersWithRoles(deps.sequelize, f.channelId, ['admin']);
  const when = slotText(f.startsAt, f.zone, f.channelTimeZone);
  return deliver(deps, 'approval_requested', f.channelName, recipients, () => ({
    subject: `Approval requested: ${f.title}`,
    heading: `A publish slot waits for your approval`,
    paragraphs: [
      `${f.proposedBy ?? 'Someone'} proposed ${when} for “${f.title}”.`,
      ...(f.proposalNote ? [`Their note: ${f.proposalNote}`] : []),
      ...(mover ? [`${mover} moved the episode to Approval on the board.`] : []),
      `Approve or reject it in the approval queue (${new URL('/approvals', deps.publicUrl).toString()}), where the gear embargoes, due-back dates, footage and description warnings are listed beside it.`,
    ],
    action: { label: 'Open the episode', url: episodeUrl(deps.publicUrl, f.episodeId, 'schedule') },
  }));
}

/** "Slot approved" or "slot rejected", with the producer's comment: to the episode's host and editor. */
export async function notifySlotDecided(deps: MailDeps, input: { slotId: string }): Promise<number> {
  const f = await slotFacts(deps.sequelize, input.slotId);
  if (!f || (f.status !== 'approved' && f.status !== 'rejected')) return 0;
  const ids = [f.hostId, f.editorId].filter((id): id is string => !!id);
  if (ids.length === 0) return 0;
  const rows = await deps.sequelize.query<{ user_id: string; name: string; email: string | null; email_opt_outs: string[]; role: Role | null }>(
    `SELECT u.id AS user_id, u.name, u.email, u.email_opt_outs, m.role
       FROM users u LEFT JOIN memberships m ON m.user_id = u.id AND m.channel_id = :channelId
      WHERE u.id IN (:ids) ORDER BY array_position(ARRAY[:ids]::uuid[], u.id)`,
    { replacements: { ids, channelId: f.channelId }, type: QueryTypes.SELECT },
  );
  // A host or editor who left the channel no longer hears about it.
  const recipients = rows.filter((r) => r.email && r.role).map((r) => ({ userId: r.user_id, name: r.name, email: r.email!, optOuts: r.email_opt_outs ?? [], role: r.role }));
  const when = slotText(f.startsAt, f.zone, f.channelTimeZone);
  const approved = f.status === 'approved';
  return deliver(deps, 'slot_decided', f.channelName, recipients, () => ({
    subject: `Publish slot ${approved ? 'approved' : 'rejected'}: ${f.title}`,
    heading: approved ? `“${f.title}” is scheduled` : `The publish slot for “${f.title}” was rejected`,
    paragraphs: [
      approved
        ? `${f.decidedBy ?? 'A producer'} approved ${when}. The episode moved to Scheduled.`
        : `${f.decidedBy ?? 'A producer'} rejected ${when}. Propose another slot on the episode’s Schedule tab.`,
      f.comment ? `Comment: ${f.comment}` : 'No comment was given.',
    ],
    action: { label: 'Open the episode', url: episodeUrl(deps.publicUrl, f.episodeId, 'schedule') },
  }));
}

/** One file in the "footage ready" message. */
export interface ReadyFootage {
  /** The original file name, as uploaded. */
  name: string;
  /** camera original, graded render or frame grab (free text, shown as given). */
  kind: string;
}

/**
 * "Footage ready for pickup": to the channel's editors, after footage of an episode was verified.
 * The footage feature calls this after its verification committed. Returns the messages sent.
 */
export async function notifyFootageReady(deps: MailDeps, input: { episodeId: string; footage: ReadyFootage[] }): Promise<number> {
  const rows = await deps.sequelize.query<{ title: string; channel_id: string; channel_name: string }>(
    `SELECT e.title, c.id AS channel_id, c.name AS channel_name FROM episodes e JOIN channels c ON c.id = e.channel_id WHERE e.id = :id`,
    { replacements: { id: input.episodeId }, type: QueryTypes.SELECT },
  );
  const e = rows[0];
  if (!e || input.footage.length === 0) return 0;
  const recipients = await membersWithRoles(deps.sequelize, e.channel_id, ['editor']);
  const n = input.footage.length;
  const list = input.footage.slice(0, 20).map((f) => `${f.name} (${f.kind})`);
  return deliver(deps, 'footage_ready', e.channel_name, recipients, () => ({
    subject: `Footage ready for pickup: ${e.title}`,
    heading: `${n === 1 ? 'One file is' : `${n} files are`} ready for pickup`,
    paragraphs: [
      `Verified footage of “${e.title}”: ${list.join(', ')}${n > list.length ? ` and ${n - list.length} more` : ''}.`,
      'Pick it up on the episode’s Footage tab so the others see who holds it.',
    ],
    action: { label: 'Open the footage', url: episodeUrl(deps.publicUrl, input.episodeId, 'footage') },
  }));
}

/** One gear item due back soon, as the reminder lists it. */
export interface DueGear {
  gearId: string;
  name: string;
  serial: string | null;
  dueBackOn: string;
  daysLeft: number;
  episodes: { id: string; title: string }[];
}

/** "Gear due back in 3 days": to the channel's producers, one message per item. Returns messages sent. */
export async function notifyGearDueBack(deps: MailDeps, input: { channelId: string; channelName: string; gear: DueGear }): Promise<number> {
  const recipients = await membersWithRoles(deps.sequelize, input.channelId, ['producer']);
  const g = input.gear;
  const when = g.daysLeft === 0 ? 'today' : g.daysLeft === 1 ? 'tomorrow' : `in ${g.daysLeft} days`;
  const episode = g.episodes[0];
  return deliver(deps, 'gear_due_back', input.channelName, recipients, () => ({
    subject: `Gear due back ${when}: ${g.name}`,
    heading: `${g.name} is due back ${when} (${g.dueBackOn})`,
    paragraphs: [
      `${g.name}${g.serial ? `, serial ${g.serial},` : ''} must go back on ${g.dueBackOn}.`,
      g.episodes.length > 0
        ? `Episodes that use it: ${g.episodes.map((e) => `“${e.title}”`).join(', ')}. Check that every shot needing it is done.`
        : 'No episode uses it.',
    ],
    action: episode
      ? { label: 'Open the episode', url: episodeUrl(deps.publicUrl, episode.id) }
      : { label: 'Open the gear list', url: new URL('/gear', deps.publicUrl).toString() },
  }));
}

/** False when a Midgray user with this address switched invitations off. */
export async function invitationsWanted(sequelize: Sequelize, email: string): Promise<boolean> {
  const rows = await sequelize.query<{ n: string }>(
    `SELECT count(*)::text AS n FROM users WHERE lower(email) = lower(:email) AND 'invitation' = ANY(email_opt_outs)`,
    { replacements: { email }, type: QueryTypes.SELECT },
  );
  return Number(rows[0]?.n ?? 0) === 0;
}

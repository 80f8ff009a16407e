import { QueryTypes, type Sequelize } from 'sequelize';
import { Channel, Invitation, lockUntilCommit, Membership, User } from '@midgray/db';
import { ChannelSettingsSchema, type Channel as ChannelDto, type CreateChannelInput, type Invitation as InvitationDto, type Member, type Role, type UpdateChannelInput } from '@midgray/shared';
import { AppError } from '../../errors.ts';
import { recordActivity } from '../../lib/activity.ts';
import { layoutMail, type Mailer } from '../../mail/mailer.ts';
import { invitationsWanted, profileUrl } from '../../mail/notifications.ts';

const INVITATION_DAYS = 14;

function toChannelDto(c: Channel, role: Role): ChannelDto {
  return { id: c.id, name: c.name, timeZone: c.timeZone, settings: ChannelSettingsSchema.parse(c.settings ?? {}), version: c.version, role };
}

/** Channels, members and invitations: the rules an admin works under. */
export class ChannelsService {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly mailer: Mailer,
    private readonly publicUrl: string,
  ) {}

  /** Creates a channel whose creator is its first admin. */
  async create(userId: string, input: CreateChannelInput): Promise<ChannelDto> {
    return this.sequelize.transaction(async (transaction) => {
      const c = await Channel.create({ name: input.name, timeZone: input.timeZone, settings: ChannelSettingsSchema.parse({}) }, { transaction });
      await Membership.create({ channelId: c.id, userId, role: 'admin' }, { transaction });
      await recordActivity({ channelId: c.id, actorId: userId, subjectType: 'channel', subjectId: c.id, action: 'channel.created', toValue: c.name }, transaction);
      return toChannelDto(c, 'admin');
    });
  }

  /** Returns the channel as the caller sees it. */
  async get(channelId: string, role: Role): Promise<ChannelDto> {
    const c = await Channel.findByPk(channelId);
    if (!c) throw new AppError('not_found', 'Channel not found');
    return toChannelDto(c, role);
  }

  /** Renames or re-settles a channel; a stale `version` answers 409. */
  async update(channelId: string, actorId: string, input: UpdateChannelInput): Promise<ChannelDto> {
    return this.sequelize.transaction(async (transaction) => {
      const c = await Channel.findByPk(channelId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!c) throw new AppError('not_found', 'Channel not found');
      if (c.version !== input.version) throw new AppError('stale_version', 'Someone changed the channel settings meanwhile: reload and apply your change again', { currentVersion: c.version });
      const settings = input.settings ? ChannelSettingsSchema.parse({ ...ChannelSettingsSchema.parse(c.settings ?? {}), ...input.settings }) : c.settings;
      await c.update({ name: input.name ?? c.name, timeZone: input.timeZone ?? c.timeZone, settings, version: c.version + 1 }, { transaction });
      await recordActivity({ channelId, actorId, subjectType: 'channel', subjectId: channelId, action: 'channel.updated', details: { fields: Object.keys(input).filter((k) => k !== 'version') } }, transaction);
      return toChannelDto(c, 'admin');
    });
  }

  /** Lists members with their roles, admins first. */
  async listMembers(channelId: string): Promise<Member[]> {
    const rows = await this.sequelize.query<{ id: string; user_id: string; name: string; login: string; email: string | null; avatar_url: string | null; role: Role; created_at: Date }>(
      `SELECT m.id, m.user_id, u.name, u.login, u.email, u.avatar_url, m.role, m.created_at
         FROM memberships m JOIN users u ON u.id = m.user_id
        WHERE m.channel_id = :channelId
        ORDER BY array_position(ARRAY['admin','producer','host','editor'], m.role), u.name`,
      { replacements: { channelId }, type: QueryTypes.SELECT },
    );
    return rows.map((r) => ({ id: r.id, userId: r.user_id, name: r.name, login: r.login, email: r.email, avatarUrl: r.avatar_url, role: r.role, joinedAt: new Date(r.created_at).toISOString() }));
  }

  /** Changes a member's role; refuses to demote the last admin. */
  async changeRole(channelId: string, actorId: string, memberId: string, role: Role): Promise<Member> {
    await this.sequelize.transaction(async (transaction) => {
      const m = await this.lockMembers(channelId, actorId, memberId, transaction);
      if (m.role === role) return;
      if (m.role === 'admin') await this.assertAnotherAdmin(channelId, transaction, 'change the role of');
      const from = m.role;
      await m.update({ role }, { transaction });
      await recordActivity({ channelId, actorId, subjectType: 'member', subjectId: m.userId, action: 'member.role_changed', fromValue: from, toValue: role }, transaction);
    });
    const member = (await this.listMembers(channelId)).find((x) => x.id === memberId);
    if (!member) throw new AppError('not_found', 'Member not found');
    return member;
  }

  /** Removes a member; their next request no longer sees the channel. Refuses the last admin. */
  async removeMember(channelId: string, actorId: string, memberId: string): Promise<void> {
    await this.sequelize.transaction(async (transaction) => {
      const m = await this.lockMembers(channelId, actorId, memberId, transaction);
      if (m.role === 'admin') await this.assertAnotherAdmin(channelId, transaction, 'remove');
      await m.destroy({ transaction });
      await recordActivity({ channelId, actorId, subjectType: 'member', subjectId: m.userId, action: 'member.removed', fromValue: m.role }, transaction);
    });
  }

  /**
   * Serialises role changes and removals in one channel (a transaction-level advisory lock), so two
   * admins demoting each other wait for one another instead of deadlocking on each other's rows;
   * then checks, inside that order, that the actor is still an admin and the member exists.
   */
  private async lockMembers(channelId: string, actorId: string, memberId: string, transaction: any) {
    await lockUntilCommit(transaction, 'midgray.members', channelId);
    const actor = await Membership.findOne({ where: { channelId, userId: actorId }, transaction });
    if (!actor) throw new AppError('not_found', 'Channel not found');
    if (actor.role !== 'admin') throw new AppError('forbidden', `Your role (${actor.role}) cannot do this; it needs admin`);
    const m = await Membership.findOne({ where: { id: memberId, channelId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!m) throw new AppError('not_found', 'Member not found');
    return m;
  }

  /** Refuses when `channelId` has no admin besides the one being changed (under lockMembers' order). */
  private async assertAnotherAdmin(channelId: string, transaction: any, verb: string) {
    const admins = await Membership.count({ where: { channelId, role: 'admin' }, transaction });
    if (admins <= 1) throw new AppError('conflict', `You cannot ${verb} the last admin of the channel: make someone else admin first`);
  }

  /** Lists open (not accepted, not revoked, not expired) invitations. */
  async listInvitations(channelId: string): Promise<InvitationDto[]> {
    const rows = await this.sequelize.query<{ id: string; email: string; role: Role; invited_by: string | null; created_at: Date; expires_at: Date }>(
      `SELECT i.id, i.email, i.role, u.name AS invited_by, i.created_at, i.expires_at
         FROM invitations i LEFT JOIN users u ON u.id = i.invited_by_id
        WHERE i.channel_id = :channelId AND i.accepted_at IS NULL AND i.revoked_at IS NULL AND i.expires_at > now()
        ORDER BY i.created_at DESC`,
      { replacements: { channelId }, type: QueryTypes.SELECT },
    );
    return rows.map((r) => ({ id: r.id, email: r.email, role: r.role, invitedBy: r.invited_by, createdAt: new Date(r.created_at).toISOString(), expiresAt: new Date(r.expires_at).toISOString() }));
  }

  /**
   * Invites an address with a role and e-mails it. The invitee's first sign-in with that address
   * joins the channel. Refuses addresses that already belong to a member or have an open invitation.
   */
  async invite(channelId: string, actorId: string, email: string, role: Role): Promise<{ invitation: InvitationDto; mailSent: boolean }> {
    const { inv, channelName, inviterName } = await this.sequelize.transaction(async (transaction) => {
      const member = await this.sequelize.query(
        `SELECT 1 FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.channel_id = :channelId AND lower(u.email) = :email`,
        { replacements: { channelId, email }, type: QueryTypes.SELECT, transaction },
      );
      if (member.length) throw new AppError('conflict', `${email} is already a member of this channel`);
      const open = await this.sequelize.query(
        `SELECT id FROM invitations WHERE channel_id = :channelId AND lower(email) = :email AND accepted_at IS NULL AND revoked_at IS NULL FOR UPDATE`,
        { replacements: { channelId, email }, type: QueryTypes.SELECT, transaction },
      );
      // An expired open invitation is closed so a new one can be sent.
      await this.sequelize.query(`UPDATE invitations SET revoked_at = now() WHERE channel_id = :channelId AND lower(email) = :email AND accepted_at IS NULL AND revoked_at IS NULL AND expires_at <= now()`, {
        replacements: { channelId, email },
        transaction,
      });
      if (open.length) {
        const still = await this.sequelize.query(`SELECT 1 FROM invitations WHERE channel_id = :channelId AND lower(email) = :email AND accepted_at IS NULL AND revoked_at IS NULL`, {
          replacements: { channelId, email },
          type: QueryTypes.SELECT,
          transaction,
        });
        if (still.length) throw new AppError('conflict', `${email} already has an open invitation: revoke it first to change the role`);
      }
      const inv = await Invitation.create({ channelId, email, role, invitedById: actorId, expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000) }, { transaction });
      await recordActivity({ channelId, actorId, subjectType: 'invitation', subjectId: inv.id, action: 'invitation.sent', toValue: role, details: { email } }, transaction);
      const channel = await Channel.findByPk(channelId, { transaction });
      const inviter = await User.findByPk(actorId, { transaction });
      return { inv, channelName: channel!.name, inviterName: inviter?.name ?? 'An admin' };
    });
    let mailSent = true;
    try {
      // A Midgray user who switched invitations off on their profile gets none (issue #7).
      if (!(await invitationsWanted(this.sequelize, email))) throw new Error(`${email} has switched invitation e-mails off`);
      const body = layoutMail({
        channelName,
        heading: `You are invited to ${channelName}`,
        paragraphs: [
          `${inviterName} invited you to join ${channelName} on Midgray as ${role}.`,
          `Sign in with the account that uses ${email} and you join the channel straight away. The invitation is valid for ${INVITATION_DAYS} days.`,
        ],
        action: { label: 'Sign in to Midgray', url: new URL('/sign-in', this.publicUrl).toString() },
        footer: `You get this because an admin of the channel entered your address. If you did not expect it, ignore this message. Already on Midgray? Switch invitation e-mails off on your profile: ${profileUrl(this.publicUrl)}`,
      });
      await this.mailer.send({ to: email, subject: `Invitation to ${channelName} on Midgray`, ...body });
    } catch (err) {
      mailSent = false;
      console.error('[mail] invitation not sent:', (err as Error).message);
    }
    const dto = (await this.listInvitations(channelId)).find((i) => i.id === inv.id)!;
    return { invitation: dto, mailSent };
  }

  /** Revokes an open invitation. */
  async revokeInvitation(channelId: string, actorId: string, invitationId: string): Promise<void> {
    await this.sequelize.transaction(async (transaction) => {
      const inv = await Invitation.findOne({ where: { id: invitationId, channelId, acceptedAt: null, revokedAt: null }, transaction, lock: transaction.LOCK.UPDATE });
      if (!inv) throw new AppError('not_found', 'Invitation not found (it may have been accepted or revoked already)');
      await inv.update({ revokedAt: new Date() }, { transaction });
      await recordActivity({ channelId, actorId, subjectType: 'invitation', subjectId: inv.id, action: 'invitation.revoked', details: { email: inv.email } }, transaction);
    });
  }
}

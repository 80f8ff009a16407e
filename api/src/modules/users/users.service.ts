import { Op, type Sequelize } from 'sequelize';
import { Invitation, Membership, User } from '@midgray/db';
import type { SessionUser } from '../../middleware/auth.ts';
import { recordActivity } from '../../lib/activity.ts';

/** What the sign-in provider tells us about a person. */
export interface ProviderProfile {
  provider: string;
  providerId: string;
  login: string;
  name: string;
  emails: string[];
  avatarUrl: string | null;
}

/**
 * Finds or creates the user for a provider profile and, in the same transaction, accepts every
 * open invitation addressed to one of the profile's e-mails (joining those channels with the
 * invited role). Returns the session user.
 */
export async function signInFromProfile(sequelize: Sequelize, p: ProviderProfile): Promise<SessionUser> {
  return sequelize.transaction(async (transaction) => {
    const email = p.emails[0]?.toLowerCase() ?? null;
    let user = await User.findOne({ where: { provider: p.provider, providerId: p.providerId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!user) user = await User.create({ provider: p.provider, providerId: p.providerId, login: p.login, name: p.name, email, avatarUrl: p.avatarUrl }, { transaction });
    else await user.update({ login: p.login, name: p.name, email: email ?? user.email, avatarUrl: p.avatarUrl }, { transaction });

    const emails = p.emails.map((e) => e.toLowerCase());
    if (emails.length) {
      const open = await Invitation.findAll({
        where: {
          acceptedAt: null,
          revokedAt: null,
          expiresAt: { [Op.gt]: new Date() },
          [Op.and]: [sequelize.where(sequelize.fn('lower', sequelize.col('email')), { [Op.in]: emails })],
        },
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      for (const inv of open) {
        const existing = await Membership.findOne({ where: { channelId: inv.channelId, userId: user.id }, transaction });
        if (!existing) {
          await Membership.create({ channelId: inv.channelId, userId: user.id, role: inv.role }, { transaction });
          await recordActivity({ channelId: inv.channelId, actorId: user.id, subjectType: 'member', subjectId: user.id, action: 'member.joined', toValue: inv.role, details: { invitationId: inv.id } }, transaction);
        }
        await inv.update({ acceptedAt: new Date(), acceptedById: user.id }, { transaction });
      }
    }
    return { id: user.id, name: user.name, login: user.login, email: user.email, avatarUrl: user.avatarUrl };
  });
}

// The signed-in user's own settings: which e-mail kinds they get, and whether their calendar feed is on.
import { User } from '@midgray/db';
import { MAIL_KINDS, MAIL_KIND_TEXT, type MailKind, type Profile } from '@midgray/shared';
import { AppError } from '../../errors.ts';

/** The profile page's data and its one setting that is not the feed. */
export class ProfileService {
  /** Returns the user's profile: e-mail kinds with on/off, and the feed's state (never its secret). */
  async get(userId: string): Promise<Profile> {
    const u = await User.findByPk(userId);
    if (!u) throw new AppError('not_found', 'User not found');
    const off = new Set(u.emailOptOuts ?? []);
    return {
      user: { id: u.id, name: u.name, login: u.login, email: u.email },
      email: MAIL_KINDS.map((kind) => ({ kind, ...MAIL_KIND_TEXT[kind], enabled: !off.has(kind) })),
      calendarFeed: { active: !!u.calendarToken, createdAt: u.calendarTokenCreatedAt ? u.calendarTokenCreatedAt.toISOString() : null },
    };
  }

  /** Replaces the user's opt-outs (kinds they get no e-mail of). */
  async setOptOuts(userId: string, optOuts: MailKind[]): Promise<Profile> {
    const unique = MAIL_KINDS.filter((k) => optOuts.includes(k));
    const [count] = await User.update({ emailOptOuts: unique }, { where: { id: userId } });
    if (count !== 1) throw new AppError('not_found', 'User not found');
    return this.get(userId);
  }
}

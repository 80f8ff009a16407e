import { z } from 'zod';

/** Roles per channel, lowest to highest authority. */
export const ROLE_VALUES = ['host', 'editor', 'producer', 'admin'] as const;
export const RoleSchema = z.enum(ROLE_VALUES);
export type Role = z.infer<typeof RoleSchema>;

export const UuidSchema = z.uuid({ message: 'Must be a valid id' });

export const EMAIL_MAX = 254;
export const EmailSchema = z
  .email({ message: 'Enter a valid e-mail address, like name@example.org' })
  .max(EMAIL_MAX)
  .transform((s) => s.toLowerCase());

/** Path parameter schemas, reused by every route that takes them. */
export const ChannelParamsSchema = z.strictObject({ channelId: UuidSchema });
export const IdParamsSchema = z.strictObject({ id: UuidSchema });

/** Validates an IANA time zone name with the runtime's own tz database. */
export const TimeZoneSchema = z
  .string()
  .min(1)
  .max(64)
  .refine(
    (tz) => {
      try {
        new Intl.DateTimeFormat('en-US', { timeZone: tz });
        return true;
      } catch {
        return false;
      }
    },
    { message: 'Unknown time zone: use an IANA name such as Europe/Berlin or America/New_York' },
  );

/** A calendar date 'YYYY-MM-DD'. */
export const DateOnlySchema = z.iso.date({ message: 'Use a date like 2026-05-14' });
/** An instant with offset, e.g. 2026-05-14T09:00:00Z. */
export const InstantSchema = z.iso.datetime({ offset: true, message: 'Use a date-time with offset, like 2026-05-14T09:00:00Z' });

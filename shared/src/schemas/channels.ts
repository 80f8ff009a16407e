import { z } from 'zod';
import { EmailSchema, RoleSchema, TimeZoneSchema, UuidSchema } from './common.ts';

export const CHANNEL_NAME_MAX = 120;

/** Channel-wide settings; every field has a default so old rows keep working. */
export const ChannelSettingsSchema = z.object({
  /** SNR at or above which an ISO step counts as clean enough (dB). */
  snrThresholdDb: z.number().min(0).max(80).default(20),
  /** Mean CIEDE2000 at or below which a recovered frame counts as a match. */
  deltaEThreshold: z.number().min(0.1).max(50).default(2.5),
  descriptionMaxChars: z.number().int().min(100).max(100_000).default(5000),
  titleMaxChars: z.number().int().min(10).max(1000).default(100),
  defaultDisclosure: z.string().max(2000).default(''),
  signOff: z.string().max(2000).default(''),
  trackingParams: z.array(z.strictObject({ key: z.string().min(1).max(64), value: z.string().max(200) })).max(20).default([]),
});
export type ChannelSettings = z.infer<typeof ChannelSettingsSchema>;

export const ChannelSchema = z.object({
  id: UuidSchema,
  name: z.string(),
  timeZone: z.string(),
  settings: ChannelSettingsSchema,
  version: z.number().int(),
  role: RoleSchema,
});
export type Channel = z.infer<typeof ChannelSchema>;

export const CreateChannelInputSchema = z.strictObject({
  name: z.string().trim().min(1, 'Give the channel a name').max(CHANNEL_NAME_MAX),
  timeZone: TimeZoneSchema.default('UTC'),
});
export type CreateChannelInput = z.infer<typeof CreateChannelInputSchema>;

export const UpdateChannelInputSchema = z.strictObject({
  version: z.number().int().min(1),
  name: z.string().trim().min(1).max(CHANNEL_NAME_MAX).optional(),
  timeZone: TimeZoneSchema.optional(),
  settings: ChannelSettingsSchema.partial().optional(),
});
export type UpdateChannelInput = z.infer<typeof UpdateChannelInputSchema>;

export const MemberSchema = z.object({
  id: UuidSchema,
  userId: UuidSchema,
  name: z.string(),
  login: z.string(),
  email: z.string().nullable(),
  avatarUrl: z.string().nullable(),
  role: RoleSchema,
  joinedAt: z.string(),
});
export type Member = z.infer<typeof MemberSchema>;

export const MemberParamsSchema = z.strictObject({ channelId: UuidSchema, memberId: UuidSchema });
export const UpdateMemberInputSchema = z.strictObject({ role: RoleSchema });
export type UpdateMemberInput = z.infer<typeof UpdateMemberInputSchema>;

export const InvitationSchema = z.object({
  id: UuidSchema,
  email: z.string(),
  role: RoleSchema,
  invitedBy: z.string().nullable(),
  createdAt: z.string(),
  expiresAt: z.string(),
});
export type Invitation = z.infer<typeof InvitationSchema>;

export const CreateInvitationInputSchema = z.strictObject({ email: EmailSchema, role: RoleSchema });
export type CreateInvitationInput = z.infer<typeof CreateInvitationInputSchema>;
export const InvitationParamsSchema = z.strictObject({ channelId: UuidSchema, invitationId: UuidSchema });

export const MeSchema = z.object({
  user: z
    .object({
      id: UuidSchema,
      name: z.string(),
      login: z.string(),
      email: z.string().nullable(),
      avatarUrl: z.string().nullable(),
    })
    .nullable(),
  channels: z.array(ChannelSchema),
});
export type Me = z.infer<typeof MeSchema>;

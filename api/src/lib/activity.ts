import type { Transaction } from 'sequelize';
import { Activity } from '@midgray/db';

/** What one activity-log line records; written in the same transaction as the change it describes. */
export interface ActivityInput {
  channelId: string;
  actorId: string | null;
  subjectType: string;
  subjectId: string;
  episodeId?: string | null;
  action: string;
  fromValue?: string | null;
  toValue?: string | null;
  reason?: string | null;
  details?: Record<string, unknown>;
}

/** Appends one line to the activity log inside `transaction`. */
export async function recordActivity(input: ActivityInput, transaction: Transaction) {
  await Activity.create({ ...input, details: input.details ?? {} }, { transaction });
}

// "Gear due back in 3 days": a scheduled pg-boss job that e-mails the channel's producers once per
// gear item and due date, when the date is 3 days away or nearer in the channel's own time zone.
// A row in gear_due_notices claims each reminder first, so two workers (or two runs) never both send.
import { QueryTypes } from 'sequelize';
import { notifyGearDueBack, type MailDeps } from '../mail/notifications.ts';

/** Queue name of the reminder job. */
export const GEAR_DUE_BACK_QUEUE = 'gear-due-back';
/** Every hour on the hour: a reminder goes out within the hour its channel's day makes it due. */
export const GEAR_DUE_BACK_CRON = '0 * * * *';
/** Days ahead of the due date the reminder is sent (the day it becomes this near, or later if added late). */
export const GEAR_DUE_BACK_DAYS = 3;

/** What the job module needs of the job queue (api/src/jobs/jobs.ts `Jobs`). */
export interface JobRegistry {
  define<T extends object>(name: string, handler: (data: T) => Promise<void>, opts?: object): void;
  schedule(name: string, cron: string, data?: object): void;
}

/**
 * Sends every reminder that is due at `now`: gear not archived, due back between today and
 * today + 3 in its channel's zone, not reminded before for that date. Returns the gear reminded.
 */
export async function sendGearDueBackReminders(deps: MailDeps, now = new Date()): Promise<{ gearId: string; dueBackOn: string; sent: number }[]> {
  const due = await deps.sequelize.query<{ id: string; make: string; model: string; serial: string | null; due_back_on: string; days_left: number; channel_id: string; channel_name: string }>(
    `SELECT g.id, g.make, g.model, g.serial, g.due_back_on::text AS due_back_on, c.id AS channel_id, c.name AS channel_name,
            (g.due_back_on - (CAST(:now AS timestamptz) AT TIME ZONE c.time_zone)::date) AS days_left
       FROM gear g JOIN channels c ON c.id = g.channel_id
      WHERE g.archived_at IS NULL AND g.due_back_on IS NOT NULL
        AND g.due_back_on BETWEEN (CAST(:now AS timestamptz) AT TIME ZONE c.time_zone)::date
                              AND (CAST(:now AS timestamptz) AT TIME ZONE c.time_zone)::date + :days
        AND NOT EXISTS (SELECT 1 FROM gear_due_notices n WHERE n.gear_id = g.id AND n.due_back_on = g.due_back_on)
      ORDER BY g.due_back_on, g.id`,
    { replacements: { now: now.toISOString(), days: GEAR_DUE_BACK_DAYS }, type: QueryTypes.SELECT },
  );
  const done: { gearId: string; dueBackOn: string; sent: number }[] = [];
  for (const g of due) {
    // Claim the reminder; another worker that claimed it first wins and this one skips it.
    const claimed = await deps.sequelize.query(
      `INSERT INTO gear_due_notices (gear_id, due_back_on, sent_at) VALUES (:gearId, :dueBackOn, :now) ON CONFLICT DO NOTHING RETURNING gear_id`,
      { replacements: { gearId: g.id, dueBackOn: g.due_back_on, now: now.toISOString() }, type: QueryTypes.SELECT },
    );
    if (claimed.length !== 1) continue;
    const episodes = await deps.sequelize.query<{ id: string; title: string }>(
      `SELECT e.id, e.title FROM episode_gear eg JOIN episodes e ON e.id = eg.episode_id
        WHERE eg.gear_id = :gearId AND e.archived_at IS NULL ORDER BY e.created_at, e.id`,
      { replacements: { gearId: g.id }, type: QueryTypes.SELECT },
    );
    const sent = await notifyGearDueBack(deps, {
      channelId: g.channel_id,
      channelName: g.channel_name,
      gear: { gearId: g.id, name: `${g.make} ${g.model}`, serial: g.serial, dueBackOn: g.due_back_on, daysLeft: Number(g.days_left), episodes },
    });
    done.push({ gearId: g.id, dueBackOn: g.due_back_on, sent });
  }
  return done;
}

/** Defines the reminder queue with its handler and its hourly schedule on `jobs`. */
export function registerGearDueBackJob(jobs: JobRegistry, deps: MailDeps) {
  jobs.define(GEAR_DUE_BACK_QUEUE, async () => {
    await sendGearDueBackReminders(deps);
  });
  jobs.schedule(GEAR_DUE_BACK_QUEUE, GEAR_DUE_BACK_CRON);
}

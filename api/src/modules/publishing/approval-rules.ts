// What stops a publish slot from being approved, in words a producer can act on. Used by the
// approve route (which refuses) and by the approval queue (which shows the same lines beforehand).
import { checkStageMove, factsPastApproval, formatInstantWithZoneName, instantToMs, type Embargo, type Role } from '@midgray/shared';

/** The zone to show an embargo in besides its own: the slot's zone, else the channel's, else UTC. */
function otherZone(embargoZone: string, slotZone: string, channelZone: string): string {
  if (slotZone !== embargoZone) return slotZone;
  if (channelZone !== embargoZone) return channelZone;
  return 'UTC';
}

/**
 * One sentence per gear embargo the slot comes before, naming the gear and the embargo in its own
 * zone and in the slot's (instants compared, never wall-clock times). A slot at the embargo instant is fine.
 */
export function embargoBlockers(slot: { startsAt: string; zone: string }, embargoes: Embargo[], channelZone: string): string[] {
  const slotMs = instantToMs(slot.startsAt);
  return embargoes
    .filter((e) => slotMs < instantToMs(e.embargoAt))
    .sort((a, b) => instantToMs(b.embargoAt) - instantToMs(a.embargoAt))
    .map((e) => {
      const other = otherZone(e.zone, slot.zone, channelZone);
      return (
        `The slot ${formatInstantWithZoneName(slot.startsAt, slot.zone)} is before the embargo of ${e.gearName}, ` +
        `which lifts at ${formatInstantWithZoneName(e.embargoAt, e.zone)} (${formatInstantWithZoneName(e.embargoAt, other)}). ` +
        'Propose a slot at or after the embargo.'
      );
    });
}

/** The sentence for a required disclosure that is missing. */
export function disclosureBlocker(reasons: string[]): string {
  return (
    `The description needs a disclosure (${reasons.join('; ')}) and has none. ` +
    'Write one on the Description tab, or set a default disclosure in the channel settings.'
  );
}

/** Everything that stops approving `slot` of an episode in `stage`; empty when approval may go ahead. */
export function approvalBlockers(input: {
  role: Role;
  stage: string;
  slot: { startsAt: string; zone: string };
  embargoes: Embargo[];
  channelZone: string;
  disclosure: { required: boolean; present: boolean; reasons: string[] };
  now: Date;
}): string[] {
  const blockers: string[] = [];
  if (input.stage !== 'approval') {
    blockers.push(`The episode is in ${input.stage}, not in Approval: move it to Approval first (it needs a description draft and a proposed slot).`);
    return blockers;
  }
  blockers.push(...embargoBlockers(input.slot, input.embargoes, input.channelZone));
  if (input.disclosure.required && !input.disclosure.present) blockers.push(disclosureBlocker(input.disclosure.reasons));
  // The board's rule for approval → scheduled must agree; anything it adds (e.g. a role) is listed too.
  const check = checkStageMove({
    from: 'approval',
    to: 'scheduled',
    role: input.role,
    facts: factsPastApproval({
      approvedSlotAt: input.slot.startsAt,
      embargoes: input.embargoes.map(({ gearName, embargoAt, zone }) => ({ gearName, embargoAt, zone })),
      disclosureRequired: input.disclosure.required,
      disclosurePresent: input.disclosure.present,
      now: input.now.toISOString(),
    }),
  });
  if (!check.allowed && blockers.length === 0) blockers.push(...check.missing);
  return blockers;
}

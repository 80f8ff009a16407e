/**
 * The episode's stage model and who may do what (PRODUCT.md "Who uses it" and "Stage rules";
 * issue #3). Pure: the API calls `checkStageMove` with facts it read in the move's transaction and
 * refuses with `missing`; the board calls it to explain a refused drop before asking the server.
 */
import { InvalidInputError } from './errors.ts';
import { ROLE_VALUES, type Role } from './schemas/common.ts';
import { formatInstantWithZoneName, instantToMs } from './zones.ts';

/** Stages in board order, left to right. */
export const STAGES = ['plan', 'shoot', 'grade', 'approval', 'scheduled', 'live'] as const;
export type Stage = (typeof STAGES)[number];

/** Stage names as people read them. */
export const STAGE_LABELS: Record<Stage, string> = {
  plan: 'Plan',
  shoot: 'Shoot',
  grade: 'Grade',
  approval: 'Approval',
  scheduled: 'Scheduled',
  live: 'Live',
};

/** Roles per channel, the same list as `ROLE_VALUES` in schemas/common.ts. */
export const ROLES = ROLE_VALUES;

/**
 * Who may move an episode forward FROM each stage to the next (PRODUCT.md stage-rule table). Moving
 * back TO a stage is allowed to the same roles: whoever may push work on from a stage may send it back.
 */
export const FORWARD_MOVE_ROLES: Record<Exclude<Stage, 'live'>, readonly Role[]> = {
  plan: ['host', 'producer', 'admin'],
  shoot: ['host', 'editor', 'producer', 'admin'],
  grade: ['editor', 'host', 'producer', 'admin'],
  approval: ['producer', 'admin'],
  scheduled: ['producer', 'admin'],
};

/** An embargo of one gear item: the instant it lifts and the zone it was announced in. */
export interface GearEmbargo {
  gearName: string;
  /** ISO instant, e.g. "2026-05-02T13:00:00Z". */
  embargoAt: string;
  /** IANA zone, e.g. "Europe/Berlin". */
  zone: string;
}

/** What the rules look at, read by the caller from the episode at the time of the move. */
export interface StageFacts {
  testCount: number;
  /** Labels of required spec-sheet lines without a value, in spec-sheet order. */
  requiredSpecLinesEmpty: string[];
  /** Camera originals in state `received` or `verified`. */
  cameraOriginalsReceived: number;
  hasDescriptionDraft: boolean;
  hasProposedSlot: boolean;
  /** ISO instant of the approved publish slot, when there is one. */
  approvedSlotAt?: string;
  embargoes: GearEmbargo[];
  disclosureRequired: boolean;
  disclosurePresent: boolean;
  /** ISO instant the move happens at (server time in the API). */
  now: string;
  publicUrl?: string;
}

/**
 * Facts for a move out of Approval or Scheduled: the earlier stages' rules (tests, spec sheet,
 * camera originals, description draft, proposed slot) were met to get there, so they read as met;
 * no embargo and no disclosure need unless given. `facts` gives what the move itself is judged on.
 */
export function factsPastApproval(facts: Pick<StageFacts, 'now'> & Partial<StageFacts>): StageFacts {
  return { testCount: 0, requiredSpecLinesEmpty: [], cameraOriginalsReceived: 0, hasDescriptionDraft: true, hasProposedSlot: true, embargoes: [], disclosureRequired: false, disclosurePresent: true, ...facts };
}

export interface StageMoveContext {
  from: Stage;
  to: Stage;
  role: Role;
  /** Why the episode goes back; required for back moves, kept in the activity log. */
  reason?: string;
  facts: StageFacts;
}

export interface StageMoveCheck {
  allowed: boolean;
  /** What stops the move, one sentence each, in the words shown to the person. */
  missing: string[];
  direction: 'forward' | 'back' | 'same';
  /** True for back moves: the UI asks for a reason before sending. */
  needsReason: boolean;
}

/** Position of a stage on the board (plan = 0 … live = 5); throws InvalidInputError for unknown names. */
export function stageIndex(stage: Stage): number {
  const index = STAGES.indexOf(stage);
  if (index < 0) throw new InvalidInputError(`"${String(stage)}" is not a stage`, 'stage');
  return index;
}

/** The stage after `stage`, or null after `live`. */
export function nextStage(stage: Stage): Stage | null {
  return STAGES[stageIndex(stage) + 1] ?? null;
}

function assertRole(role: Role): void {
  if (!ROLES.includes(role)) throw new InvalidInputError(`"${String(role)}" is not a role`, 'role');
}

function mayMoveForwardFrom(stage: Stage, role: Role): boolean {
  return stage !== 'live' && FORWARD_MOVE_ROLES[stage].includes(role);
}

/** "a host, producer or admin" / "an editor, host, producer or admin". */
function rolesPhrase(roles: readonly Role[]): string {
  const list = roles.length === 1 ? roles[0] : `${roles.slice(0, -1).join(', ')} or ${roles[roles.length - 1]}`;
  return `${/^[aeiou]/.test(list) ? 'an' : 'a'} ${list}`;
}

const utc = (instant: string) => formatInstantWithZoneName(instant, 'UTC');

function requirements(from: Stage, facts: StageFacts): string[] {
  const missing: string[] = [];
  switch (from) {
    case 'plan': {
      if (facts.testCount < 1) {
        missing.push('No test in the plan yet: add an ISO sweep, a latitude bracket or a custom test');
      }
      const empty = facts.requiredSpecLinesEmpty;
      if (empty.length > 0) {
        missing.push(`${empty.length} spec-sheet ${empty.length === 1 ? 'line' : 'lines'} empty: ${empty.join(', ')}`);
      }
      break;
    }
    case 'shoot':
      if (facts.cameraOriginalsReceived < 1) missing.push('No camera original received yet');
      break;
    case 'grade':
      if (!facts.hasDescriptionDraft) missing.push('No description draft yet');
      if (!facts.hasProposedSlot) missing.push('No publish slot proposed yet');
      break;
    case 'approval': {
      if (!facts.approvedSlotAt) {
        missing.push('No approved publish slot yet');
      } else {
        const slotMs = instantToMs(facts.approvedSlotAt);
        for (const embargo of facts.embargoes) {
          // "Not before the embargo": a slot exactly at the embargo instant is fine.
          if (slotMs < instantToMs(embargo.embargoAt)) {
            missing.push(
              `Approved slot ${utc(facts.approvedSlotAt)} is before the embargo of ${embargo.gearName} ` +
                `(${formatInstantWithZoneName(embargo.embargoAt, embargo.zone)})`,
            );
          }
        }
      }
      if (facts.disclosureRequired && !facts.disclosurePresent) {
        missing.push(
          'The description has no disclosure, and it needs one: gear was loaned or sponsored, or a link earns a commission',
        );
      }
      break;
    }
    case 'scheduled': {
      if (!facts.approvedSlotAt) {
        missing.push('No approved publish slot yet');
      } else if (instantToMs(facts.now) < instantToMs(facts.approvedSlotAt)) {
        missing.push(`The approved slot ${utc(facts.approvedSlotAt)} has not come yet (now ${utc(facts.now)})`);
      }
      const url = facts.publicUrl?.trim() ?? '';
      if (url === '') missing.push('No public URL recorded yet');
      else if (!/^https?:\/\/\S+$/i.test(url)) missing.push('The public URL must be a full web address starting with https://');
      break;
    }
    case 'live':
      break;
  }
  return missing;
}

/**
 * Whether `role` may move an episode from `from` to `to` now, and if not, everything that is missing.
 * Forward: only to the next stage, by the roles of the stage-rule table, with that row's requirements.
 * Back: to any earlier stage, by whoever may move forward from the target stage, with a reason.
 * Same stage (a reorder inside a column): always allowed.
 */
export function checkStageMove(ctx: StageMoveContext): StageMoveCheck {
  const { from, to, role, facts } = ctx;
  const fromIndex = stageIndex(from);
  const toIndex = stageIndex(to);
  assertRole(role);

  if (fromIndex === toIndex) return { allowed: true, missing: [], direction: 'same', needsReason: false };

  const missing: string[] = [];
  if (toIndex < fromIndex) {
    if (!mayMoveForwardFrom(to, role)) {
      const roles = FORWARD_MOVE_ROLES[to as Exclude<Stage, 'live'>];
      missing.push(`Only ${rolesPhrase(roles)} can move an episode back to ${STAGE_LABELS[to]} (your role here is ${role})`);
    }
    if (!ctx.reason || ctx.reason.trim() === '') {
      missing.push(`Give a reason for moving the episode back to ${STAGE_LABELS[to]}`);
    }
    return { allowed: missing.length === 0, missing, direction: 'back', needsReason: true };
  }

  if (toIndex !== fromIndex + 1) {
    const next = STAGES[fromIndex + 1];
    missing.push(`Episodes move forward one stage at a time: from ${STAGE_LABELS[from]} the next stage is ${STAGE_LABELS[next]}`);
    return { allowed: false, missing, direction: 'forward', needsReason: false };
  }

  if (!mayMoveForwardFrom(from, role)) {
    const roles = FORWARD_MOVE_ROLES[from as Exclude<Stage, 'live'>];
    missing.push(
      `Only ${rolesPhrase(roles)} can move an episode from ${STAGE_LABELS[from]} to ${STAGE_LABELS[to]} (your role here is ${role})`,
    );
  }
  missing.push(...requirements(from, facts));
  return { allowed: missing.length === 0, missing, direction: 'forward', needsReason: false };
}

// ---------------------------------------------------------------------------------------------------
// Permissions outside stage moves (PRODUCT.md "Who uses it"; issue #7 for publish slots).

/**
 * Which roles may do each action. A producer may do everything a host may, plus dates and gear;
 * an admin may do everything.
 */
export const ROLE_PERMISSIONS = {
  'episode.create': ['host', 'producer', 'admin'],
  /** Plans, spec sheets and shoot observations. */
  'plan.edit': ['host', 'producer', 'admin'],
  'footage.upload': ['host', 'editor', 'producer', 'admin'],
  /** Pick up and release footage (editors' work; hosts and producers do not grade). */
  'footage.pickup': ['editor', 'admin'],
  'readout.run': ['editor', 'admin'],
  /** Description text and chapters: the host drafts, the editor edits. */
  'description.edit': ['host', 'editor', 'producer', 'admin'],
  /** Propose (request) a publish slot: host or editor (issue #7), and everyone above. */
  'slot.propose': ['host', 'editor', 'producer', 'admin'],
  'slot.approve': ['producer', 'admin'],
  'gear.manage': ['producer', 'admin'],
  'members.manage': ['admin'],
  'channel.settings': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type RoleAction = keyof typeof ROLE_PERMISSIONS;

/** Every action of the permission table, for route matrices and tests. */
export const ROLE_ACTIONS = Object.keys(ROLE_PERMISSIONS) as RoleAction[];

/** True when `role` may perform `action` in its channel. */
export function canRole(role: Role, action: RoleAction): boolean {
  const allowed: readonly Role[] | undefined = ROLE_PERMISSIONS[action];
  return allowed !== undefined && allowed.includes(role);
}

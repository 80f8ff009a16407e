// The rules checked here are PRODUCT.md's "Who uses it" and "Stage rules" tables (the product's own
// specification); instants in embargo messages follow the IANA tz database (Europe/Berlin is UTC+2
// under EU summer time, `europe` file: Rule EU 1981 max Mar lastSun 1:00u).
import { describe, expect, it } from 'vitest';
import {
  FORWARD_MOVE_ROLES,
  ROLES,
  ROLE_ACTIONS,
  STAGES,
  canRole,
  checkStageMove,
  factsPastApproval,
  nextStage,
  type RoleAction,
  type Stage,
  type StageFacts,
} from './stages.ts';
import { zonedTimeToInstant } from './zones.ts';
import type { Role } from './schemas/common.ts';

/** Facts under which every forward move's requirements are met (fictional gear only). */
function readyFacts(overrides: Partial<StageFacts> = {}): StageFacts {
  return {
    testCount: 2,
    requiredSpecLinesEmpty: [],
    cameraOriginalsReceived: 3,
    hasDescriptionDraft: true,
    hasProposedSlot: true,
    approvedSlotAt: '2026-05-04T09:00:00Z',
    embargoes: [{ gearName: 'Korvala K9 body', embargoAt: '2026-05-02T13:00:00Z', zone: 'Europe/Berlin' }],
    disclosureRequired: true,
    disclosurePresent: true,
    now: '2026-05-04T09:30:00Z',
    publicUrl: 'https://video.example.com/watch/k9-iso',
    ...overrides,
  };
}

const move = (from: Stage, to: Stage, role: Role, facts: StageFacts = readyFacts(), reason?: string) =>
  checkStageMove({ from, to, role, facts, reason });

// PRODUCT.md stage-rule table, row by row: move, roles allowed.
const TABLE: [Stage, Stage, Role[]][] = [
  ['plan', 'shoot', ['host', 'producer', 'admin']],
  ['shoot', 'grade', ['host', 'editor', 'producer', 'admin']],
  ['grade', 'approval', ['editor', 'host', 'producer', 'admin']],
  ['approval', 'scheduled', ['producer', 'admin']],
  ['scheduled', 'live', ['producer', 'admin']],
];

describe('stage and role lists', () => {
  it('lists the stages in board order and the four roles', () => {
    expect(STAGES).toEqual(['plan', 'shoot', 'grade', 'approval', 'scheduled', 'live']);
    expect(ROLES).toEqual(['host', 'editor', 'producer', 'admin']);
    expect(nextStage('plan')).toBe('shoot');
    expect(nextStage('live')).toBeNull();
  });
});

describe('forward moves: roles (every row of the table)', () => {
  for (const [from, to, allowedRoles] of TABLE) {
    for (const role of ROLES) {
      const allowed = allowedRoles.includes(role);
      it(`${from} → ${to} by ${role}: ${allowed ? 'allowed' : 'refused'}`, () => {
        const result = move(from, to, role);
        expect(result.direction).toBe('forward');
        expect(result.needsReason).toBe(false);
        expect(result.allowed).toBe(allowed);
        if (!allowed) expect(result.missing).toHaveLength(1);
        else expect(result.missing).toEqual([]);
      });
    }
  }

  it('the table in code matches the table in PRODUCT.md', () => {
    for (const [from, , roles] of TABLE) {
      expect([...FORWARD_MOVE_ROLES[from as Exclude<Stage, 'live'>]].sort()).toEqual([...roles].sort());
    }
  });

  it('names the roles that may make the move', () => {
    expect(move('plan', 'shoot', 'editor').missing).toEqual([
      'Only a host, producer or admin can move an episode from Plan to Shoot (your role here is editor)',
    ]);
    expect(move('approval', 'scheduled', 'editor').missing).toEqual([
      'Only a producer or admin can move an episode from Approval to Scheduled (your role here is editor)',
    ]);
  });
});

describe('forward moves: requirements', () => {
  it('plan → shoot needs a test and every required spec-sheet line filled', () => {
    expect(move('plan', 'shoot', 'host', readyFacts({ testCount: 0 })).missing).toEqual([
      'No test in the plan yet: add an ISO sweep, a latitude bracket or a custom test',
    ]);
    expect(move('plan', 'shoot', 'host', readyFacts({ requiredSpecLinesEmpty: ['frame rate', 'codec'] })).missing).toEqual([
      '2 spec-sheet lines empty: frame rate, codec',
    ]);
    expect(move('plan', 'shoot', 'host', readyFacts({ requiredSpecLinesEmpty: ['codec'] })).missing).toEqual([
      '1 spec-sheet line empty: codec',
    ]);
  });

  it('lists a wrong role and every unmet requirement together', () => {
    const result = move('plan', 'shoot', 'editor', readyFacts({ testCount: 0, requiredSpecLinesEmpty: ['ISO'] }));
    expect(result.allowed).toBe(false);
    expect(result.missing).toEqual([
      'Only a host, producer or admin can move an episode from Plan to Shoot (your role here is editor)',
      'No test in the plan yet: add an ISO sweep, a latitude bracket or a custom test',
      '1 spec-sheet line empty: ISO',
    ]);
  });

  it('shoot → grade needs a camera original received or verified', () => {
    expect(move('shoot', 'grade', 'editor', readyFacts({ cameraOriginalsReceived: 0 }))).toEqual({
      allowed: false,
      missing: ['No camera original received yet'],
      direction: 'forward',
      needsReason: false,
    });
    expect(move('shoot', 'grade', 'editor', readyFacts({ cameraOriginalsReceived: 1 })).allowed).toBe(true);
  });

  it('grade → approval needs a description draft and a proposed slot', () => {
    expect(move('grade', 'approval', 'editor', readyFacts({ hasDescriptionDraft: false, hasProposedSlot: false })).missing).toEqual([
      'No description draft yet',
      'No publish slot proposed yet',
    ]);
  });

  it('approval → scheduled needs an approved slot', () => {
    expect(move('approval', 'scheduled', 'producer', readyFacts({ approvedSlotAt: undefined })).missing).toEqual([
      'No approved publish slot yet',
    ]);
  });

  it('approval → scheduled refuses a slot before a gear embargo, naming the gear and the embargo in its zone', () => {
    const facts = readyFacts({
      approvedSlotAt: '2026-05-01T09:00:00Z',
      // 2026-05-02 15:00 in Berlin = 13:00 UTC (CEST, UTC+2; IANA tz database).
      embargoes: [{ gearName: 'Korvala K9 body', embargoAt: zonedTimeToInstant('2026-05-02T15:00', 'Europe/Berlin'), zone: 'Europe/Berlin' }],
    });
    expect(move('approval', 'scheduled', 'producer', facts).missing).toEqual([
      'Approved slot 2026-05-01 09:00 UTC is before the embargo of Korvala K9 body (2026-05-02 15:00 Europe/Berlin)',
    ]);
  });

  it('approval → scheduled compares instants, not wall clocks (a case that only works once zones are applied)', () => {
    // Embargo 15:00 Berlin = 13:00 UTC. A 14:00 UTC slot reads "earlier" on the wall clock but is after it.
    const embargoes = [{ gearName: 'Brightwell 50mm', embargoAt: '2026-05-02T15:00:00+02:00', zone: 'Europe/Berlin' }];
    expect(move('approval', 'scheduled', 'producer', readyFacts({ approvedSlotAt: '2026-05-02T14:00:00Z', embargoes })).allowed).toBe(true);
    // 09:30 in New York (EDT, UTC−4) = 13:30 UTC: after the embargo although 09:30 < 15:00 on the clock.
    const ny = zonedTimeToInstant('2026-05-02T09:30', 'America/New_York');
    expect(ny).toBe('2026-05-02T13:30:00.000Z');
    expect(move('approval', 'scheduled', 'producer', readyFacts({ approvedSlotAt: ny, embargoes })).allowed).toBe(true);
    // 08:30 in New York = 12:30 UTC: before it.
    const early = zonedTimeToInstant('2026-05-02T08:30', 'America/New_York');
    expect(move('approval', 'scheduled', 'producer', readyFacts({ approvedSlotAt: early, embargoes })).missing).toEqual([
      'Approved slot 2026-05-02 12:30 UTC is before the embargo of Brightwell 50mm (2026-05-02 15:00 Europe/Berlin)',
    ]);
  });

  it('approval → scheduled accepts a slot exactly at the embargo ("not before")', () => {
    const facts = readyFacts({ approvedSlotAt: '2026-05-02T13:00:00Z' });
    expect(move('approval', 'scheduled', 'admin', facts).allowed).toBe(true);
  });

  it('approval → scheduled lists every embargo the slot is before', () => {
    const facts = readyFacts({
      approvedSlotAt: '2026-05-01T09:00:00Z',
      embargoes: [
        { gearName: 'Korvala K9 body', embargoAt: '2026-05-02T13:00:00Z', zone: 'Europe/Berlin' },
        { gearName: 'Brightwell 50mm', embargoAt: '2026-04-30T13:00:00Z', zone: 'UTC' },
        { gearName: 'Tessmark light', embargoAt: '2026-05-01T16:00:00Z', zone: 'America/New_York' },
      ],
    });
    expect(move('approval', 'scheduled', 'producer', facts).missing).toEqual([
      'Approved slot 2026-05-01 09:00 UTC is before the embargo of Korvala K9 body (2026-05-02 15:00 Europe/Berlin)',
      'Approved slot 2026-05-01 09:00 UTC is before the embargo of Tessmark light (2026-05-01 12:00 America/New_York)',
    ]);
  });

  it('approval → scheduled needs the disclosure when one is required', () => {
    const missing = move('approval', 'scheduled', 'producer', readyFacts({ disclosureRequired: true, disclosurePresent: false })).missing;
    expect(missing).toEqual([
      'The description has no disclosure, and it needs one: gear was loaned or sponsored, or a link earns a commission',
    ]);
    expect(move('approval', 'scheduled', 'producer', readyFacts({ disclosureRequired: false, disclosurePresent: false })).allowed).toBe(true);
  });

  it('scheduled → live needs now ≥ the approved slot and a public URL', () => {
    const slot = '2026-05-04T09:00:00Z';
    expect(move('scheduled', 'live', 'producer', readyFacts({ approvedSlotAt: slot, now: slot })).allowed).toBe(true);
    expect(move('scheduled', 'live', 'producer', readyFacts({ approvedSlotAt: slot, now: '2026-05-04T08:59:00Z' })).missing).toEqual([
      'The approved slot 2026-05-04 09:00 UTC has not come yet (now 2026-05-04 08:59 UTC)',
    ]);
    expect(move('scheduled', 'live', 'producer', readyFacts({ publicUrl: '  ' })).missing).toEqual(['No public URL recorded yet']);
    expect(move('scheduled', 'live', 'producer', readyFacts({ publicUrl: 'video.example.com/k9' })).missing).toEqual([
      'The public URL must be a full web address starting with https://',
    ]);
    expect(move('scheduled', 'live', 'producer', readyFacts({ approvedSlotAt: undefined })).missing).toEqual([
      'No approved publish slot yet',
    ]);
  });
});

describe('forward moves that skip a stage', () => {
  it('refuses every non-adjacent forward move, whoever asks', () => {
    for (let i = 0; i < STAGES.length; i++) {
      for (let j = i + 2; j < STAGES.length; j++) {
        const result = move(STAGES[i], STAGES[j], 'admin');
        expect(result.allowed).toBe(false);
        expect(result.direction).toBe('forward');
        expect(result.missing).toHaveLength(1);
      }
    }
    expect(move('plan', 'grade', 'admin').missing).toEqual([
      'Episodes move forward one stage at a time: from Plan the next stage is Shoot',
    ]);
  });
});

describe('back moves', () => {
  const reason = 'Codec was wrong on the spec sheet; reshoot the sweep';

  it('allows anyone who may move forward from the target stage, with a reason', () => {
    for (let i = 0; i < STAGES.length; i++) {
      for (let j = 0; j < i; j++) {
        const to = STAGES[j];
        for (const role of ROLES) {
          const mayForward = FORWARD_MOVE_ROLES[to as Exclude<Stage, 'live'>].includes(role);
          const result = move(STAGES[i], to, role, readyFacts(), reason);
          expect(result.direction).toBe('back');
          expect(result.needsReason).toBe(true);
          expect(result.allowed).toBe(mayForward);
        }
      }
    }
  });

  it('refuses a back move without a reason (empty or blank)', () => {
    for (const missingReason of [undefined, '', '   ']) {
      expect(move('grade', 'shoot', 'editor', readyFacts(), missingReason)).toEqual({
        allowed: false,
        missing: ['Give a reason for moving the episode back to Shoot'],
        direction: 'back',
        needsReason: true,
      });
    }
  });

  it('ignores forward requirements when moving back (nothing is lost by going back)', () => {
    const facts = readyFacts({ testCount: 0, cameraOriginalsReceived: 0, approvedSlotAt: undefined });
    expect(move('live', 'plan', 'host', facts, reason).allowed).toBe(true);
  });

  it('names the roles that may send an episode back there', () => {
    expect(move('live', 'scheduled', 'host', readyFacts(), reason).missing).toEqual([
      'Only a producer or admin can move an episode back to Scheduled (your role here is host)',
    ]);
    expect(move('grade', 'plan', 'editor', readyFacts()).missing).toEqual([
      'Only a host, producer or admin can move an episode back to Plan (your role here is editor)',
      'Give a reason for moving the episode back to Plan',
    ]);
  });
});

describe('same-stage moves', () => {
  it('are reorders within a column: allowed for every role, no reason needed', () => {
    for (const stage of STAGES) {
      for (const role of ROLES) {
        expect(move(stage, stage, role, readyFacts({ testCount: 0 }))).toEqual({
          allowed: true,
          missing: [],
          direction: 'same',
          needsReason: false,
        });
      }
    }
  });
});

describe('bad input', () => {
  it('throws InvalidInputError for an unknown stage or role, or an unreadable instant', () => {
    expect(() => move('plan' as Stage, 'edit' as Stage, 'host')).toThrow(/not a stage/);
    expect(() => move('plan', 'shoot', 'owner' as Role)).toThrow(/not a role/);
    expect(() => move('approval', 'scheduled', 'producer', readyFacts({ approvedSlotAt: 'next Tuesday' }))).toThrow(
      /not a date-time/,
    );
  });
});

describe('canRole (PRODUCT.md "Who uses it")', () => {
  // Expected table written from PRODUCT.md's roles table (and issue #7: host or editor proposes a slot).
  const expected: Record<RoleAction, Role[]> = {
    'episode.create': ['host', 'producer', 'admin'],
    'plan.edit': ['host', 'producer', 'admin'],
    'footage.upload': ['host', 'editor', 'producer', 'admin'],
    'footage.pickup': ['editor', 'admin'],
    'readout.run': ['editor', 'admin'],
    'description.edit': ['host', 'editor', 'producer', 'admin'],
    'slot.propose': ['host', 'editor', 'producer', 'admin'],
    'slot.approve': ['producer', 'admin'],
    'gear.manage': ['producer', 'admin'],
    'members.manage': ['admin'],
    'channel.settings': ['admin'],
  };

  it('covers exactly the listed actions', () => {
    expect([...ROLE_ACTIONS].sort()).toEqual(Object.keys(expected).sort());
  });

  for (const action of Object.keys(expected) as RoleAction[]) {
    for (const role of ROLES) {
      const allowed = expected[action].includes(role);
      it(`${role} ${allowed ? 'may' : 'may not'} ${action}`, () => {
        expect(canRole(role, action)).toBe(allowed);
      });
    }
  }

  it('a producer may do everything a host may; an admin may do everything', () => {
    for (const action of ROLE_ACTIONS) {
      if (canRole('host', action)) expect(canRole('producer', action)).toBe(true);
      expect(canRole('admin', action)).toBe(true);
    }
  });

  it('refuses an unknown action', () => {
    expect(canRole('admin', 'episode.delete' as RoleAction)).toBe(false);
  });
});

describe('facts for moves past Approval', () => {
  it('judge approval → scheduled and scheduled → live on the slot, embargo and URL alone', () => {
    const now = '2026-05-04T09:30:00Z';
    expect(move('approval', 'scheduled', 'producer', factsPastApproval({ now, approvedSlotAt: '2026-05-05T09:00:00Z' })).allowed).toBe(true);
    // An embargo still running stops the approval (PRODUCT.md stage rules).
    const embargoed = factsPastApproval({ now, approvedSlotAt: '2026-05-05T09:00:00Z', embargoes: [{ gearName: 'Korvala K9 body', embargoAt: '2026-05-06T13:00:00Z', zone: 'Europe/Berlin' }] });
    expect(move('approval', 'scheduled', 'producer', embargoed).allowed).toBe(false);
    expect(move('scheduled', 'live', 'producer', factsPastApproval({ now, approvedSlotAt: '2026-05-04T09:00:00Z', publicUrl: 'https://video.example.com/watch/k9' })).allowed).toBe(true);
    expect(move('scheduled', 'live', 'producer', factsPastApproval({ now, approvedSlotAt: '2026-05-04T09:00:00Z' })).allowed).toBe(false);
  });

  it('do not make an earlier move pass: plan → shoot still needs a test', () => {
    expect(move('plan', 'shoot', 'host', factsPastApproval({ now: '2026-05-04T09:30:00Z' })).allowed).toBe(false);
  });
});

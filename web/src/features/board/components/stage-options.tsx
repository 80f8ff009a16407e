import { STAGE_LABELS, STAGES, type Stage } from '@midgray/shared';

/** The stages a "Move to…" list offers from `stage`: every earlier one (back moves need a reason) and the next. */
export function StageOptions({ stage }: { stage: Stage }) {
  const here = STAGES.indexOf(stage);
  return STAGES.map((s, i) =>
    i === here || i > here + 1 ? null : (
      <option key={s} value={s}>
        {i < here ? `← ${STAGE_LABELS[s]} (back, with a reason)` : `${STAGE_LABELS[s]} →`}
      </option>
    ),
  );
}

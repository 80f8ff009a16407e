import { useState } from 'react';
import { MOVE_REASON_MAX, STAGE_LABELS, type Stage } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { Dialog } from '../../../components/ui/dialog.tsx';
import { TextAreaField } from '../../../components/ui/field.tsx';

/** A back move waiting for its reason. */
export interface PendingBackMove {
  title: string;
  from: Stage;
  to: Stage;
  confirm: (reason: string) => void;
}

/** Asks why an episode goes back a stage; the reason is kept in the episode's activity list. */
export function ReasonDialog({ pending, onClose }: { pending: PendingBackMove | null; onClose: () => void }) {
  return (
    <Dialog
      open={pending !== null}
      onClose={onClose}
      title={pending ? `Move back to ${STAGE_LABELS[pending.to]}?` : 'Move back'}
      description={pending ? <>“{pending.title}” goes from {STAGE_LABELS[pending.from]} back to {STAGE_LABELS[pending.to]}. Say why: the team sees it in the episode’s activity.</> : null}
    >
      {pending && <ReasonForm pending={pending} onClose={onClose} />}
    </Dialog>
  );
}

function ReasonForm({ pending, onClose }: { pending: PendingBackMove; onClose: () => void }) {
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | undefined>();
  return (
    <form
      className="flex flex-col gap-4"
      onSubmit={(e) => {
        e.preventDefault();
        if (reason.trim() === '') return setError('Give a reason, e.g. "Codec was wrong on the spec sheet: reshoot the sweep"');
        pending.confirm(reason.trim());
        onClose();
      }}
    >
      <TextAreaField label="Reason" rows={3} maxLength={MOVE_REASON_MAX} value={reason} onChange={(e) => setReason(e.target.value)} error={error} autoFocus />
      <div className="flex justify-end gap-2">
        <Button variant="ghost" onClick={onClose}>
          Keep it in {STAGE_LABELS[pending.from]}
        </Button>
        <Button variant="primary" type="submit">
          Move back
        </Button>
      </div>
    </form>
  );
}

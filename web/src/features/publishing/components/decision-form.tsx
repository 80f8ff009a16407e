import { useId, useState } from 'react';
import { SLOT_COMMENT_MAX } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useApproveSlot, useRejectSlot } from '../api/schedule.ts';

/** Lines of a refusal: the API lists what is missing in `details.missing`. */
function refusalLines(err: unknown): string[] | undefined {
  const missing = err instanceof ApiError ? (err.details as { missing?: unknown } | undefined)?.missing : undefined;
  return Array.isArray(missing) ? missing.map(String) : undefined;
}

/** Approve or reject a proposed slot with a comment (required to reject). */
export function DecisionForm({ slotId, title, blocked = false, onDone }: { slotId: string; title: string; blocked?: boolean; onDone?: () => void }) {
  const id = useId();
  const toast = useToast();
  const approve = useApproveSlot();
  const reject = useRejectSlot();
  const [comment, setComment] = useState('');
  const [needComment, setNeedComment] = useState(false);
  const busy = approve.isPending || reject.isPending;

  const onApprove = () =>
    approve.mutate(
      { slotId, comment: comment.trim() || undefined },
      {
        onError: (e) => toast({ tone: 'error', title: e instanceof ApiError && e.status === 422 ? 'This slot cannot be approved' : e.message, lines: refusalLines(e) }),
        onSuccess: () => {
          toast({ tone: 'success', title: `Approved: “${title}” is scheduled` });
          onDone?.();
        },
      },
    );
  const onReject = () => {
    if (comment.trim() === '') {
      setNeedComment(true);
      document.getElementById(`${id}-comment`)?.focus();
      return;
    }
    reject.mutate(
      { slotId, comment: comment.trim() },
      {
        onError: (e) => toast({ tone: 'error', title: e.message }),
        onSuccess: () => {
          toast({ tone: 'info', title: `Rejected the slot of “${title}”; the host and editor were told why` });
          onDone?.();
        },
      },
    );
  };

  return (
    <div className="flex flex-col gap-2 rounded-md border border-line bg-paper/60 p-3">
      <label htmlFor={`${id}-comment`} className="text-sm font-medium text-ink-soft">
        Comment for the host and editor {needComment ? '(needed to reject)' : '(optional to approve, needed to reject)'}
      </label>
      <textarea
        id={`${id}-comment`}
        rows={2}
        maxLength={SLOT_COMMENT_MAX}
        value={comment}
        onChange={(e) => {
          setComment(e.target.value);
          if (e.target.value.trim()) setNeedComment(false);
        }}
        aria-invalid={needComment}
        aria-describedby={needComment ? `${id}-need` : undefined}
        className="w-full rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm aria-[invalid=true]:border-danger"
      />
      {needComment && (
        <p id={`${id}-need`} className="text-xs font-medium text-danger" role="alert">
          Say why the slot is rejected, so the host and editor can propose a better one.
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <Button variant="primary" onClick={onApprove} disabled={busy} aria-describedby={blocked ? `${id}-blocked` : undefined}>
          Approve slot
        </Button>
        <Button variant="danger" onClick={onReject} disabled={busy}>
          Reject slot
        </Button>
      </div>
      {blocked && (
        <p id={`${id}-blocked`} className="text-xs text-ink-muted">
          The checks above will refuse approval until they are fixed.
        </p>
      )}
    </div>
  );
}

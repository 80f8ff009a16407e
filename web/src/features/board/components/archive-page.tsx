import { Link } from 'react-router-dom';
import { canRole, STAGE_LABELS } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { ErrorNote, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { useChannel } from '../../channels/current-channel.tsx';
import { useArchiveEpisode, useArchivedEpisodes } from '../api/episodes.ts';
import { formatInstant } from '../dates.ts';

/** Archived episodes: off the board, kept with everything they had; hosts, producers and admins restore them. */
export function ArchivePage() {
  const channel = useChannel();
  const list = useArchivedEpisodes(channel.id);
  const restore = useArchiveEpisode();
  const toast = useToast();
  const canRestore = canRole(channel.role, 'episode.create');
  return (
    <div>
      <PageHeader
        title="Archive"
        description="Episodes taken off the board. Nothing in them is deleted; restoring one puts it back at the end of the column it was in."
        actions={
          <Link to="/board" className="inline-flex min-h-9 items-center rounded-md border border-line-strong bg-card px-3 py-1.5 text-sm font-semibold hover:bg-paper">
            Back to the board
          </Link>
        }
      />
      <Panel>
        {list.isLoading && <Loading what="Loading the archive" />}
        {list.error && <ErrorNote error={list.error} />}
        {list.data?.length === 0 && <p className="text-sm text-ink-muted">No archived episodes.</p>}
        {list.data && list.data.length > 0 && (
          <ul className="divide-y divide-line">
            {list.data.map((e) => (
              <li key={e.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
                <div className="min-w-0">
                  <Link to={`/episodes/${e.id}`} className="font-semibold hover:underline">
                    {e.title}
                  </Link>
                  <p className="text-sm text-ink-muted">
                    Was in {STAGE_LABELS[e.stage]} · archived {formatInstant(e.archivedAt, channel.timeZone)}
                    {e.archivedBy ? ` by ${e.archivedBy}` : ''}
                    {e.hostName ? ` · host ${e.hostName}` : ''}
                  </p>
                </div>
                {canRestore && (
                  <Button
                    onClick={() =>
                      restore.mutate(
                        { episodeId: e.id, version: e.version, archive: false },
                        { onSuccess: () => toast({ tone: 'success', title: `“${e.title}” is back on the board in ${STAGE_LABELS[e.stage]}` }), onError: (err) => toast({ tone: 'error', title: err.message }) },
                      )
                    }
                    disabled={restore.isPending}
                  >
                    Restore
                  </Button>
                )}
              </li>
            ))}
          </ul>
        )}
      </Panel>
    </div>
  );
}

import { useState } from 'react';
import type { DescriptionVersion } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { ErrorNote, Loading, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { useDescriptionVersions, useRestoreDescription } from '../api/description.ts';

const PART_LABEL: Record<DescriptionVersion['changed'][number], string> = { summary: 'summary', chapters: 'chapters', gearLinks: 'links', disclosure: 'disclosure' };

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** Saved versions (who, when, what changed) with restore; restoring makes a new version. */
export function DescriptionVersions({ episodeId, currentVersion, canEdit, dirty, onRestored, onBeforeRestore }: { episodeId: string; currentVersion: number; canEdit: boolean; dirty: boolean; onRestored: () => void; onBeforeRestore: () => void }) {
  const versions = useDescriptionVersions(episodeId);
  const restore = useRestoreDescription(episodeId);
  const toast = useToast();
  const [confirm, setConfirm] = useState<string | null>(null);
  return (
    <Panel title="Versions">
      {versions.isLoading && <Loading what="Loading versions" />}
      {versions.error && <ErrorNote error={versions.error} />}
      {versions.data?.length === 0 && <p className="text-sm text-ink-muted">No saved version yet.</p>}
      <ol className="flex flex-col divide-y divide-line">
        {versions.data?.map((v) => (
          <li key={v.id} className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
            <div className="min-w-0">
              <p className="font-semibold">
                Version {v.version}
                {v.version === currentVersion && <span className="ml-2 rounded bg-ok-soft px-1.5 py-0.5 text-xs font-medium text-ok">current</span>}
              </p>
              <p className="text-ink-soft">
                {v.author?.name ?? 'Someone'} · <time dateTime={v.createdAt}>{when(v.createdAt)}</time>
              </p>
              <p className="text-xs text-ink-muted">
                {v.restoredFrom !== null ? `Restored version ${v.restoredFrom}` : v.changed.length ? `Changed ${v.changed.map((c) => PART_LABEL[c]).join(', ')}` : 'First version'} · {v.characters.toLocaleString('en')} characters
              </p>
            </div>
            {canEdit && v.version !== currentVersion && (
              <div className="flex gap-1">
                {confirm === v.id ? (
                  <>
                    <Button
                      variant="primary"
                      disabled={restore.isPending}
                      onClick={() => {
                        // Drop unsaved edits first, so the restored text replaces the form.
                        onBeforeRestore();
                        restore.mutate(
                          { versionId: v.id, version: currentVersion },
                          {
                            onError: (e) => toast({ tone: 'error', title: e.message }),
                            onSuccess: (d) => {
                              toast({ tone: 'success', title: `Version ${v.version} restored as version ${d.version}` });
                              onRestored();
                            },
                            onSettled: () => setConfirm(null),
                          },
                        );
                      }}
                    >
                      Restore{dirty ? ' and drop my edits' : ''}
                    </Button>
                    <Button variant="ghost" onClick={() => setConfirm(null)}>
                      Cancel
                    </Button>
                  </>
                ) : (
                  <Button variant="ghost" onClick={() => setConfirm(v.id)} aria-label={`Restore version ${v.version}`}>
                    Restore
                  </Button>
                )}
              </div>
            )}
          </li>
        ))}
      </ol>
    </Panel>
  );
}

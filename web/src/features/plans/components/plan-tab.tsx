import { useState } from 'react';
import { Link } from 'react-router-dom';
import { TEST_KIND_LABELS, TEST_KINDS, type TestDto, type TestKind } from '@midgray/shared';
import type { EpisodeTabProps } from '../../../app/episode-tabs.tsx';
import { Button } from '../../../components/ui/button.tsx';
import { ErrorNote, Loading, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { shotListCsvPath, useDeleteTest, useEpisodePlan } from '../api/plans.ts';
import { LightingPanel } from './lighting-panel.tsx';
import { SpecSheet } from './spec-sheet.tsx';
import { StepList } from './step-list.tsx';
import { StorageEstimate } from './storage-estimate.tsx';
import { TestEditor } from './test-editor.tsx';

const KIND_HELP: Record<TestKind, string> = {
  iso_sweep: 'One step per ISO value; ND, aperture, shutter or light hold the exposure.',
  latitude_bracket: 'Offsets −N…+N stops at base ISO, with the correction the grade applies.',
  custom: 'Your own list of steps and settings.',
};

function TestView({ episodeId, test, canEdit }: { episodeId: string; test: TestDto; canEdit: boolean }) {
  const toast = useToast();
  const [editing, setEditing] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const remove = useDeleteTest(episodeId);
  const missing = test.specLines.filter((l) => l.required && l.value.trim() === '').length;
  return (
    <div className="flex flex-col gap-4">
      <Panel
        title={test.name}
        actions={
          canEdit && (
            <div className="flex flex-wrap gap-2">
              {!editing && <Button onClick={() => setEditing(true)}>Edit inputs</Button>}
              {confirmDelete ? (
                <>
                  <Button variant="danger" disabled={remove.isPending} onClick={() => remove.mutate({ id: test.id, version: test.version }, { onError: (e) => toast({ tone: 'error', title: e.message }), onSuccess: () => toast({ tone: 'info', title: `Deleted “${test.name}”` }) })}>
                    Delete with its steps
                  </Button>
                  <Button variant="ghost" onClick={() => setConfirmDelete(false)}>
                    Keep
                  </Button>
                </>
              ) : (
                <Button variant="ghost" onClick={() => setConfirmDelete(true)} aria-label={`Delete ${test.name}`}>
                  Delete
                </Button>
              )}
            </div>
          )
        }
      >
        <p className="-mt-2 mb-3 text-xs text-ink-muted">
          {TEST_KIND_LABELS[test.kind]} · {test.steps.length} steps · {test.secondsPerStep} s per step
        </p>
        {editing ? (
          <TestEditor episodeId={episodeId} kind={test.kind} test={test} onDone={() => setEditing(false)} />
        ) : (
          <StepList episodeId={episodeId} test={test} canEdit={canEdit} />
        )}
      </Panel>
      <Panel title="Spec sheet" actions={missing > 0 ? <span className="rounded-full bg-warn-soft px-2 py-0.5 text-xs font-semibold text-warn">{missing} required empty</span> : undefined}>
        <SpecSheet episodeId={episodeId} test={test} canEdit={canEdit} />
      </Panel>
      <div className="grid gap-4 lg:grid-cols-[2fr_3fr]">
        <Panel title="Storage estimate">
          <StorageEstimate test={test} />
        </Panel>
        <Panel title="Lighting load">
          <LightingPanel episodeId={episodeId} test={test} canEdit={canEdit} />
        </Panel>
      </div>
    </div>
  );
}

/** The episode's Plan tab: its tests, the steps each gives, spec sheets, storage, lighting and the shot list. */
export default function PlanTab({ episodeId }: EpisodeTabProps) {
  const plan = useEpisodePlan(episodeId);
  const [selected, setSelected] = useState<string | null>(null);
  const [adding, setAdding] = useState<TestKind | null>(null);
  if (plan.isLoading) return <Loading what="Loading the plan" />;
  if (plan.error) return <ErrorNote error={plan.error} />;
  const { tests, canEdit } = plan.data!;
  const current = tests.find((t) => t.id === selected) ?? tests[0];
  const steps = tests.reduce((n, t) => n + t.steps.length, 0);
  const shot = tests.reduce((n, t) => n + t.steps.filter((s) => s.shotAt).length, 0);
  const missing = tests.reduce((n, t) => n + t.specLines.filter((l) => l.required && l.value.trim() === '').length, 0);

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 className="text-lg font-bold">Test plan</h2>
          <p className="text-sm text-ink-soft">
            {tests.length} {tests.length === 1 ? 'test' : 'tests'} · {steps} steps · {shot} shot
            {tests.length > 0 && (missing > 0 ? <span className="text-warn"> · {missing} required spec-sheet {missing === 1 ? 'line' : 'lines'} to fill before the shoot</span> : <span className="text-ok"> · spec sheets ready for the shoot</span>)}
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {tests.length > 0 && (
            <>
              <Link to={`/episodes/${episodeId}/shot-list`} className="inline-flex min-h-9 items-center rounded-md border border-line-strong bg-card px-3 py-1.5 text-sm font-semibold hover:bg-paper">
                Shot list
              </Link>
              <a href={shotListCsvPath(episodeId)} download className="inline-flex min-h-9 items-center rounded-md border border-line-strong bg-card px-3 py-1.5 text-sm font-semibold hover:bg-paper">
                Download CSV
              </a>
            </>
          )}
        </div>
      </div>

      {canEdit && !adding && (
        <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Add a test">
          <span className="text-sm font-medium text-ink-soft">Add:</span>
          {TEST_KINDS.map((k) => (
            <Button key={k} onClick={() => setAdding(k)} title={KIND_HELP[k]}>
              + {TEST_KIND_LABELS[k]}
            </Button>
          ))}
        </div>
      )}
      {adding && (
        <Panel title={`New test: ${TEST_KIND_LABELS[adding]}`}>
          <p className="-mt-2 mb-3 text-xs text-ink-muted">{KIND_HELP[adding]}</p>
          <TestEditor
            episodeId={episodeId}
            kind={adding}
            onDone={(saved) => {
              setAdding(null);
              if (saved) setSelected(saved.id);
            }}
          />
        </Panel>
      )}

      {tests.length === 0 && !adding && (
        <Panel>
          <p className="text-sm text-ink-soft">No tests yet. {canEdit ? 'Add an ISO sweep, a latitude bracket or a custom test: the steps appear as you fill in the inputs.' : 'The host adds them here.'}</p>
        </Panel>
      )}

      {tests.length > 1 && (
        <div role="group" aria-label="Tests of this episode" className="-mx-1 flex gap-1 overflow-x-auto px-1 pb-1">
          {tests.map((t) => (
            <button
              key={t.id}
              type="button"
              aria-pressed={t.id === current?.id}
              onClick={() => setSelected(t.id)}
              className={`rounded-md border px-3 py-1.5 text-sm font-semibold whitespace-nowrap ${t.id === current?.id ? 'border-ink bg-ink text-white' : 'border-line-strong bg-card text-ink hover:bg-paper'}`}
            >
              {t.name}
              <span className={`ml-2 text-xs font-normal ${t.id === current?.id ? 'text-white/80' : 'text-ink-muted'}`}>
                {t.steps.filter((s) => s.shotAt).length}/{t.steps.length}
              </span>
            </button>
          ))}
        </div>
      )}
      {current && <TestView key={current.id} episodeId={episodeId} test={current} canEdit={canEdit} />}
    </div>
  );
}

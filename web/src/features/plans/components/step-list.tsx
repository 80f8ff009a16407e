import { useState } from 'react';
import type { TestDto, TestStepDto } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { fmtError, fmtF, fmtIso, fmtLight, fmtNd, fmtShutter } from '../plan-format.ts';
import { DifferenceNote, MarkShotForm } from './mark-shot-form.tsx';

function ShotState({ step }: { step: TestStepDto }) {
  if (!step.shotAt) return <span className="text-xs text-ink-muted">Not shot</span>;
  return (
    <span className="inline-flex flex-wrap items-center gap-1 text-xs">
      <span className="rounded-full bg-ok-soft px-2 py-0.5 font-semibold text-ok">Shot</span>
      {step.rating && <span role="img" aria-label={`rated ${step.rating} of 5`} className="font-semibold">{'★'.repeat(step.rating)}<span className="text-line-strong">{'★'.repeat(5 - step.rating)}</span></span>}
      <span className="text-ink-muted">
        {step.shotBy?.name} · {new Date(step.shotAt).toLocaleString(undefined, { dateStyle: 'short', timeStyle: 'short' })}
      </span>
    </span>
  );
}

const stepTitle = (test: TestDto, s: TestStepDto) => (test.kind === 'latitude_bracket' ? (s.planned.offsetLabel ?? s.label) : s.label);

/** The saved steps of a test with what happened on set; editors of the plan mark steps shot here. */
export function StepList({ episodeId, test, canEdit, locked }: { episodeId: string; test: TestDto; canEdit: boolean; locked?: string }) {
  const [open, setOpen] = useState<string | null>(null);
  const shot = test.steps.filter((s) => s.shotAt).length;
  const action = (s: TestStepDto) =>
    canEdit && (
      <Button className="min-h-11 md:min-h-8" variant={s.shotAt ? 'ghost' : 'secondary'} disabled={!!locked} title={locked} onClick={() => setOpen(open === s.id ? null : s.id)} aria-expanded={open === s.id} aria-label={`${s.shotAt ? 'Edit shot' : 'Mark shot'}: ${s.label}`}>
        {s.shotAt ? 'Edit shot' : 'Mark shot'}
      </Button>
    );
  const form = (s: TestStepDto) => open === s.id && <MarkShotForm episodeId={episodeId} testId={test.id} step={s} onClose={() => setOpen(null)} />;

  return (
    <div>
      <p className="mb-2 text-sm text-ink-soft" aria-live="polite">
        {shot} of {test.steps.length} steps shot
      </p>
      {/* Phone and narrow screens: one card per step. */}
      <ol className="flex flex-col gap-2 md:hidden" aria-label={`Steps of ${test.name}`}>
        {test.steps.map((s) => (
          <li key={s.id} className={`rounded-md border p-3 ${s.planned.warning ? 'border-warn/50 bg-warn-soft' : 'border-line bg-card'}`}>
            <div className="flex items-start justify-between gap-2">
              <div className="min-w-0">
                <p className="font-semibold">
                  <span className="mr-1 text-ink-muted tabular-nums">{s.index + 1}.</span>
                  {stepTitle(test, s)}
                </p>
                <p className="text-sm text-ink-soft tabular-nums">
                  {test.kind !== 'iso_sweep' && s.planned.iso !== null && <>ISO {s.planned.iso} · </>}ND {fmtNd(s.planned.ndDensity)} · {fmtF(s.planned.fNumber)} · {fmtShutter(s.planned)}
                  {s.planned.lightChangeStops ? <> · light {fmtLight(s.planned.lightChangeStops)}</> : null}
                </p>
                {s.planned.gradeCorrectionLabel && <p className="text-xs text-ink-muted">{s.planned.gradeCorrectionLabel}</p>}
                {s.planned.warning && <p className="text-xs font-medium text-warn">{s.planned.warning}</p>}
              </div>
              {action(s)}
            </div>
            <div className="mt-1">
              <ShotState step={s} />
            </div>
            {s.actual && open !== s.id && <DifferenceNote step={s} actual={s.actual} />}
            {s.observation && open !== s.id && <p className="mt-1 text-sm whitespace-pre-line">{s.observation}</p>}
            {form(s) && <div className="mt-2">{form(s)}</div>}
          </li>
        ))}
      </ol>
      {/* Wider screens: a table. */}
      <div className="hidden overflow-x-auto rounded-md border border-line md:block">
        <table className="w-full text-sm">
          <caption className="sr-only">Steps of {test.name}</caption>
          <thead className="bg-paper text-left text-xs text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2">#</th>
              <th scope="col" className="px-3 py-2">{test.kind === 'iso_sweep' ? 'ISO' : test.kind === 'latitude_bracket' ? 'Offset' : 'Step'}</th>
              {test.kind !== 'iso_sweep' && <th scope="col" className="px-3 py-2">ISO</th>}
              <th scope="col" className="px-3 py-2">ND</th>
              <th scope="col" className="px-3 py-2">Aperture</th>
              <th scope="col" className="px-3 py-2">Shutter</th>
              <th scope="col" className="px-3 py-2">Light</th>
              {test.kind !== 'custom' && <th scope="col" className="px-3 py-2">Error</th>}
              {test.kind === 'latitude_bracket' && <th scope="col" className="px-3 py-2">Grade</th>}
              <th scope="col" className="px-3 py-2">On set</th>
              {canEdit && <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>}
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {test.steps.map((s) => {
              const cols = 8 + (test.kind !== 'iso_sweep' ? 1 : 0) + (test.kind === 'latitude_bracket' ? 1 : 0) - (test.kind === 'custom' ? 1 : 0) + (canEdit ? 1 : 0);
              return [
                <tr key={s.id} className={s.planned.warning ? 'bg-warn-soft' : undefined}>
                  <td className="px-3 py-2 align-top text-ink-muted tabular-nums">{s.index + 1}</td>
                  <th scope="row" className="px-3 py-2 text-left align-top font-semibold tabular-nums">{stepTitle(test, s)}</th>
                  {test.kind !== 'iso_sweep' && <td className="px-3 py-2 align-top tabular-nums">{fmtIso(s.planned.iso)}</td>}
                  <td className="px-3 py-2 align-top tabular-nums">{fmtNd(s.planned.ndDensity)}</td>
                  <td className="px-3 py-2 align-top tabular-nums">{fmtF(s.planned.fNumber)}</td>
                  <td className="px-3 py-2 align-top tabular-nums">{fmtShutter(s.planned)}</td>
                  <td className="px-3 py-2 align-top tabular-nums">{fmtLight(s.planned.lightChangeStops)}</td>
                  {test.kind !== 'custom' && <td className="px-3 py-2 align-top tabular-nums">{fmtError(s.planned.exposureErrorStops)}</td>}
                  {test.kind === 'latitude_bracket' && <td className="px-3 py-2 align-top text-xs">{s.planned.gradeCorrectionLabel}</td>}
                  <td className="max-w-[22rem] px-3 py-2 align-top">
                    <ShotState step={s} />
                    {s.planned.warning && <p className="text-xs font-medium text-warn">{s.planned.warning}</p>}
                    {s.actual && <DifferenceNote step={s} actual={s.actual} />}
                    {s.observation && <p className="mt-0.5 line-clamp-2 text-xs whitespace-pre-line text-ink-soft">{s.observation}</p>}
                  </td>
                  {canEdit && <td className="px-3 py-2 text-right align-top">{action(s)}</td>}
                </tr>,
                open === s.id && (
                  <tr key={`${s.id}-form`}>
                    <td colSpan={cols} className="px-3 py-2">
                      {form(s)}
                    </td>
                  </tr>
                ),
              ];
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}

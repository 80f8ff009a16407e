import type { StepDraft, TestKind } from '@midgray/shared';
import { fmtError, fmtF, fmtIso, fmtLight, fmtNd, fmtShutter } from '../plan-format.ts';

/** The steps a test's inputs give, as a table that follows the form while the person types. */
export function StepsPreview({ kind, drafts, caption }: { kind: TestKind; drafts: StepDraft[]; caption: string }) {
  const warnings = drafts.filter((d) => d.planned.warning).length;
  return (
    <div>
      <div className="overflow-x-auto rounded-md border border-line">
        <table className="w-full min-w-[36rem] text-sm">
          <caption className="px-3 py-2 text-left text-xs text-ink-muted">
            {caption} {drafts.length} {drafts.length === 1 ? 'step' : 'steps'}
            {warnings > 0 && <span className="ml-1 font-semibold text-warn">· {warnings} cannot be held</span>}
          </caption>
          <thead className="bg-paper text-left text-xs text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">#</th>
              <th scope="col" className="px-3 py-2 font-semibold">{kind === 'iso_sweep' ? 'ISO' : kind === 'latitude_bracket' ? 'Offset' : 'Step'}</th>
              {kind === 'custom' && <th scope="col" className="px-3 py-2 font-semibold">ISO</th>}
              <th scope="col" className="px-3 py-2 font-semibold">ND</th>
              <th scope="col" className="px-3 py-2 font-semibold">Aperture</th>
              <th scope="col" className="px-3 py-2 font-semibold">Shutter</th>
              <th scope="col" className="px-3 py-2 font-semibold">Light</th>
              {kind !== 'custom' && <th scope="col" className="px-3 py-2 font-semibold">Error</th>}
              {kind === 'latitude_bracket' && <th scope="col" className="px-3 py-2 font-semibold">Grade</th>}
              <th scope="col" className="px-3 py-2 font-semibold">Note</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {drafts.map((d) => (
              <tr key={d.index} className={d.planned.warning ? 'bg-warn-soft' : undefined}>
                <td className="px-3 py-1.5 text-ink-muted tabular-nums">{d.index + 1}</td>
                <th scope="row" className="px-3 py-1.5 text-left font-semibold tabular-nums">
                  {kind === 'iso_sweep' ? d.iso : kind === 'latitude_bracket' ? d.planned.offsetLabel : d.label}
                </th>
                {kind === 'custom' && <td className="px-3 py-1.5 tabular-nums">{fmtIso(d.planned.iso)}</td>}
                <td className="px-3 py-1.5 tabular-nums">{fmtNd(d.planned.ndDensity)}</td>
                <td className="px-3 py-1.5 tabular-nums">{fmtF(d.planned.fNumber)}</td>
                <td className="px-3 py-1.5 tabular-nums">{fmtShutter(d.planned)}</td>
                <td className="px-3 py-1.5 tabular-nums">{fmtLight(d.planned.lightChangeStops)}</td>
                {kind !== 'custom' && <td className="px-3 py-1.5 tabular-nums">{fmtError(d.planned.exposureErrorStops)}</td>}
                {kind === 'latitude_bracket' && <td className="px-3 py-1.5">{d.planned.gradeCorrectionLabel}</td>}
                <td className="px-3 py-1.5 text-xs">{d.planned.warning ? <span className="font-medium text-warn">{d.planned.warning}</span> : (d.planned.notes ?? '')}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

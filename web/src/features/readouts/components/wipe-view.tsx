// Reference and recovered frames of a latitude step: a wipe (drag the divider), side by side, or
// the false-colour difference map with its legend.
import { useId, useState } from 'react';
import type { ReadoutDto } from '@midgray/shared';
import { readoutImagePath } from '../api/readouts.ts';

type Mode = 'wipe' | 'side' | 'map';

/** Legend of the difference map (the stops of the server's DIFFERENCE_MAP_LEGEND). */
const LEGEND = [
  { deltaE: '0', rgb: 'rgb(16,16,24)' },
  { deltaE: '1', rgb: 'rgb(30,60,150)' },
  { deltaE: '2.5', rgb: 'rgb(0,160,160)' },
  { deltaE: '5', rgb: 'rgb(240,210,40)' },
  { deltaE: '≥ 10', rgb: 'rgb(255,60,120)' },
];

export function WipeView({ readout, stepLabel }: { readout: ReadoutDto; stepLabel: string }) {
  const [mode, setMode] = useState<Mode>('wipe');
  const [split, setSplit] = useState(50);
  const sliderId = useId();
  const reference = readoutImagePath(readout.id, 'reference');
  const recovered = readoutImagePath(readout.id, 'frame');
  const modes: [Mode, string][] = [
    ['wipe', 'Wipe'],
    ['side', 'Side by side'],
    ['map', 'Difference map'],
  ];
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-1" role="group" aria-label="How to compare the frames">
        {modes.map(([m, label]) => (
          <button
            key={m}
            type="button"
            aria-pressed={mode === m}
            disabled={m === 'map' && !readout.hasDifferenceMap}
            onClick={() => setMode(m)}
            className={`rounded-md border px-3 py-1.5 text-sm font-semibold ${mode === m ? 'border-ink bg-ink text-white' : 'border-line-strong bg-card text-ink hover:bg-paper'} disabled:opacity-50`}
          >
            {label}
          </button>
        ))}
      </div>
      {mode === 'wipe' && (
        <div className="flex max-w-[720px] flex-col gap-2">
          <div className="relative w-full overflow-hidden rounded-md border border-line bg-ink">
            <img src={reference} alt={`Reference frame (0 stops)`} className="block h-auto w-full" />
            <img src={recovered} alt={`Recovered frame, ${stepLabel}`} className="absolute inset-0 block h-full w-full" style={{ clipPath: `inset(0 0 0 ${split}%)` }} />
            <div aria-hidden="true" className="absolute top-0 bottom-0 w-0.5 bg-[#ffcc33]" style={{ left: `${split}%` }} />
            <span className="absolute top-2 left-2 rounded bg-black/60 px-1.5 py-0.5 text-xs text-white">Reference</span>
            <span className="absolute top-2 right-2 rounded bg-black/60 px-1.5 py-0.5 text-xs text-white">{stepLabel}</span>
          </div>
          <label htmlFor={sliderId} className="text-sm text-ink-soft">
            Wipe position
          </label>
          <input id={sliderId} type="range" min={0} max={100} value={split} onChange={(e) => setSplit(Number(e.target.value))} className="w-full accent-[#b4471a]" />
        </div>
      )}
      {mode === 'side' && (
        <div className="grid gap-2 sm:grid-cols-2">
          <figure>
            <img src={reference} alt="Reference frame (0 stops)" className="block h-auto w-full rounded-md border border-line" />
            <figcaption className="mt-1 text-xs text-ink-muted">Reference (0 stops)</figcaption>
          </figure>
          <figure>
            <img src={recovered} alt={`Recovered frame, ${stepLabel}`} className="block h-auto w-full rounded-md border border-line" />
            <figcaption className="mt-1 text-xs text-ink-muted">Recovered, {stepLabel}</figcaption>
          </figure>
        </div>
      )}
      {mode === 'map' && readout.hasDifferenceMap && (
        <figure className="flex max-w-[720px] flex-col gap-2">
          <img
            src={readoutImagePath(readout.id, 'difference-map')}
            alt={`Difference map of ${stepLabel} against the reference: mean ΔE00 per cell`}
            className="block h-auto w-full rounded-md border border-line"
            style={{ imageRendering: 'pixelated' }}
          />
          <figcaption className="flex flex-wrap items-center gap-3 text-xs text-ink-soft">
            <span>Mean ΔE00 per cell:</span>
            {LEGEND.map((l) => (
              <span key={l.deltaE} className="inline-flex items-center gap-1">
                <span aria-hidden="true" className="inline-block h-3 w-5 rounded-sm border border-line" style={{ background: l.rgb }} />
                {l.deltaE}
              </span>
            ))}
          </figcaption>
        </figure>
      )}
    </div>
  );
}

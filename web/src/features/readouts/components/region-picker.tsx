// Draw the measuring rectangle on a frame: drag on the picture (mouse, pen or touch), or type the
// edges in percent. The region is saved per test in fractions of the frame, so every step (and
// any frame size) is measured on the same patch.
import { useEffect, useRef, useState, type PointerEvent } from 'react';
import type { ReadoutGrid, ReadoutRegion } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';

/** The centre tenth (the server's default when no region is saved), for drawing it. */
export const CENTRE_TENTH: ReadoutRegion = { x: 0.45, y: 0.45, w: 0.1, h: 0.1 };

const clamp = (v: number) => Math.min(1, Math.max(0, v));
const round4 = (v: number) => Math.round(v * 10_000) / 10_000;

/** The rectangle spanned by two corners (fractions), kept inside the frame and at least 0.5 % each way. */
export function regionFromCorners(a: { x: number; y: number }, b: { x: number; y: number }): ReadoutRegion {
  const x0 = clamp(Math.min(a.x, b.x));
  const y0 = clamp(Math.min(a.y, b.y));
  const x1 = clamp(Math.max(a.x, b.x));
  const y1 = clamp(Math.max(a.y, b.y));
  const w = Math.max(0.005, x1 - x0);
  const h = Math.max(0.005, y1 - y0);
  return { x: round4(Math.min(x0, 1 - w)), y: round4(Math.min(y0, 1 - h)), w: round4(w), h: round4(h) };
}

interface RegionPickerProps {
  /** The frame to draw on (a JPEG preview). */
  src: string;
  alt: string;
  /** The saved region (null: centre tenth). */
  saved: ReadoutRegion | null;
  grid: ReadoutGrid | null;
  canEdit: boolean;
  saving: boolean;
  onSave: (region: ReadoutRegion | null) => void;
}

export function RegionPicker({ src, alt, saved, grid, canEdit, saving, onSave }: RegionPickerProps) {
  const [draft, setDraft] = useState<ReadoutRegion | null>(saved);
  const [failed, setFailed] = useState(false);
  const start = useRef<{ x: number; y: number } | null>(null);
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => setDraft(saved), [saved]);
  const shown = draft ?? CENTRE_TENTH;
  const changed = JSON.stringify(draft) !== JSON.stringify(saved);

  const at = (e: PointerEvent) => {
    const r = box.current!.getBoundingClientRect();
    return { x: clamp((e.clientX - r.left) / r.width), y: clamp((e.clientY - r.top) / r.height) };
  };
  const onDown = (e: PointerEvent) => {
    if (!canEdit) return;
    e.currentTarget.setPointerCapture(e.pointerId);
    start.current = at(e);
  };
  const onMove = (e: PointerEvent) => {
    if (start.current) setDraft(regionFromCorners(start.current, at(e)));
  };
  const onUp = (e: PointerEvent) => {
    if (start.current) setDraft(regionFromCorners(start.current, at(e)));
    start.current = null;
  };
  const pct = (v: number) => `${(v * 100).toFixed(1)}`;
  const setEdge = (key: keyof ReadoutRegion, text: string) => {
    const v = Number(text) / 100;
    if (!Number.isFinite(v)) return;
    const next = { ...shown, [key]: round4(clamp(v)) };
    if (next.x + next.w > 1) next.w = round4(1 - next.x);
    if (next.y + next.h > 1) next.h = round4(1 - next.y);
    if (next.w > 0 && next.h > 0) setDraft(next);
  };

  return (
    <div className="flex flex-col gap-3">
      <div
        ref={box}
        className={`relative w-full max-w-[720px] touch-none overflow-hidden rounded-md border border-line bg-ink/90 select-none ${canEdit ? 'cursor-crosshair' : ''} ${failed ? 'min-h-40' : ''}`}
        onPointerDown={onDown}
        onPointerMove={onMove}
        onPointerUp={onUp}
      >
        {failed ? (
          <p className="p-4 text-sm text-white/85">The frame could not be shown; the region can still be typed below.</p>
        ) : (
          <img src={src} alt={alt} className="pointer-events-none block h-auto w-full" draggable={false} onError={() => setFailed(true)} />
        )}
        <div
          aria-hidden="true"
          className="pointer-events-none absolute border-2 border-[#ffcc33] shadow-[0_0_0_9999px_rgba(0,0,0,0.35)]"
          style={{ left: `${shown.x * 100}%`, top: `${shown.y * 100}%`, width: `${shown.w * 100}%`, height: `${shown.h * 100}%` }}
        >
          {grid &&
            Array.from({ length: grid.cols * grid.rows }, (_, i) => (
              <span
                key={i}
                className={`absolute border border-[#ffcc33]/60 ${grid.patch === i ? 'bg-[#ffcc33]/30' : ''}`}
                style={{ left: `${((i % grid.cols) / grid.cols) * 100}%`, top: `${(Math.floor(i / grid.cols) / grid.rows) * 100}%`, width: `${100 / grid.cols}%`, height: `${100 / grid.rows}%` }}
              />
            ))}
        </div>
      </div>
      <p className="text-xs text-ink-muted">
        {draft ? 'Measured on the yellow rectangle.' : 'No region saved: every step is measured on the centre tenth of the frame (shown).'}{' '}
        {canEdit ? 'Drag on the frame to draw a new one, or type its edges.' : 'Editors and admins set the region.'}
      </p>
      {canEdit && (
        <fieldset className="flex flex-wrap items-end gap-2">
          <legend className="sr-only">Region in percent of the frame</legend>
          {(['x', 'y', 'w', 'h'] as const).map((k) => (
            <TextField
              key={`${k}-${shown[k]}`}
              label={{ x: 'Left (%)', y: 'Top (%)', w: 'Width (%)', h: 'Height (%)' }[k]}
              type="number"
              inputMode="decimal"
              step="0.1"
              min={0}
              max={100}
              defaultValue={pct(shown[k])}
              onBlur={(e) => setEdge(k, e.target.value)}
              className="w-24"
            />
          ))}
          <Button variant="primary" disabled={!changed || saving} onClick={() => onSave(draft)}>
            {saving ? 'Saving…' : 'Save region'}
          </Button>
          <Button variant="ghost" disabled={saving || saved === null} onClick={() => onSave(null)}>
            Use centre tenth
          </Button>
        </fieldset>
      )}
    </div>
  );
}

import { useMemo, useState } from 'react';
import { CONTINUOUS_LOAD_FRACTION, ELECTRICAL_SAFETY_NOTE, circuitLoads, type CircuitLoadReport, type TestDto } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useSetLighting } from '../api/plans.ts';

interface CircuitRow { key: string; label: string; volts: string; breakerAmps: string }
interface FixtureRow { key: string; name: string; watts: string; quantity: string; circuitKey: string }

let seq = 0;
const newKey = () => `new-${++seq}`;
const cell = 'w-full min-w-0 rounded-md border border-line-strong bg-card px-2 py-1.5 text-sm disabled:bg-paper';

function rowsOf(test: TestDto) {
  return {
    circuits: test.lighting.circuits.map((c) => ({ key: c.id, label: c.label, volts: String(c.volts), breakerAmps: String(c.breakerAmps) })),
    fixtures: test.lighting.fixtures.map((f) => ({ key: f.id, name: f.name, watts: String(f.watts), quantity: String(f.quantity), circuitKey: f.circuitId ?? '' })),
  };
}

function report(circuits: CircuitRow[], fixtures: FixtureRow[]): { result: CircuitLoadReport | null; problem: string | null } {
  try {
    const result = circuitLoads(
      fixtures.map((f) => ({ id: f.key, name: f.name || 'a fixture', watts: Number(f.watts), quantity: Number(f.quantity || 1), circuitId: f.circuitKey || null })),
      circuits.map((c) => ({ id: c.key, name: c.label || 'a circuit', volts: Number(c.volts), breakerAmps: Number(c.breakerAmps) })),
    );
    return { result, problem: null };
  } catch (err) {
    return { result: null, problem: err instanceof Error ? err.message : 'Check the numbers' };
  }
}

/** Fixtures, the circuits they are on, and the continuous-load check against 80 % of each breaker. */
export function LightingPanel({ episodeId, test, canEdit }: { episodeId: string; test: TestDto; canEdit: boolean }) {
  const toast = useToast();
  const save = useSetLighting(episodeId);
  const [rows, setRows] = useState(() => rowsOf(test));
  const [syncedFrom, setSyncedFrom] = useState(() => JSON.stringify(rowsOf(test)));
  const saved = JSON.stringify(rowsOf(test));
  const dirty = JSON.stringify(rows) !== saved;
  // Lighting saved elsewhere (a refetch) replaces the rows, unless the person is editing them.
  if (saved !== syncedFrom) {
    setSyncedFrom(saved);
    if (JSON.stringify(rows) === syncedFrom) setRows(rowsOf(test));
  }
  const { result, problem } = useMemo(() => report(rows.circuits, rows.fixtures), [rows]);
  const byCircuit = new Map(result?.circuits.map((c) => [c.circuitId, c]) ?? []);
  const setCircuit = (i: number, patch: Partial<CircuitRow>) => setRows((r) => ({ ...r, circuits: r.circuits.map((c, j) => (j === i ? { ...c, ...patch } : c)) }));
  const setFixture = (i: number, patch: Partial<FixtureRow>) => setRows((r) => ({ ...r, fixtures: r.fixtures.map((f, j) => (j === i ? { ...f, ...patch } : f)) }));
  const disabled = !canEdit || save.isPending;

  const submit = () =>
    save.mutate(
      {
        testId: test.id,
        version: test.version,
        circuits: rows.circuits.map((c) => ({ key: c.key, label: c.label, volts: Number(c.volts), breakerAmps: Number(c.breakerAmps) })),
        fixtures: rows.fixtures.map((f) => ({ name: f.name, watts: Number(f.watts), quantity: Number(f.quantity || 1), circuitKey: f.circuitKey || null })),
      },
      {
        onSuccess: (t) => {
          setRows(rowsOf(t));
          toast({ tone: 'success', title: 'Lighting saved' });
        },
        onError: (err) => toast({ tone: 'error', title: err instanceof ApiError && err.code === 'stale_version' ? 'The test changed meanwhile: reload the page, then enter the lighting again' : err.message }),
      },
    );

  return (
    <div className="flex flex-col gap-4 text-sm">
      <section aria-label="Circuits">
        <h4 className="mb-1 font-semibold">Circuits</h4>
        {rows.circuits.length === 0 && <p className="text-ink-muted">No circuits yet.</p>}
        <ul className="flex flex-col gap-2">
          {rows.circuits.map((c, i) => {
            const load = byCircuit.get(c.key);
            const pct = load ? Math.round(load.loadFraction * 100) : null;
            return (
              <li key={c.key} className={`rounded-md border p-2 ${load?.overContinuousLimit ? 'border-danger/60 bg-danger-soft' : 'border-line'}`}>
                <div className="grid grid-cols-[1fr_1fr_auto] items-end gap-2 sm:grid-cols-[1fr_5rem_5rem_auto]">
                  <label className={`${canEdit ? 'col-span-2' : 'col-span-3'} flex flex-col gap-0.5 text-xs text-ink-soft sm:col-span-1`}>Circuit<input className={cell} value={c.label} disabled={disabled} onChange={(e) => setCircuit(i, { label: e.target.value })} /></label>
                  {canEdit && (
                    <Button variant="ghost" className="px-2 sm:order-last" disabled={disabled} aria-label={`Remove circuit ${c.label}`} onClick={() => setRows((r) => ({ circuits: r.circuits.filter((_, j) => j !== i), fixtures: r.fixtures.map((f) => (f.circuitKey === c.key ? { ...f, circuitKey: '' } : f)) }))}>
                      ×
                    </Button>
                  )}
                  <label className="flex flex-col gap-0.5 text-xs text-ink-soft">Volts<input className={cell} type="number" inputMode="decimal" value={c.volts} disabled={disabled} onChange={(e) => setCircuit(i, { volts: e.target.value })} /></label>
                  <label className="flex flex-col gap-0.5 text-xs text-ink-soft">Breaker A<input className={cell} type="number" inputMode="decimal" value={c.breakerAmps} disabled={disabled} onChange={(e) => setCircuit(i, { breakerAmps: e.target.value })} /></label>
                </div>
                {load && (
                  <div className="mt-2">
                    <div className="h-2 overflow-hidden rounded bg-paper" aria-hidden="true">
                      <div className={`h-full ${load.overContinuousLimit ? 'bg-danger' : load.loadFraction > 0.6 ? 'bg-warn' : 'bg-ok'}`} style={{ width: `${Math.min(100, (pct ?? 0))}%` }} />
                    </div>
                    <p className="mt-1 text-xs tabular-nums">
                      {load.watts} W · {load.amps.toFixed(1)} A of {load.breakerAmps} A ({pct} %; continuous limit {load.continuousLimitAmps.toFixed(1)} A = {Math.round(CONTINUOUS_LOAD_FRACTION * 100)} %)
                    </p>
                    {/* The safety note follows once below the circuits, so it is not repeated in every warning. */}
                    {load.warning && <p className="mt-1 text-xs font-semibold text-danger" role="alert">{load.warning.replace(ELECTRICAL_SAFETY_NOTE, '').trim()}</p>}
                  </div>
                )}
              </li>
            );
          })}
        </ul>
        {canEdit && (
          <Button className="mt-2" disabled={disabled} onClick={() => setRows((r) => ({ ...r, circuits: [...r.circuits, { key: newKey(), label: `Circuit ${r.circuits.length + 1}`, volts: '230', breakerAmps: '16' }] }))}>
            Add circuit
          </Button>
        )}
      </section>
      <section aria-label="Fixtures">
        <h4 className="mb-1 font-semibold">Fixtures</h4>
        {rows.fixtures.length === 0 && <p className="text-ink-muted">No fixtures yet.</p>}
        <ul className="flex flex-col gap-2">
          {rows.fixtures.map((f, i) => (
            <li key={f.key} className="grid grid-cols-[1fr_1fr_auto] items-end gap-2 rounded-md border border-line p-2 sm:grid-cols-[1fr_5rem_3.5rem_9rem_auto]">
              <label className={`${canEdit ? 'col-span-2' : 'col-span-3'} flex flex-col gap-0.5 text-xs text-ink-soft sm:col-span-1`}>Fixture<input className={cell} value={f.name} disabled={disabled} onChange={(e) => setFixture(i, { name: e.target.value })} /></label>
              {canEdit && (
                <Button variant="ghost" className="px-2 sm:order-last" disabled={disabled} aria-label={`Remove fixture ${f.name}`} onClick={() => setRows((r) => ({ ...r, fixtures: r.fixtures.filter((_, j) => j !== i) }))}>
                  ×
                </Button>
              )}
              <label className="flex flex-col gap-0.5 text-xs text-ink-soft">Watts<input className={cell} type="number" inputMode="decimal" value={f.watts} disabled={disabled} onChange={(e) => setFixture(i, { watts: e.target.value })} /></label>
              <label className="flex flex-col gap-0.5 text-xs text-ink-soft">Qty<input className={cell} type="number" inputMode="numeric" value={f.quantity} disabled={disabled} onChange={(e) => setFixture(i, { quantity: e.target.value })} /></label>
              <label className="col-span-3 flex flex-col gap-0.5 text-xs text-ink-soft sm:col-span-1">
                On circuit
                <select className={cell} value={f.circuitKey} disabled={disabled} onChange={(e) => setFixture(i, { circuitKey: e.target.value })}>
                  <option value="">not assigned</option>
                  {rows.circuits.map((c) => (
                    <option key={c.key} value={c.key}>
                      {c.label}
                    </option>
                  ))}
                </select>
              </label>
            </li>
          ))}
        </ul>
        {canEdit && (
          <Button className="mt-2" disabled={disabled} onClick={() => setRows((r) => ({ ...r, fixtures: [...r.fixtures, { key: newKey(), name: '', watts: '', quantity: '1', circuitKey: r.circuits[0]?.key ?? '' }] }))}>
            Add fixture
          </Button>
        )}
      </section>
      {problem && (
        <p className="rounded-md border border-danger/40 bg-danger-soft p-2 text-danger" role="status">
          {problem}
        </p>
      )}
      {result && result.unassignedFixtureIds.length > 0 && <p className="text-xs text-warn">{result.unassignedFixtureIds.length} fixture(s) not on a circuit yet: their load is not checked.</p>}
      <p className="rounded-md border border-warn/40 bg-warn-soft p-2 text-xs text-ink">
        <span className="font-semibold">Electrical safety: </span>
        Continuous loads should stay at or below {Math.round(CONTINUOUS_LOAD_FRACTION * 100)} % of the breaker rating. {ELECTRICAL_SAFETY_NOTE}
      </p>
      {canEdit && (
        <div className="flex gap-2">
          <Button variant="primary" disabled={disabled || !!problem || !dirty} onClick={submit}>
            Save lighting
          </Button>
          {dirty && (
            <Button variant="ghost" disabled={disabled} onClick={() => setRows(rowsOf(test))}>
              Discard changes
            </Button>
          )}
        </div>
      )}
    </div>
  );
}

import './shot-list.css';
import { Link, useParams } from 'react-router-dom';
import { TEST_KIND_LABELS, type TestDto } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { ErrorNote, Loading } from '../../../components/ui/page.tsx';
import { shotListCsvPath, useEpisodePlan } from '../api/plans.ts';
import { fmtF, fmtIso, fmtLight, fmtNd, fmtShutter } from '../plan-format.ts';

function TestSheet({ test }: { test: TestDto }) {
  const lines = test.specLines.filter((l) => l.value.trim() !== '');
  return (
    <section className="shot-list-test mb-8 break-inside-auto" aria-label={test.name}>
      <h2 className="text-lg font-bold">
        {test.name} <span className="text-sm font-normal text-ink-muted">· {TEST_KIND_LABELS[test.kind]} · {test.steps.length} steps · {test.secondsPerStep} s each</span>
      </h2>
      {lines.length > 0 && (
        <dl className="mt-1 mb-2 grid grid-cols-[auto_1fr] gap-x-3 text-xs sm:grid-cols-[auto_1fr_auto_1fr]">
          {lines.map((l) => (
            <div key={l.id} className="contents">
              <dt className="text-ink-muted">{l.label}</dt>
              <dd>{l.value}</dd>
            </div>
          ))}
        </dl>
      )}
      <div className="overflow-x-auto">
        <table className="shot-list-table w-full min-w-[40rem] border-collapse text-sm">
          <thead>
            <tr className="border-b-2 border-ink text-left text-xs">
              <th scope="col" className="w-10 py-1 pr-2">Done</th>
              <th scope="col" className="py-1 pr-2">#</th>
              <th scope="col" className="py-1 pr-2">Step</th>
              <th scope="col" className="py-1 pr-2">ISO</th>
              <th scope="col" className="py-1 pr-2">ND</th>
              <th scope="col" className="py-1 pr-2">Aperture</th>
              <th scope="col" className="py-1 pr-2">Shutter</th>
              <th scope="col" className="py-1 pr-2">Light</th>
              <th scope="col" className="py-1 pr-2">{test.kind === 'latitude_bracket' ? 'Grade' : 'Note'}</th>
              <th scope="col" className="w-[22%] py-1">Set notes</th>
            </tr>
          </thead>
          <tbody>
            {test.steps.map((s) => (
              <tr key={s.id} className="border-b border-line-strong align-top">
                <td className="py-2 pr-2">
                  {/* An empty box to tick with a pen; already-shot steps show their mark. */}
                  <span role="img" aria-label={s.shotAt ? 'shot' : 'to shoot'} className="inline-flex h-5 w-5 items-center justify-center border-2 border-ink text-xs font-bold">
                    {s.shotAt ? '✓' : ''}
                  </span>
                </td>
                <td className="py-2 pr-2 tabular-nums">{s.index + 1}</td>
                <th scope="row" className="py-2 pr-2 text-left font-semibold">{s.label}</th>
                <td className="py-2 pr-2 tabular-nums">{fmtIso(s.planned.iso)}</td>
                <td className="py-2 pr-2 tabular-nums">{fmtNd(s.planned.ndDensity)}</td>
                <td className="py-2 pr-2 tabular-nums">{fmtF(s.planned.fNumber)}</td>
                <td className="py-2 pr-2 tabular-nums">{fmtShutter(s.planned)}</td>
                <td className="py-2 pr-2 tabular-nums">{fmtLight(s.planned.lightChangeStops)}</td>
                <td className="py-2 pr-2 text-xs">{test.kind === 'latitude_bracket' ? s.planned.gradeCorrectionLabel : (s.planned.warning ?? s.planned.notes ?? '')}</td>
                <td className="py-2 text-xs text-ink-soft">{s.observation}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}

/** The shot list: every step of every test with its settings and an empty tick box, ready to print for the set. */
export function ShotListPage() {
  const { id = '' } = useParams();
  const plan = useEpisodePlan(id);
  if (plan.isLoading) return <Loading what="Loading the shot list" />;
  if (plan.error) return <ErrorNote error={plan.error} />;
  const { episode, tests } = plan.data!;
  return (
    <article className="shot-list mx-auto max-w-[1100px]">
      <div className="no-print mb-4 flex flex-wrap items-center justify-between gap-2">
        <Link to={`/episodes/${id}`} className="text-sm font-semibold text-accent hover:underline">
          ← Back to the episode
        </Link>
        <div className="flex gap-2">
          <a href={shotListCsvPath(id)} download className="inline-flex min-h-9 items-center rounded-md border border-line-strong bg-card px-3 py-1.5 text-sm font-semibold hover:bg-paper">
            Download CSV
          </a>
          <Button variant="primary" onClick={() => window.print()}>
            Print
          </Button>
        </div>
      </div>
      <header className="mb-4 border-b-2 border-ink pb-2">
        <p className="text-xs tracking-wide text-ink-muted uppercase">Shot list</p>
        <h1 className="text-2xl font-bold">{episode.title}</h1>
        <p className="text-sm text-ink-soft">
          {tests.length} {tests.length === 1 ? 'test' : 'tests'} · {tests.reduce((n, t) => n + t.steps.length, 0)} steps · printed {new Date().toLocaleDateString()}
        </p>
      </header>
      {tests.length === 0 ? <p className="text-sm text-ink-soft">This episode has no tests yet: add them on the Plan tab.</p> : tests.map((t) => <TestSheet key={t.id} test={t} />)}
    </article>
  );
}

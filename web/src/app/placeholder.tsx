import { PageHeader, Panel } from '../components/ui/page.tsx';

/** Says plainly that a page is not built yet. */
export function ComingPage({ title, what }: { title: string; what: string }) {
  return (
    <div>
      <PageHeader title={title} />
      <Panel>
        <p className="text-sm text-ink-soft">{what}</p>
      </Panel>
    </div>
  );
}

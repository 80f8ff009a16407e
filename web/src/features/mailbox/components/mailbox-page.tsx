import { useState } from 'react';
import { Link } from 'react-router-dom';
import { ErrorNote, Loading, PageHeader } from '../../../components/ui/page.tsx';
import { useMailbox } from '../api/mailbox.ts';

/** Development mailbox: what Midgray sent, as the local SMTP fake captured it. */
export function MailboxPage() {
  const mails = useMailbox();
  const [open, setOpen] = useState<string | null>(null);
  return (
    <main className="mx-auto max-w-4xl p-4 sm:p-6">
      <p className="mb-3 text-sm">
        <Link to="/" className="text-accent underline">
          ← Back to Midgray
        </Link>
      </p>
      <PageHeader title="Development mailbox" description="Every e-mail Midgray sent while the local SMTP stand-in runs. Nothing here left this machine." />
      {mails.isLoading && <Loading what="Loading messages" />}
      {mails.error && <ErrorNote error={mails.error} />}
      {mails.data?.length === 0 && <p className="text-sm text-ink-muted">No messages yet.</p>}
      <ul className="flex flex-col gap-2">
        {mails.data?.map((m) => (
          <li key={m.id} className="rounded-lg border border-line bg-card">
            <button type="button" className="flex w-full flex-wrap items-baseline justify-between gap-2 p-3 text-left" aria-expanded={open === m.id} onClick={() => setOpen(open === m.id ? null : m.id)}>
              <span className="font-semibold">{m.subject}</span>
              <span className="text-xs text-ink-muted">
                to {m.to.join(', ')} · {new Date(m.date).toLocaleString()}
              </span>
            </button>
            {open === m.id && (
              <div className="border-t border-line p-3">
                <pre className="font-sans text-sm whitespace-pre-wrap">{m.text}</pre>
                {m.hasHtml && (
                  <a className="mt-2 inline-block text-sm text-accent underline" href={`/api/dev/mailbox/${m.id}/html`} target="_blank" rel="noreferrer">
                    View the HTML part
                  </a>
                )}
              </div>
            )}
          </li>
        ))}
      </ul>
    </main>
  );
}

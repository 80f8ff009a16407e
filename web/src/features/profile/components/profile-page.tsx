import { useState } from 'react';
import type { CalendarFeedCreated, MailKind } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { ErrorNote, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { useDisableCalendarFeed, useProfile, useResetCalendarFeed, useSetEmailOptOuts } from '../api/profile.ts';

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** The user's own settings: which e-mails they get, and their private calendar feed. */
export function ProfilePage() {
  const profile = useProfile();
  const setOptOuts = useSetEmailOptOuts();
  const reset = useResetCalendarFeed();
  const disable = useDisableCalendarFeed();
  const toast = useToast();
  const [created, setCreated] = useState<CalendarFeedCreated | null>(null);
  const [confirmReset, setConfirmReset] = useState(false);
  // A ticked or unticked box shows its new state at once, until the server's answer replaces it.
  const [shown, setShown] = useState<Partial<Record<MailKind, boolean>>>({});

  if (profile.isLoading) return <Loading what="Loading your profile" />;
  if (profile.error) return <ErrorNote error={profile.error} />;
  const p = profile.data!;
  const optOuts = p.email.filter((k) => !k.enabled).map((k) => k.kind);

  const toggle = (kind: MailKind, enabled: boolean) => {
    const next = enabled ? optOuts.filter((k) => k !== kind) : [...optOuts, kind];
    setShown((m) => ({ ...m, [kind]: enabled }));
    setOptOuts.mutate(next, {
      onSettled: () => setShown({}),
      onError: (e) => toast({ tone: 'error', title: e.message }),
      onSuccess: () => toast({ tone: 'success', title: enabled ? 'You will get these e-mails again' : 'You will get no more of these e-mails' }),
    });
  };

  const makeFeed = () =>
    reset.mutate(undefined, {
      onError: (e) => toast({ tone: 'error', title: e.message }),
      onSuccess: (r) => {
        setCreated(r);
        setConfirmReset(false);
      },
    });

  const copy = async (url: string) => {
    try {
      await navigator.clipboard.writeText(url);
      toast({ tone: 'success', title: 'Feed address copied' });
    } catch {
      (document.getElementById('feed-url') as HTMLInputElement | null)?.select();
      toast({ tone: 'info', title: 'The browser did not allow copying: the address is selected, press Ctrl+C (⌘C)' });
    }
  };

  return (
    <div>
      <PageHeader title="Your profile" description={`${p.user.name} · ${p.user.email ?? p.user.login}. These settings are yours alone and apply in every channel.`} />
      <div className="grid gap-5 lg:grid-cols-2">
        <Panel title="E-mail">
          <fieldset>
            <legend className="mb-3 text-sm text-ink-soft">Untick a kind to stop getting it. You still see everything in Midgray itself.</legend>
            <ul className="flex flex-col gap-3">
              {p.email.map((k) => (
                <li key={k.kind}>
                  <label className="flex items-start gap-2.5">
                    <input type="checkbox" className="mt-0.5 h-4 w-4 shrink-0" checked={shown[k.kind] ?? k.enabled} disabled={setOptOuts.isPending} onChange={(e) => toggle(k.kind, e.target.checked)} />
                    <span>
                      <span className="block text-sm font-semibold">{k.label}</span>
                      <span className="block text-sm text-ink-muted">{k.who}</span>
                    </span>
                  </label>
                </li>
              ))}
            </ul>
          </fieldset>
        </Panel>

        <Panel title="Calendar feed">
          <div className="flex flex-col gap-3 text-sm">
            <p className="text-ink-soft">
              A private address your calendar app can subscribe to: publish slots (proposed and approved), embargo lifts, gear due-back days and shoot days of all your channels. Times are sent as UTC instants, so your calendar shows them in its own time zone.
            </p>
            {created ? (
              <div className="flex flex-col gap-2 rounded-md border border-ok bg-ok-soft p-3">
                <label htmlFor="feed-url" className="font-semibold text-ok">
                  Your feed address — copy it now: Midgray keeps only a fingerprint and cannot show it again.
                </label>
                <input id="feed-url" readOnly value={created.url} onFocus={(e) => e.target.select()} className="w-full rounded-md border border-line-strong bg-card px-2 py-1.5 font-mono text-xs" />
                <div>
                  <Button onClick={() => void copy(created.url)}>Copy address</Button>
                </div>
                <p className="text-xs text-ink-soft">Anyone with this address can read these events. If it leaks, reset it.</p>
              </div>
            ) : p.calendarFeed.active ? (
              <p>
                Your feed is on since {p.calendarFeed.createdAt ? when(p.calendarFeed.createdAt) : 'earlier'}. For your safety the address is shown only once; reset it to get a new one.
              </p>
            ) : (
              <p>Your feed is off.</p>
            )}
            <div className="flex flex-wrap gap-2">
              {!p.calendarFeed.active ? (
                <Button variant="primary" onClick={makeFeed} disabled={reset.isPending}>
                  Create my feed address
                </Button>
              ) : confirmReset ? (
                <>
                  <Button variant="danger" onClick={makeFeed} disabled={reset.isPending}>
                    Reset: the old address stops working
                  </Button>
                  <Button variant="ghost" onClick={() => setConfirmReset(false)}>
                    Cancel
                  </Button>
                </>
              ) : (
                <Button onClick={() => setConfirmReset(true)}>Reset feed address</Button>
              )}
              {p.calendarFeed.active && (
                <Button
                  variant="ghost"
                  disabled={disable.isPending}
                  onClick={() =>
                    disable.mutate(undefined, {
                      onError: (e) => toast({ tone: 'error', title: e.message }),
                      onSuccess: () => {
                        setCreated(null);
                        toast({ tone: 'info', title: 'Calendar feed turned off' });
                      },
                    })
                  }
                >
                  Turn the feed off
                </Button>
              )}
            </div>
          </div>
        </Panel>
      </div>
    </div>
  );
}

import { Suspense } from 'react';
import type { Role } from '@midgray/shared';
import { Navigate, NavLink, Outlet } from 'react-router-dom';
import { Avatar } from '../components/ui/avatar.tsx';
import { Loading } from '../components/ui/page.tsx';
import { useMe, useSignOut } from '../features/auth/api/me.ts';
import { CreateChannelPage } from '../features/channels/components/create-channel-page.tsx';
import { CurrentChannelProvider, useCurrentChannel } from '../features/channels/current-channel.tsx';

/** Main navigation; other features add their pages here. `roles` limits an entry to those roles of the current channel. */
export const NAV: readonly { to: string; label: string; roles?: readonly Role[] }[] = [
  { to: '/board', label: 'Board' },
  { to: '/gear', label: 'Gear' },
  { to: '/calendar', label: 'Calendar' },
  { to: '/compare', label: 'Compare' },
  { to: '/approvals', label: 'Approvals', roles: ['producer', 'admin'] },
  { to: '/team', label: 'Team' },
];

/** The NAV entries the caller's role in the current channel may use. */
function useNav() {
  const { channel } = useCurrentChannel();
  return NAV.filter((n) => !n.roles || (channel && n.roles.includes(channel.role)));
}

function MainNav() {
  const nav = useNav();
  return (
    <nav aria-label="Main" className="order-last -mx-1 flex w-full gap-1 overflow-x-auto sm:order-none sm:w-auto">
      {nav.map((n) => (
        <NavLink key={n.to} to={n.to} className={({ isActive }) => `rounded-md px-3 py-1.5 text-sm font-semibold whitespace-nowrap ${isActive ? 'bg-white text-ink' : 'text-white/85 hover:bg-white/10'}`}>
          {n.label}
        </NavLink>
      ))}
    </nav>
  );
}

function ChannelSwitcher() {
  const { channel, channels, switchTo } = useCurrentChannel();
  if (!channel) return null;
  return (
    <div className="flex items-center gap-2">
      <label htmlFor="channel-switcher" className="sr-only">
        Channel
      </label>
      <select id="channel-switcher" value={channel.id} onChange={(e) => switchTo(e.target.value)} className="max-w-[12rem] truncate rounded-md border border-white/30 bg-ink px-2 py-1 text-sm text-white">
        {channels.map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
          </option>
        ))}
      </select>
      <span className="hidden rounded bg-white/10 px-1.5 py-0.5 text-xs text-white/90 sm:inline">{channel.role}</span>
    </div>
  );
}

/** The signed-in frame: top bar with channel switcher and navigation, page outlet below. */
export function Shell() {
  const me = useMe();
  const signOut = useSignOut();
  if (me.isLoading) return <Loading what="Opening Midgray" />;
  if (!me.data) return <Navigate to="/sign-in" replace />;
  if (me.data.channels.length === 0) return <CreateChannelPage />;
  return (
    <CurrentChannelProvider me={me.data}>
      <div className="min-h-screen">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-card focus:p-2">
          Skip to content
        </a>
        <header className="no-print bg-ink text-white">
          <div className="mx-auto flex max-w-[1400px] flex-wrap items-center gap-x-5 gap-y-2 px-4 py-2">
            <NavLink to="/board" className="flex items-center gap-2 font-bold">
              <img src="/favicon.svg" alt="" className="h-6 w-6" />
              Midgray
            </NavLink>
            <ChannelSwitcher />
            <MainNav />
            <div className="ml-auto flex items-center gap-2">
              <NavLink to="/profile" className="flex items-center gap-2 rounded-md px-1 py-0.5 hover:bg-white/10" aria-label={`Your profile (${me.data.user.name})`}>
                <Avatar name={me.data.user.name} size="sm" />
                <span className="hidden text-sm md:inline">{me.data.user.name}</span>
              </NavLink>
              <button type="button" onClick={() => signOut.mutate()} className="rounded-md px-2 py-1 text-sm text-white/85 hover:bg-white/10">
                Sign out
              </button>
            </div>
          </div>
        </header>
        <main id="main" className="mx-auto max-w-[1400px] px-4 py-5">
          <Suspense fallback={<Loading />}>
            <Outlet />
          </Suspense>
        </main>
      </div>
    </CurrentChannelProvider>
  );
}

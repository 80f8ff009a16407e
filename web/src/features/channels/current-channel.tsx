import { createContext, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';
import type { Channel } from '@midgray/shared';
import type { SignedIn as Me } from '../auth/api/me.ts';

const STORAGE_KEY = 'midgray.channel';

interface CurrentChannel {
  channel: Channel | null;
  channels: Channel[];
  switchTo: (id: string) => void;
}

const Ctx = createContext<CurrentChannel>({ channel: null, channels: [], switchTo: () => undefined });

/** The channel the user works in (remembered per browser); switching clears nothing server-side. */
export function CurrentChannelProvider({ me, children }: { me: Me; children: ReactNode }) {
  const [id, setId] = useState(() => localStorage.getItem(STORAGE_KEY));
  const channel = me.channels.find((c) => c.id === id) ?? me.channels[0] ?? null;
  useEffect(() => {
    if (channel) localStorage.setItem(STORAGE_KEY, channel.id);
  }, [channel]);
  const value = useMemo(() => ({ channel, channels: me.channels, switchTo: setId }), [channel, me.channels]);
  return <Ctx.Provider value={value}>{children}</Ctx.Provider>;
}

/** Returns the current channel context. */
export const useCurrentChannel = () => useContext(Ctx);

/** Returns the current channel or throws (pages under the shell always have one). */
export function useChannel(): Channel {
  const { channel } = useCurrentChannel();
  if (!channel) throw new Error('No channel selected');
  return channel;
}

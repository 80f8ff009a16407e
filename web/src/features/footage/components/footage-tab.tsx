// The episode's Footage tab: upload (Uppy over tus) and the footage table with its checks.
import type { EpisodeTabProps } from '../../../app/episode-tabs.tsx';
import { ErrorNote, Loading, Panel } from '../../../components/ui/page.tsx';
import { useMe } from '../../auth/api/me.ts';
import { useChannel } from '../../channels/current-channel.tsx';
import { useFootageList } from '../api/footage.ts';
import { FootageTable } from './footage-table.tsx';
import { UploadPanel } from './upload-panel.tsx';

export default function FootageTab({ episodeId, channelId }: EpisodeTabProps) {
  const list = useFootageList(episodeId);
  const me = useMe();
  const channel = useChannel();
  if (list.isLoading) return <Loading what="Loading the footage" />;
  if (list.error) return <ErrorNote error={list.error} />;
  if (!list.data || !me.data) return null;
  const { footage, steps, maxFileBytes } = list.data;
  const flagged = footage.filter((f) => f.status === 'flagged').length;
  return (
    <div className="flex flex-col gap-5">
      <UploadPanel episodeId={episodeId} steps={steps} maxFileBytes={maxFileBytes} />
      <Panel title="Footage" actions={<span className="text-sm text-ink-muted">{footage.length} file{footage.length === 1 ? '' : 's'}{flagged ? `, ${flagged} flagged` : ''}</span>}>
        <FootageTable footage={footage} episodeId={episodeId} channelId={channelId} me={{ id: me.data.user.id, role: channel.role }} />
      </Panel>
    </div>
  );
}

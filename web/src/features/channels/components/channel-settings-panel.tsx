import { useForm } from 'react-hook-form';
import type { Channel } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { TextAreaField, TextField } from '../../../components/ui/field.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { useUpdateChannel } from '../api/channels.ts';

interface FormValues {
  name: string;
  timeZone: string;
  snrThresholdDb: number;
  deltaEThreshold: number;
  descriptionMaxChars: number;
  titleMaxChars: number;
  defaultDisclosure: string;
  signOff: string;
  trackingParams: string;
}

/** Admin-only: the channel's name, zone, measurement thresholds and description defaults. */
export function ChannelSettingsPanel({ channel }: { channel: Channel }) {
  const update = useUpdateChannel(channel.id);
  const toast = useToast();
  const s = channel.settings;
  const form = useForm<FormValues>({
    values: {
      name: channel.name,
      timeZone: channel.timeZone,
      snrThresholdDb: s.snrThresholdDb,
      deltaEThreshold: s.deltaEThreshold,
      descriptionMaxChars: s.descriptionMaxChars,
      titleMaxChars: s.titleMaxChars,
      defaultDisclosure: s.defaultDisclosure,
      signOff: s.signOff,
      trackingParams: s.trackingParams.map((p) => `${p.key}=${p.value}`).join('\n'),
    },
  });
  const submit = form.handleSubmit((v) => {
    const trackingParams = v.trackingParams
      .split('\n')
      .map((l) => l.trim())
      .filter(Boolean)
      .map((l) => {
        const [key, ...rest] = l.split('=');
        return { key: key.trim(), value: rest.join('=').trim() };
      });
    update.mutate(
      {
        version: channel.version,
        name: v.name,
        timeZone: v.timeZone,
        settings: {
          snrThresholdDb: Number(v.snrThresholdDb),
          deltaEThreshold: Number(v.deltaEThreshold),
          descriptionMaxChars: Number(v.descriptionMaxChars),
          titleMaxChars: Number(v.titleMaxChars),
          defaultDisclosure: v.defaultDisclosure,
          signOff: v.signOff,
          trackingParams,
        },
      },
      {
        onSuccess: () => toast({ tone: 'success', title: 'Channel settings saved' }),
        onError: (err) => toast({ tone: 'error', title: err.message }),
      },
    );
  });
  return (
    <Panel title="Channel settings">
      <form className="grid gap-3 sm:grid-cols-2" onSubmit={submit}>
        <TextField label="Channel name" {...form.register('name', { required: true })} />
        <TextField label="Time zone (IANA)" {...form.register('timeZone', { required: true })} hint="Publish slots are shown in this zone" />
        <TextField label="Noise threshold (SNR, dB)" type="number" step="0.5" {...form.register('snrThresholdDb')} hint="Ceiling ISO = highest ISO at or above this" />
        <TextField label="Colour difference threshold (ΔE00)" type="number" step="0.1" {...form.register('deltaEThreshold')} hint="Latitude window = offsets at or below this" />
        <TextField label="Description length limit" type="number" {...form.register('descriptionMaxChars')} />
        <TextField label="Title length limit" type="number" {...form.register('titleMaxChars')} />
        <TextAreaField className="sm:col-span-2" label="Default disclosure" rows={3} {...form.register('defaultDisclosure')} hint="Used when gear is lent or sponsored, or a link earns a commission. Local advertising rules and legal advice decide what it must say." />
        <TextAreaField className="sm:col-span-2" label="Sign-off" rows={2} {...form.register('signOff')} />
        <TextAreaField className="sm:col-span-2" label="Link tracking parameters (one key=value per line)" rows={2} {...form.register('trackingParams')} />
        <div className="sm:col-span-2">
          <Button variant="primary" type="submit" disabled={update.isPending}>
            Save settings
          </Button>
        </div>
      </form>
    </Panel>
  );
}

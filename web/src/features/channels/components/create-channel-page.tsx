import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { CreateChannelInputSchema, type CreateChannelInput } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { ErrorNote } from '../../../components/ui/page.tsx';
import { useCreateChannel } from '../api/channels.ts';

/** Shown to a signed-in user who belongs to no channel yet. */
export function CreateChannelPage() {
  const create = useCreateChannel();
  const form = useForm({ resolver: zodResolver(CreateChannelInputSchema), defaultValues: { name: '', timeZone: Intl.DateTimeFormat().resolvedOptions().timeZone } });
  return (
    <main className="mx-auto max-w-lg p-6">
      <h1 className="text-2xl font-bold">Start a channel</h1>
      <p className="mt-2 text-sm text-ink-soft">You are not in any channel yet. If a team invited you, ask their admin to check the address. Or start your own channel: you will be its admin.</p>
      <form className="mt-6 flex flex-col gap-4" onSubmit={form.handleSubmit((v) => create.mutate(v as CreateChannelInput))}>
        <TextField label="Channel name" {...form.register('name')} error={form.formState.errors.name?.message} />
        <TextField label="Time zone (IANA name)" {...form.register('timeZone')} error={form.formState.errors.timeZone?.message} hint="Publish slots are shown in this zone, e.g. Europe/Berlin" />
        {create.error && <ErrorNote error={create.error} />}
        <Button variant="primary" type="submit" disabled={create.isPending}>
          Create channel
        </Button>
      </form>
    </main>
  );
}

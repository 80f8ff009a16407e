import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import {
  EMPTY_GEAR_FORM,
  formatInstantInZone,
  GEAR_KIND_LABELS,
  GEAR_KINDS,
  GEAR_SOURCE_LABELS,
  GEAR_SOURCES,
  gearFormToInput,
  GearFormSchema,
  gearName,
  gearToForm,
  isValidTimeZone,
  zonedTimeToInstant,
  type Gear,
  type GearForm,
} from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { Dialog } from '../../../components/ui/dialog.tsx';
import { SelectField, TextAreaField, TextField } from '../../../components/ui/field.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ZonePicker } from '../../../components/ui/zone-picker.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { browserTimeZone } from '../../../lib/time-zones.ts';
import { useCreateGear, useDeleteGear, useUpdateGear } from '../api/gear.ts';

/** "= 2026-05-12 15:00 CEST (Europe/Berlin) · your time 09:00 EDT (America/New_York)", or null. */
function embargoPreview(local: string, zone: string, viewerZone: string): string | null {
  if (!local || !isValidTimeZone(zone)) return null;
  try {
    const instant = zonedTimeToInstant(local, zone);
    const own = formatInstantInZone(instant, zone);
    return viewerZone === zone ? own : `${own} · your time ${formatInstantInZone(instant, viewerZone)}`;
  } catch {
    return null;
  }
}

/** Adds (gear null) or edits a gear item; editing also archives, restores and deletes. */
export function GearDialog({ gear, channelId, channelZone, onClose }: { gear: Gear | null; channelId: string; channelZone: string; onClose: () => void }) {
  const create = useCreateGear(channelId);
  const update = useUpdateGear(channelId);
  const remove = useDeleteGear(channelId);
  const toast = useToast();
  const viewerZone = browserTimeZone();
  const [confirmDelete, setConfirmDelete] = useState(false);
  const form = useForm<GearForm>({ resolver: zodResolver(GearFormSchema), defaultValues: gear ? gearToForm(gear) : EMPTY_GEAR_FORM });
  const errors = form.formState.errors;
  const [local, zone] = useWatch({ control: form.control, name: ['embargoLocal', 'embargoZone'] });
  const preview = embargoPreview(local, zone, viewerZone);

  const showServerError = (err: unknown) => {
    const fields = err instanceof ApiError ? (err.details as { fieldErrors?: Record<string, string[]> } | undefined)?.fieldErrors : undefined;
    let placed = false;
    for (const [key, messages] of Object.entries(fields ?? {})) {
      const name = key.replace(/^body\./, '').replace(/^embargoAt$/, 'embargoLocal') as keyof GearForm;
      if (name in EMPTY_GEAR_FORM) {
        form.setError(name, { message: messages[0] });
        placed = true;
      }
    }
    if (!placed) form.setError('root', { message: err instanceof Error ? err.message : 'That did not work' });
  };

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      const input = gearFormToInput(values);
      if (gear) await update.mutateAsync({ gearId: gear.id, input: { ...input, version: gear.version } });
      else await create.mutateAsync(input);
      toast({ tone: 'success', title: gear ? `Saved ${gearName(input)}` : `${gearName(input)} added to the gear list` });
      onClose();
    } catch (err) {
      showServerError(err);
    }
  });

  const setArchived = async (archived: boolean) => {
    if (!gear) return;
    try {
      await update.mutateAsync({ gearId: gear.id, input: { version: gear.version, archived } });
      toast({ tone: 'success', title: archived ? `${gearName(gear)} archived: episodes keep it, new episodes cannot pick it` : `${gearName(gear)} restored` });
      onClose();
    } catch (err) {
      showServerError(err);
    }
  };

  const onDelete = async () => {
    if (!gear) return;
    try {
      await remove.mutateAsync(gear.id);
      toast({ tone: 'success', title: `${gearName(gear)} deleted` });
      onClose();
    } catch (err) {
      setConfirmDelete(false);
      showServerError(err);
    }
  };

  return (
    <Dialog open onClose={onClose} title={gear ? `Edit ${gearName(gear)}` : 'Add gear'} wide>
      <form noValidate className="flex flex-col gap-4" onSubmit={onSubmit}>
        <div className="grid gap-3 sm:grid-cols-2">
          <SelectField label="Kind" {...form.register('kind')} error={errors.kind?.message}>
            {GEAR_KINDS.map((k) => (
              <option key={k} value={k}>
                {GEAR_KIND_LABELS[k]}
              </option>
            ))}
          </SelectField>
          <SelectField label="Source" {...form.register('source')} error={errors.source?.message}>
            {GEAR_SOURCES.map((s) => (
              <option key={s} value={s}>
                {GEAR_SOURCE_LABELS[s]}
              </option>
            ))}
          </SelectField>
          <TextField label="Make" {...form.register('make')} error={errors.make?.message} autoFocus />
          <TextField label="Model" {...form.register('model')} error={errors.model?.message} />
          <TextField label="Serial" {...form.register('serial')} error={errors.serial?.message} />
          <label className="flex items-center gap-2 self-end pb-2 text-sm">
            <input type="checkbox" {...form.register('sponsored')} />
            Sponsored by its maker (the description must disclose it)
          </label>
          <TextField label="Received" type="date" {...form.register('receivedOn')} error={errors.receivedOn?.message} />
          <TextField label="Due back" type="date" {...form.register('dueBackOn')} error={errors.dueBackOn?.message} />
        </div>
        <fieldset className="grid gap-3 rounded-md border border-line p-3 sm:grid-cols-2">
          <legend className="px-1 text-sm font-medium text-ink-soft">Embargo (leave empty when there is none)</legend>
          <TextField label="Lifts at (wall clock in its zone)" type="datetime-local" {...form.register('embargoLocal')} error={errors.embargoLocal?.message} />
          <Controller
            control={form.control}
            name="embargoZone"
            render={({ field }) => (
              <ZonePicker
                label="Time zone it was announced in"
                value={field.value}
                onChange={field.onChange}
                error={errors.embargoZone?.message}
                quick={[
                  { label: 'Channel', zone: channelZone },
                  { label: 'You', zone: viewerZone },
                ]}
              />
            )}
          />
          <p className="text-xs text-ink-muted sm:col-span-2" aria-live="polite">
            {preview ? `Lifts ${preview}` : 'Type the date and time as the maker announced it, and the zone they gave.'}
          </p>
        </fieldset>
        <TextAreaField label="Notes" rows={2} {...form.register('notes')} error={errors.notes?.message} />
        {errors.root && (
          <p className="rounded-md border border-danger/40 bg-danger-soft p-2 text-sm text-danger" role="alert">
            {errors.root.message}
          </p>
        )}
        <div className="flex flex-wrap items-center justify-between gap-2">
          <div className="flex flex-wrap gap-2">
            {gear && (
              <Button variant="secondary" onClick={() => void setArchived(!gear.archivedAt)} disabled={update.isPending}>
                {gear.archivedAt ? 'Restore' : 'Archive'}
              </Button>
            )}
            {gear &&
              (confirmDelete ? (
                <Button variant="danger" onClick={() => void onDelete()} disabled={remove.isPending}>
                  Delete for good
                </Button>
              ) : (
                <Button variant="ghost" onClick={() => setConfirmDelete(true)} disabled={gear.episodeCount > 0} title={gear.episodeCount > 0 ? 'Used by episodes: archive it instead' : undefined}>
                  Delete…
                </Button>
              ))}
          </div>
          <div className="flex gap-2">
            <Button variant="ghost" onClick={onClose}>
              Cancel
            </Button>
            <Button variant="primary" type="submit" disabled={create.isPending || update.isPending}>
              {gear ? 'Save' : 'Add gear'}
            </Button>
          </div>
        </div>
      </form>
    </Dialog>
  );
}

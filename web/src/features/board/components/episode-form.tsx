import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, useWatch } from 'react-hook-form';
import { EpisodeFormSchema, formatIsoWeek, isoWeekOf, mondayOfIsoWeek, parseIsoWeek, type BoardGear, type BoardPerson, type EpisodeForm } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { formatDay } from '../dates.ts';

/** "Week 2026-W19, starting Mon 4 May 2026" for what is typed in the week field, or null. */
function weekHint(value: string): string | null {
  const v = value.trim();
  if (!v) return null;
  try {
    const monday = mondayOfIsoWeek(v);
    const week = parseIsoWeek(v) ?? isoWeekOf(monday);
    return `Week ${formatIsoWeek(week)}, starting ${formatDay(monday)}`;
  } catch {
    return null;
  }
}

/**
 * The episode form for creating and editing: title, gear from the channel's list, host, editor,
 * target publish week (any day in it) and shoot date. Server field errors land on their fields.
 */
export function EpisodeFormFields({
  initial,
  gear,
  people,
  submitLabel,
  pending,
  onSubmit,
  onCancel,
}: {
  initial: EpisodeForm;
  gear: BoardGear[];
  people: BoardPerson[];
  submitLabel: string;
  pending: boolean;
  onSubmit: (values: EpisodeForm) => Promise<unknown>;
  onCancel: () => void;
}) {
  const form = useForm<EpisodeForm>({ resolver: zodResolver(EpisodeFormSchema) as never, defaultValues: initial });
  const errors = form.formState.errors;
  const week = useWatch({ control: form.control, name: 'targetPublishWeek' });
  const chosen = useWatch({ control: form.control, name: 'gearIds' });
  // Archived gear stays listed only when the episode already has it.
  const pickable = gear.filter((g) => !g.archived || initial.gearIds.includes(g.id));
  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={form.handleSubmit(async (values) => {
        try {
          await onSubmit(values);
        } catch (err) {
          const fields = (err instanceof ApiError ? (err.details as { fieldErrors?: Record<string, string[]> } | undefined)?.fieldErrors : undefined) ?? {};
          let placed = false;
          for (const [key, messages] of Object.entries(fields)) {
            const name = key.replace(/^body\./, '') as keyof EpisodeForm;
            if (name in initial) {
              form.setError(name, { message: messages[0] });
              placed = true;
            }
          }
          if (!placed) form.setError('root', { message: err instanceof Error ? err.message : 'That did not work' });
        }
      })}
    >
      <TextField label="Title" {...form.register('title')} error={errors.title?.message} autoFocus placeholder="e.g. K9 Cine: noise across the whole ISO range" />
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 text-sm font-medium text-ink-soft">Gear</legend>
        {pickable.length === 0 ? (
          <p className="text-sm text-ink-muted">The channel’s gear list is empty: producers add items on the Gear page.</p>
        ) : (
          <div className="grid max-h-48 gap-1 overflow-y-auto rounded-md border border-line p-2 sm:grid-cols-2">
            {pickable.map((g) => (
              <label key={g.id} className="flex items-center gap-2 text-sm">
                <input type="checkbox" value={g.id} {...form.register('gearIds')} />
                <span className="min-w-0 truncate">
                  {g.name}
                  {g.archived ? ' (archived)' : ''}
                </span>
              </label>
            ))}
          </div>
        )}
        <p className="text-xs text-ink-muted">{chosen?.length ? `${chosen.length} chosen` : 'None chosen yet'}</p>
        {errors.gearIds && (
          <p className="text-xs font-medium text-danger" role="alert">
            {errors.gearIds.message}
          </p>
        )}
      </fieldset>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Host" {...form.register('hostId')} error={errors.hostId?.message}>
          <option value="">Nobody yet</option>
          {people.map((p) => (
            <option key={p.userId} value={p.userId}>
              {p.name} ({p.role})
            </option>
          ))}
        </SelectField>
        <SelectField label="Editor" {...form.register('editorId')} error={errors.editorId?.message}>
          <option value="">Nobody yet</option>
          {people.map((p) => (
            <option key={p.userId} value={p.userId}>
              {p.name} ({p.role})
            </option>
          ))}
        </SelectField>
        <TextField label="Target publish week" type="date" {...form.register('targetPublishWeek')} error={errors.targetPublishWeek?.message} hint={weekHint(week ?? '') ?? 'Pick any day in the week'} />
        <TextField label="Shoot date" type="date" {...form.register('shootDate')} error={errors.shootDate?.message} />
      </div>
      {errors.root && (
        <p className="rounded-md border border-danger/40 bg-danger-soft p-2 text-sm text-danger" role="alert">
          {errors.root.message}
        </p>
      )}
      <div className="flex justify-end gap-2">
        <Button variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
        <Button variant="primary" type="submit" disabled={pending}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}

import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { CreateSpecLineInputSchema, SPEC_SHEET_LINES, SPEC_VALUE_MAX, type CreateSpecLineInput, type SpecSheetLineDto, type TestDto } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useAddSpecLine, useRemoveSpecLine, useUpdateSpecLine } from '../api/plans.ts';

type FlagName = 'checked' | 'inDescription' | 'required';
const HINTS = new Map(SPEC_SHEET_LINES.map((d) => [d.key as string, d.hint]));

function LineRow({ episodeId, testId, line, canEdit }: { episodeId: string; testId: string; line: SpecSheetLineDto; canEdit: boolean }) {
  const toast = useToast();
  const update = useUpdateSpecLine(episodeId, testId);
  const remove = useRemoveSpecLine(episodeId, testId);
  const [draft, setDraft] = useState<string | null>(null);
  // A ticked box shows its new state at once, until the saved line (a new version) or an error comes back;
  // the cache's own optimistic update lands a tick later, too late for a controlled checkbox.
  const [flagDraft, setFlagDraft] = useState<{ name: FlagName; value: boolean; version: number } | null>(null);
  const flagValue = (name: FlagName) => (flagDraft && flagDraft.name === name && flagDraft.version === line.version ? flagDraft.value : line[name]);
  const value = draft ?? line.value;
  const missing = line.required && line.value.trim() === '';
  const onError = (err: unknown) =>
    toast({ tone: 'error', title: err instanceof ApiError && err.code === 'stale_version' ? `“${line.label}” was changed by someone else: their value is shown now` : err instanceof Error ? err.message : 'Saving did not work' });
  const save = () => {
    if (draft === null || draft === line.value) return setDraft(null);
    update.mutate({ id: line.id, version: line.version, value: draft }, { onError, onSettled: () => setDraft(null) });
  };
  const flag = (name: FlagName, label: string) => (
    <label className="flex min-h-9 items-center gap-1.5 text-xs whitespace-nowrap text-ink-soft">
      <input
        type="checkbox"
        className="h-4 w-4"
        checked={flagValue(name)}
        disabled={!canEdit || update.isPending}
        onChange={(e) => {
          const value = e.target.checked;
          setFlagDraft({ name, value, version: line.version });
          const fail = (err: unknown) => {
            setFlagDraft(null);
            onError(err);
          };
          update.mutate({ id: line.id, version: line.version, [name]: value }, { onError: fail });
        }}
        aria-label={`${label}: ${line.label}`}
      />
      <span aria-hidden="true">{label}</span>
    </label>
  );
  return (
    <li className={`grid grid-cols-1 gap-x-3 gap-y-1 py-2 sm:grid-cols-[10rem_1fr_auto] sm:items-center ${missing ? 'bg-warn-soft/60' : ''}`}>
      <label htmlFor={`spec-${line.id}`} className="text-sm font-medium">
        {line.label}
        {line.required && <span className="ml-1 text-xs text-ink-muted" title="Required before the shoot">(required)</span>}
      </label>
      <input
        id={`spec-${line.id}`}
        className="w-full rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm disabled:bg-paper"
        value={value}
        placeholder={HINTS.get(line.key) ?? ''}
        maxLength={SPEC_VALUE_MAX}
        disabled={!canEdit}
        aria-invalid={missing}
        aria-describedby={missing ? `spec-${line.id}-missing` : undefined}
        onChange={(e) => setDraft(e.target.value)}
        onBlur={save}
        onKeyDown={(e) => {
          if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
          if (e.key === 'Escape') setDraft(null);
        }}
      />
      <div className="flex flex-wrap items-center gap-x-3">
        {flag('checked', 'Checked')}
        {flag('inDescription', 'In description')}
        {flag('required', 'Required')}
        {line.custom && canEdit && (
          <Button variant="ghost" className="min-h-8 px-2 text-xs" onClick={() => remove.mutate({ id: line.id, version: line.version }, { onError })} aria-label={`Remove line ${line.label}`}>
            Remove
          </Button>
        )}
      </div>
      {missing && (
        <p id={`spec-${line.id}-missing`} className="text-xs text-warn sm:col-start-2">
          Fill this before the episode moves to Shoot.
        </p>
      )}
    </li>
  );
}

function AddLine({ episodeId, testId }: { episodeId: string; testId: string }) {
  const toast = useToast();
  const add = useAddSpecLine(episodeId, testId);
  const form = useForm<CreateSpecLineInput>({ resolver: zodResolver(CreateSpecLineInputSchema) as never, defaultValues: { label: '', value: '', checked: false, inDescription: false, required: false } });
  return (
    <form
      noValidate
      aria-label="Add a custom line"
      className="mt-3 grid grid-cols-1 gap-2 border-t border-line pt-3 sm:grid-cols-[10rem_1fr_auto_auto] sm:items-end"
      onSubmit={form.handleSubmit((v) =>
        add.mutate(v, { onError: (e) => toast({ tone: 'error', title: e.message }), onSuccess: (l) => { toast({ tone: 'success', title: `Added “${l.label}”` }); form.reset(); } }),
      )}
    >
      <TextField label="New line" placeholder="e.g. Timecode" error={form.formState.errors.label?.message} {...form.register('label')} />
      <TextField label="Value" error={form.formState.errors.value?.message} {...form.register('value')} />
      <label className="flex min-h-9 items-center gap-1.5 text-xs text-ink-soft">
        <input type="checkbox" className="h-4 w-4" {...form.register('required')} /> Required
      </label>
      <Button type="submit" disabled={add.isPending}>
        Add line
      </Button>
    </form>
  );
}

/** A test's spec sheet: each line's value and its checked, in-description and required flags. */
export function SpecSheet({ episodeId, test, canEdit }: { episodeId: string; test: TestDto; canEdit: boolean }) {
  const missing = test.specLines.filter((l) => l.required && l.value.trim() === '').length;
  const checked = test.specLines.filter((l) => l.checked).length;
  return (
    <div>
      <p className="mb-1 text-sm text-ink-soft" aria-live="polite">
        {checked} of {test.specLines.length} lines checked on set ·{' '}
        {missing === 0 ? <span className="text-ok">every required line filled</span> : <span className="font-semibold text-warn">{missing} required {missing === 1 ? 'line' : 'lines'} still empty</span>}
      </p>
      <ul className="divide-y divide-line" aria-label={`Spec sheet of ${test.name}`}>
        {test.specLines.map((l) => (
          <LineRow key={l.id} episodeId={episodeId} testId={test.id} line={l} canEdit={canEdit} />
        ))}
      </ul>
      {canEdit && <AddLine episodeId={episodeId} testId={test.id} />}
    </div>
  );
}

import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { composeDescription, descriptionInputFrom, disclosureRequired, DISCLOSURE_LEGAL_NOTE, type EpisodeDescription } from '@midgray/shared';
import type { EpisodeTabProps } from '../../../app/episode-tabs.tsx';
import { Button } from '../../../components/ui/button.tsx';
import { TextAreaField } from '../../../components/ui/field.tsx';
import { ErrorNote, Loading, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useDescription, useSaveDescription } from '../api/description.ts';
import { DescriptionFormSchema, formFromParts, partsFromForm, type DescriptionForm } from '../description-form.ts';
import { ChaptersEditor } from './chapters-editor.tsx';
import { DescriptionPreview } from './description-preview.tsx';
import { DescriptionVersions } from './description-versions.tsx';
import { GearLinksEditor } from './gear-links-editor.tsx';

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** The Description tab: edit the parts, see the composed text live with its warnings, save versions. */
export default function DescriptionTab({ episodeId }: EpisodeTabProps) {
  const description = useDescription(episodeId);
  if (description.isLoading) return <Loading what="Loading the description" />;
  if (description.error) return <ErrorNote error={description.error} />;
  if (!description.data) return null;
  return <DescriptionEditor key={episodeId} episodeId={episodeId} data={description.data} reload={async () => (await description.refetch()).data} />;
}

function DescriptionEditor({ episodeId, data, reload }: { episodeId: string; data: EpisodeDescription; reload: () => Promise<EpisodeDescription | undefined> }) {
  const toast = useToast();
  const save = useSaveDescription(episodeId);
  const [stale, setStale] = useState<string | null>(null);
  const readOnly = !data.canEdit;
  const form = useForm<DescriptionForm>({ resolver: zodResolver(DescriptionFormSchema), defaultValues: formFromParts(data.parts), mode: 'onChange' });
  const dirty = form.formState.isDirty;

  // Live preview: the same shared composer the server uses, on the form's current values.
  const values = useWatch({ control: form.control }) as DescriptionForm;
  const parts = useMemo(() => partsFromForm(values), [JSON.stringify(values)]); // eslint-disable-line react-hooks/exhaustive-deps
  const input = useMemo(() => descriptionInputFrom(data.context, parts), [data.context, parts]);
  const composed = useMemo(() => composeDescription(input), [input]);
  const need = useMemo(() => disclosureRequired(input), [input]);

  // Keep unsaved edits from vanishing with a closed tab.
  useEffect(() => {
    if (!dirty) return;
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [dirty]);

  const onSave = form.handleSubmit((v) =>
    save.mutate(
      { version: data.version, ...partsFromForm(v) },
      {
        onSuccess: (saved) => {
          setStale(null);
          form.reset(formFromParts(saved.parts));
          toast({ tone: 'success', title: `Saved as version ${saved.version}` });
        },
        onError: (e) => {
          if (e instanceof ApiError && e.status === 409) setStale(e.message);
          else toast({ tone: 'error', title: e.message });
        },
      },
    ),
  );

  const loadSaved = async () => {
    const fresh = await reload();
    if (fresh) form.reset(formFromParts(fresh.parts));
    setStale(null);
  };

  // A new version from elsewhere (a restore, a refetch) replaces the form unless the person is editing.
  useEffect(() => {
    if (!form.formState.isDirty) form.reset(formFromParts(data.parts));
  }, [data.version]); // eslint-disable-line react-hooks/exhaustive-deps

  const defaultDisclosure = data.context.settings.defaultDisclosure.trim();
  const signOff = data.context.signOff.trim();

  return (
    <div className="flex flex-col gap-5">
      <form onSubmit={onSave} className="grid gap-5 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]" noValidate>
        <div className="flex min-w-0 flex-col gap-5">
          {stale && (
            <div role="alert" className="rounded-md border border-danger/50 bg-danger-soft p-3 text-sm text-danger">
              <p className="font-semibold">{stale}</p>
              <div className="mt-2">
                <Button variant="danger" onClick={() => void loadSaved()}>
                  Load the saved text (drops your edits)
                </Button>
              </div>
            </div>
          )}
          <div className="flex flex-wrap items-center justify-between gap-3 rounded-lg border border-line bg-card p-3">
            <p className="text-sm text-ink-soft">
              {data.version === 0 ? 'Not saved yet.' : `Version ${data.version}${data.updatedBy ? `, saved by ${data.updatedBy.name}` : ''}${data.updatedAt ? ` on ${when(data.updatedAt)}` : ''}.`}
              {readOnly && ' You can read the description; your role cannot edit it.'}
            </p>
            {!readOnly && (
              <div className="flex gap-2">
                <Button variant="ghost" disabled={!dirty || save.isPending} onClick={() => form.reset(formFromParts(data.parts))}>
                  Discard changes
                </Button>
                <Button variant="primary" type="submit" disabled={!dirty || save.isPending}>
                  {save.isPending ? 'Saving…' : 'Save description'}
                </Button>
              </div>
            )}
          </div>

          <Panel title="Summary">
            <div id="description-summary">
              <TextAreaField label="What the video is about (first lines show above the fold)" rows={7} readOnly={readOnly} {...form.register('summary')} error={form.formState.errors.summary?.message} />
            </div>
          </Panel>

          <Panel title="Shooting specs">
            <p className="text-sm text-ink-soft">
              {data.context.tests.length === 0
                ? 'No test in the plan yet. Spec-sheet lines marked “in description” on the Plan tab appear here, grouped per test.'
                : `From the Plan tab: ${data.context.tests.reduce((n, t) => n + t.specLines.filter((l) => l.inDescription).length, 0)} spec-sheet lines marked “in description” across ${data.context.tests.length} ${data.context.tests.length === 1 ? 'test' : 'tests'}. Change which lines appear on the Plan tab.`}
            </p>
          </Panel>

          <Panel title="Chapters">
            <div id="description-chapters">
              <ChaptersEditor episodeId={episodeId} form={form} readOnly={readOnly} />
            </div>
          </Panel>

          <Panel title="Gear links">
            <div id="description-links">
              <GearLinksEditor form={form} readOnly={readOnly} trackingParams={data.context.settings.trackingParams} />
            </div>
          </Panel>

          <Panel title="Disclosure">
            <div id="description-disclosure" className="flex flex-col gap-3">
              {need.required ? (
                <div className="rounded-md border-l-4 border-warn bg-warn-soft p-2.5 text-sm">
                  <p className="font-semibold">A disclosure is required for this episode:</p>
                  <ul className="list-disc pl-5">
                    {need.reasons.map((r) => (
                      <li key={r}>{r}</li>
                    ))}
                  </ul>
                </div>
              ) : (
                <p className="text-sm text-ink-soft">No gear is loaned or sponsored and no link earns a commission, so no disclosure is required. You may still add one.</p>
              )}
              <TextAreaField
                label="This episode’s disclosure"
                rows={4}
                readOnly={readOnly}
                placeholder={defaultDisclosure ? `Blank uses the channel default: ${defaultDisclosure}` : 'No channel default is set: write the disclosure here'}
                hint={defaultDisclosure ? 'Leave blank to use the channel’s default text when a disclosure is required.' : undefined}
                {...form.register('disclosure')}
                error={form.formState.errors.disclosure?.message}
              />
              {!readOnly && defaultDisclosure && (
                <div>
                  <Button onClick={() => form.setValue('disclosure', defaultDisclosure, { shouldDirty: true })}>Start from the channel default</Button>
                </div>
              )}
              <p className="rounded-md bg-paper p-2.5 text-xs leading-relaxed text-ink-soft">
                <span className="font-semibold">Legal note. </span>
                {DISCLOSURE_LEGAL_NOTE}
              </p>
            </div>
          </Panel>

          <Panel title="Sign-off">
            {signOff ? (
              <>
                <p className="text-sm whitespace-pre-wrap">{signOff}</p>
                <p className="mt-2 text-xs text-ink-muted">From the channel settings; an admin changes it on the Team page.</p>
              </>
            ) : (
              <p className="text-sm text-ink-muted">No sign-off is set for the channel; an admin can set one on the Team page.</p>
            )}
          </Panel>
        </div>
        <div className="min-w-0 xl:sticky xl:top-4 xl:self-start">
          <DescriptionPreview composed={composed} title={data.context.title} maxChars={data.context.settings.descriptionMaxChars} dirty={dirty} />
        </div>
      </form>
      <DescriptionVersions episodeId={episodeId} currentVersion={data.version} canEdit={data.canEdit} dirty={dirty} onRestored={() => setStale(null)} onBeforeRestore={() => form.reset(formFromParts(data.parts))} />
    </div>
  );
}

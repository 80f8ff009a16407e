import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { Controller, useForm, useWatch, type Resolver } from 'react-hook-form';
import { z } from 'zod';
import { ActualSettingsSchema, OBSERVATION_MAX, RatingSchema, actualFromPlanned, formatStops, stepDifference, type ActualSettings, type TestStepDto } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { TextAreaField } from '../../../components/ui/field.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useMarkShot, useUnmarkShot } from '../api/plans.ts';
import { NumberField, errorAt } from './input-fields.tsx';

const ShotFormSchema = z.object({
  actual: ActualSettingsSchema,
  observation: z.string().max(OBSERVATION_MAX, `Keep the observation under ${OBSERVATION_MAX} characters`),
  rating: RatingSchema.nullable(),
});
type ShotForm = { actual: ActualSettings; observation: string; rating: number | null };

const FALLBACK: ActualSettings = { iso: 800, fNumber: 4, shutterAngleDeg: 180, ndDensity: 0, lightChangeStops: 0 };
const stopWord = (stops: number) => (Math.abs(stops) <= 1 + 1e-9 ? 'stop' : 'stops');
const RATING_WORDS = ['', 'unusable', 'poor', 'usable', 'good', 'excellent'];

/** Says how the settings as shot differ from the plan, or that they match it. */
export function DifferenceNote({ step, actual }: { step: TestStepDto; actual: ActualSettings | null }) {
  const parsed = ActualSettingsSchema.safeParse(actual);
  if (!parsed.success) return null;
  const diff = stepDifference(step.planned, parsed.data);
  if (diff.changes.length === 0) return <p className="text-xs text-ok">As planned.</p>;
  const stops = diff.stops;
  return (
    <p className="text-xs text-warn">
      <span className="font-semibold">Differs from the plan:</span> {diff.changes.join(' · ')}
      {stops !== null && Math.abs(stops) >= 0.01 && (
        <>
          {' '}
          → {formatStops(stops)} {stopWord(stops)} {stops > 0 ? 'brighter' : 'darker'}
        </>
      )}
      {stops !== null && Math.abs(stops) < 0.01 && <> → same exposure</>}
    </p>
  );
}

/** Marks a step shot with the settings used, a note and a 1–5 rating; works one-handed on a phone. */
export function MarkShotForm({ episodeId, testId, step, onClose }: { episodeId: string; testId: string; step: TestStepDto; onClose: () => void }) {
  const toast = useToast();
  const mark = useMarkShot(episodeId, testId);
  const unmark = useUnmarkShot(episodeId, testId);
  const form = useForm<ShotForm>({
    resolver: zodResolver(ShotFormSchema) as unknown as Resolver<ShotForm>,
    mode: 'onChange',
    defaultValues: { actual: step.actual ?? actualFromPlanned(step.planned, FALLBACK), observation: step.observation, rating: step.rating },
  });
  const actual = useWatch({ control: form.control, name: 'actual' });
  const note = useMemo(() => <DifferenceNote step={step} actual={actual as ActualSettings} />, [step, actual]);
  const errors = form.formState.errors;
  const busy = mark.isPending || unmark.isPending;
  const onError = (err: unknown) =>
    toast({ tone: 'error', title: err instanceof ApiError && err.code === 'stale_version' ? 'Someone else updated this step meanwhile: check it and save again' : err instanceof Error ? err.message : 'Saving did not work' });

  return (
    <form
      noValidate
      aria-label={`Shot ${step.label}`}
      className="flex flex-col gap-3 rounded-md border border-line-strong bg-paper p-3"
      onSubmit={form.handleSubmit((v) =>
        mark.mutate(
          { id: step.id, version: step.version, actual: v.actual, observation: v.observation, rating: v.rating },
          { onError, onSuccess: (s) => { toast({ tone: 'success', title: `${s.label} marked shot` }); onClose(); } },
        ),
      )}
    >
      <p className="text-sm font-semibold">As shot: {step.label}</p>
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-5">
        <NumberField label="ISO" path="actual.iso" register={form.register as never} errors={errors} disabled={busy} />
        <NumberField label="Aperture" path="actual.fNumber" register={form.register as never} errors={errors} disabled={busy} />
        <NumberField label="Shutter (°)" path="actual.shutterAngleDeg" register={form.register as never} errors={errors} disabled={busy} />
        <NumberField label="ND" path="actual.ndDensity" register={form.register as never} errors={errors} disabled={busy} />
        <NumberField label="Light (stops)" path="actual.lightChangeStops" register={form.register as never} errors={errors} disabled={busy} />
      </div>
      {note}
      <TextAreaField label="Observation" rows={3} placeholder="What you saw on the monitor: noise, cast, clipping…" disabled={busy} error={errors.observation?.message} {...form.register('observation')} />
      <Controller
        control={form.control}
        name="rating"
        render={({ field }) => (
          <fieldset>
            <legend className="mb-1 text-sm font-medium text-ink-soft">Rating{field.value ? `: ${field.value} (${RATING_WORDS[field.value]})` : ' (optional)'}</legend>
            <div className="flex flex-wrap gap-1">
              {[1, 2, 3, 4, 5].map((n) => (
                <label key={n} className={`flex h-11 w-11 cursor-pointer items-center justify-center rounded-md border text-base font-semibold has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-[#1f5fbf] ${field.value === n ? 'border-accent bg-accent text-white' : 'border-line-strong bg-card text-ink'}`}>
                  <input type="radio" className="sr-only" name={`rating-${step.id}`} value={n} checked={field.value === n} onChange={() => field.onChange(n)} aria-label={`${n} of 5, ${RATING_WORDS[n]}`} disabled={busy} />
                  {n}
                </label>
              ))}
              {field.value !== null && (
                <Button variant="ghost" className="h-11" onClick={() => field.onChange(null)} disabled={busy}>
                  No rating
                </Button>
              )}
            </div>
            {errorAt(errors, 'rating') && <p className="text-xs font-medium text-danger">{errorAt(errors, 'rating')}</p>}
          </fieldset>
        )}
      />
      <div className="flex flex-wrap gap-2">
        <Button variant="primary" type="submit" disabled={busy} className="min-h-11 flex-1 sm:flex-none">
          {step.shotAt ? 'Save changes' : 'Mark shot'}
        </Button>
        <Button variant="ghost" onClick={onClose} disabled={busy} className="min-h-11">
          Cancel
        </Button>
        {step.shotAt && (
          <Button
            variant="danger"
            className="min-h-11 sm:ml-auto"
            disabled={busy}
            onClick={() => unmark.mutate({ id: step.id, version: step.version }, { onError, onSuccess: (s) => { toast({ tone: 'info', title: `${s.label} is no longer marked shot` }); onClose(); } })}
          >
            Not shot after all
          </Button>
        )}
      </div>
    </form>
  );
}

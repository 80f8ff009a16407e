import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import { z } from 'zod';
import {
  CustomTestInputSchema,
  IsoSweepInputSchema,
  LatitudeBracketInputSchema,
  SECONDS_PER_STEP_MAX,
  TEST_KIND_LABELS,
  TEST_NAME_MAX,
  planSteps,
  type StepDraft,
  type TestDto,
  type TestKind,
} from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateTest, useUpdateTest } from '../api/plans.ts';
import { defaultInputs, defaultName } from '../plan-format.ts';
import { BracketFields, CustomStepsFields, IsoSweepFields, asNumber, errorAt, type TestFormValues } from './input-fields.tsx';
import { StepsPreview } from './steps-preview.tsx';

const INPUT_SCHEMA = { iso_sweep: IsoSweepInputSchema, latitude_bracket: LatitudeBracketInputSchema, custom: CustomTestInputSchema } as const;

function formSchema(kind: TestKind) {
  return z.object({
    name: z.string().trim().min(1, 'Give the test a name').max(TEST_NAME_MAX),
    secondsPerStep: z
      .number({ error: `Seconds per step must be a number above 0 and at most ${SECONDS_PER_STEP_MAX}` })
      .gt(0, `Seconds per step must be a number above 0 and at most ${SECONDS_PER_STEP_MAX}`)
      .max(SECONDS_PER_STEP_MAX, `Seconds per step must be a number above 0 and at most ${SECONDS_PER_STEP_MAX}`),
    inputs: INPUT_SCHEMA[kind],
  });
}

/** Runs the shared generator on what is typed; returns the steps or the generator's own message. */
function preview(kind: TestKind, inputs: unknown): { drafts: StepDraft[] | null; problem: string | null } {
  try {
    return { drafts: planSteps(kind, inputs), problem: null };
  } catch (err) {
    return { drafts: null, problem: err instanceof Error ? err.message : 'These inputs give no steps' };
  }
}

/**
 * The inputs of one test in a validated form, with the steps they give beside it, updated as the
 * person types. Creates a new test or saves an existing one (stale version → the saved one wins).
 */
export function TestEditor({ episodeId, kind, test, onDone }: { episodeId: string; kind: TestKind; test?: TestDto; onDone: (saved?: TestDto) => void }) {
  const toast = useToast();
  const create = useCreateTest(episodeId);
  const update = useUpdateTest(episodeId);
  const initialInputs = test?.inputs ?? defaultInputs(kind);
  const form = useForm<TestFormValues>({
    resolver: zodResolver(formSchema(kind)) as unknown as Resolver<TestFormValues>,
    mode: 'onChange',
    defaultValues: { name: test?.name ?? defaultName(kind, initialInputs), secondsPerStep: test?.secondsPerStep ?? 10, inputs: structuredClone(initialInputs) },
  });
  const { control, register, formState, handleSubmit } = form;
  const inputs = useWatch({ control, name: 'inputs' });
  // Re-run on every change: useWatch hands back a fresh object per keystroke.
  const { drafts, problem } = useMemo(() => preview(kind, inputs), [kind, inputs]);
  const saving = create.isPending || update.isPending;
  const fieldProps = { control, register, errors: formState.errors, disabled: saving };

  const onError = (err: unknown) => {
    if (err instanceof ApiError && err.code === 'stale_version') toast({ tone: 'error', title: 'Someone else saved this test meanwhile', lines: ['Their version is shown now; make your change again.'] });
    else toast({ tone: 'error', title: err instanceof Error ? err.message : 'Saving did not work' });
  };
  const submit = handleSubmit((v) => {
    const parsed = formSchema(kind).parse(v);
    if (test) {
      update.mutate(
        { id: test.id, version: test.version, name: parsed.name, secondsPerStep: parsed.secondsPerStep, inputs: parsed.inputs as Record<string, unknown> },
        { onError: (e) => { onError(e); onDone(); }, onSuccess: (saved) => { toast({ tone: 'success', title: `Saved “${saved.name}”: ${saved.steps.length} steps` }); onDone(saved); } },
      );
    } else {
      create.mutate(
        { kind, name: parsed.name, secondsPerStep: parsed.secondsPerStep, inputs: parsed.inputs as Record<string, unknown> },
        { onError, onSuccess: (saved) => { toast({ tone: 'success', title: `Added “${saved.name}” with ${saved.steps.length} steps` }); onDone(saved); } },
      );
    }
  });

  return (
    <form onSubmit={submit} noValidate aria-label={test ? `Edit ${test.name}` : `New ${TEST_KIND_LABELS[kind]}`} className="grid gap-5 lg:grid-cols-[minmax(20rem,26rem)_1fr]">
      <div className="flex flex-col gap-4">
        {/* On a phone the preview sits below the form: keep its gist in view while typing. */}
        {drafts && (
          <p className="sticky top-0 z-10 -mx-1 rounded-md border border-line bg-paper px-2 py-1 text-xs text-ink-soft lg:hidden" aria-hidden="true">
            Gives {drafts.length} {drafts.length === 1 ? 'step' : 'steps'}
            {drafts.some((d) => d.planned.warning) && <span className="font-semibold text-warn"> · {drafts.filter((d) => d.planned.warning).length} cannot be held</span>} · table below
          </p>
        )}
        <div className="grid grid-cols-3 gap-3">
          <TextField className="col-span-2" label="Test name" disabled={saving} error={formState.errors.name?.message} {...register('name')} />
          <TextField label="Seconds per step" type="number" step="any" inputMode="decimal" disabled={saving} error={errorAt(formState.errors, 'secondsPerStep')} {...register('secondsPerStep', asNumber)} />
        </div>
        {kind === 'iso_sweep' && <IsoSweepFields {...fieldProps} />}
        {kind === 'latitude_bracket' && <BracketFields {...fieldProps} />}
        {kind === 'custom' && <CustomStepsFields {...fieldProps} />}
      </div>
      <div className="flex min-w-0 flex-col gap-3">
        <h3 className="text-sm font-semibold">Steps these inputs give</h3>
        {problem ? (
          <p className="rounded-md border border-danger/40 bg-danger-soft p-3 text-sm text-danger" role="status">
            {problem}
          </p>
        ) : (
          drafts && <StepsPreview kind={kind} drafts={drafts} caption={test ? 'Preview, not saved yet:' : 'Preview:'} />
        )}
        {test && test.steps.some((s) => s.shotAt) && <p className="text-xs text-ink-muted">Steps already shot keep their marks and notes while their ISO or offset stays in the plan.</p>}
        <div className="flex flex-wrap gap-2">
          <Button variant="primary" type="submit" disabled={saving || !!problem}>
            {test ? 'Save inputs' : 'Add test'}
          </Button>
          <Button variant="ghost" onClick={() => onDone()} disabled={saving}>
            Cancel
          </Button>
        </div>
      </div>
    </form>
  );
}

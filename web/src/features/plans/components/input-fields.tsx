// Fields of the generator inputs. Values keep the shape of the shared input schemas, so the form
// validates with them directly; fields that people type as text (lists, 1/50 s) parse on change
// and hand unreadable text through as-is, so the schema's own message names it.
import { useState } from 'react';
import { Controller, useFieldArray, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import { EXPOSURE_CONTROLS, type ExposureControl } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';

/** Form values of the test editor: name, seconds per step and the generator input. */
export interface TestFormValues {
  name: string;
  secondsPerStep: number;
  inputs: Record<string, any>;
}
type FieldsProps = { control: Control<TestFormValues>; register: UseFormRegister<TestFormValues>; errors: FieldErrors<TestFormValues>; disabled?: boolean };

/** Returns the message of the error at a dotted path ("inputs.base.fNumber"), if any. */
export function errorAt(errors: FieldErrors, path: string): string | undefined {
  let node: any = errors;
  for (const part of path.split('.')) node = node?.[part];
  if (!node) return undefined;
  if (typeof node.message === 'string') return node.message;
  if (typeof node.root?.message === 'string') return node.root.message;
  if (Array.isArray(node)) return node.find((n) => typeof n?.message === 'string')?.message;
  return undefined;
}

/** Empty text → undefined ("got nothing"), anything else → a number. */
export const asNumber = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v)) };

export function NumberField({ label, path, register, errors, hint, className, disabled }: { label: string; path: string; hint?: string; className?: string } & Omit<FieldsProps, 'control'>) {
  return <TextField label={label} type="number" step="any" inputMode="decimal" hint={hint} className={className} disabled={disabled} error={errorAt(errors, path)} {...register(path as any, asNumber)} />;
}

/** Common frame rates; the NTSC-family ones as exact fractions. */
const FRAME_RATES: [string, number][] = [
  ['23.976', 24000 / 1001],
  ['24', 24],
  ['25', 25],
  ['29.97', 30000 / 1001],
  ['30', 30],
  ['48', 48],
  ['50', 50],
  ['59.94', 60000 / 1001],
  ['60', 60],
  ['100', 100],
  ['119.88', 120000 / 1001],
  ['120', 120],
];

export function FpsField({ control, path, errors, disabled }: { path: string } & Omit<FieldsProps, 'register'>) {
  return (
    <Controller
      control={control}
      name={path as any}
      render={({ field }) => {
        const known = FRAME_RATES.find(([, v]) => Math.abs(v - field.value) < 1e-9);
        return (
          <SelectField label="Frame rate (fps)" value={known ? known[0] : String(field.value)} onChange={(e) => field.onChange(FRAME_RATES.find(([k]) => k === e.target.value)?.[1] ?? Number(e.target.value))} onBlur={field.onBlur} error={errorAt(errors, path)} disabled={disabled}>
            {!known && <option value={String(field.value)}>{String(field.value)}</option>}
            {FRAME_RATES.map(([k]) => (
              <option key={k} value={k}>
                {k}
              </option>
            ))}
          </SelectField>
        );
      }}
    />
  );
}

function parseNumberText(text: string): number | string {
  const t = text.trim();
  const fraction = /^(\d+(?:\.\d+)?)\s*\/\s*(\d+(?:\.\d+)?)$/.exec(t);
  if (fraction) return Number(fraction[1]) / Number(fraction[2]);
  return t !== '' && Number.isFinite(Number(t)) ? Number(t) : t;
}

/** A list of numbers typed as "0.3, 0.6, 0.9". */
export function NumberListField({ label, path, control, errors, hint, disabled }: { label: string; path: string; hint?: string } & Omit<FieldsProps, 'register'>) {
  return (
    <Controller
      control={control}
      name={path as any}
      render={({ field }) => <ListInput label={label} hint={hint} value={field.value as unknown[]} onChange={field.onChange} onBlur={field.onBlur} error={errorAt(errors, path)} disabled={disabled} />}
    />
  );
}

function ListInput({ label, hint, value, onChange, onBlur, error, disabled }: { label: string; hint?: string; value: unknown[] | undefined; onChange: (v: unknown[]) => void; onBlur: () => void; error?: string; disabled?: boolean }) {
  const [text, setText] = useState(() => (value ?? []).join(', '));
  return (
    <TextField
      label={label}
      hint={hint}
      value={text}
      inputMode="decimal"
      disabled={disabled}
      error={error}
      onBlur={onBlur}
      onChange={(e) => {
        setText(e.target.value);
        const tokens = e.target.value.split(/[\s,;]+/).filter(Boolean);
        onChange(tokens.map(parseNumberText));
      }}
    />
  );
}

/** Shutter as an angle in degrees or a time in seconds ("1/50"). */
export function ShutterField({ control, path, errors, disabled }: { path: string } & Omit<FieldsProps, 'register'>) {
  return (
    <Controller
      control={control}
      name={path as any}
      render={({ field }) => <ShutterInput value={field.value} onChange={field.onChange} onBlur={field.onBlur} error={errorAt(errors, `${path}.angleDeg`) ?? errorAt(errors, `${path}.seconds`) ?? errorAt(errors, path)} disabled={disabled} />}
    />
  );
}

function ShutterInput({ value, onChange, onBlur, error, disabled }: { value: { kind: 'angle'; angleDeg: unknown } | { kind: 'seconds'; seconds: unknown }; onChange: (v: unknown) => void; onBlur: () => void; error?: string; disabled?: boolean }) {
  const kind = value?.kind ?? 'angle';
  const current = kind === 'angle' ? (value as { angleDeg: unknown }).angleDeg : (value as { seconds: unknown }).seconds;
  const [text, setText] = useState(() => (kind === 'seconds' && typeof current === 'number' && current < 1 ? `1/${Number((1 / current).toFixed(3))}` : current === undefined ? '' : String(current)));
  const set = (k: string, t: string) => {
    const parsed = t.trim() === '' ? undefined : parseNumberText(t);
    onChange(k === 'angle' ? { kind: 'angle', angleDeg: parsed } : { kind: 'seconds', seconds: parsed });
  };
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="mb-1 text-sm font-medium text-ink-soft">Shutter</legend>
      <div className="flex gap-2">
        <select aria-label="Shutter given as" className="rounded-md border border-line-strong bg-card px-2 py-1.5 text-sm" value={kind} disabled={disabled} onChange={(e) => set(e.target.value, text)} onBlur={onBlur}>
          <option value="angle">angle (°)</option>
          <option value="seconds">time (s)</option>
        </select>
        <input
          aria-label={kind === 'angle' ? 'Shutter angle in degrees' : 'Shutter time in seconds, like 1/50'}
          className="w-full min-w-0 rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm aria-[invalid=true]:border-danger"
          value={text}
          inputMode="decimal"
          disabled={disabled}
          aria-invalid={!!error}
          onBlur={onBlur}
          onChange={(e) => {
            setText(e.target.value);
            set(kind, e.target.value);
          }}
        />
      </div>
      {error && (
        <p className="text-xs font-medium text-danger" role="alert">
          {error}
        </p>
      )}
    </fieldset>
  );
}

const CONTROL_LABEL: Record<ExposureControl, string> = { nd: 'ND', aperture: 'Aperture', shutter: 'Shutter', light: 'Light level' };

/** Which controls the plan may move, first one first. */
export function PriorityField({ control, errors, disabled }: Omit<FieldsProps, 'register'>) {
  return (
    <Controller
      control={control}
      name={'inputs.priority' as any}
      render={({ field }) => {
        const list = (field.value as ExposureControl[] | undefined) ?? [];
        const move = (i: number, by: number) => {
          const next = [...list];
          [next[i], next[i + by]] = [next[i + by]!, next[i]!];
          field.onChange(next);
        };
        const off = EXPOSURE_CONTROLS.filter((c) => !list.includes(c));
        return (
          <fieldset>
            <legend className="mb-1 text-sm font-medium text-ink-soft">Move these to hold exposure, in this order</legend>
            <ol className="flex flex-col gap-1">
              {list.map((c, i) => (
                <li key={c} className="flex items-center gap-2 rounded-md border border-line bg-paper px-2 py-1 text-sm">
                  <span className="w-5 text-ink-muted tabular-nums">{i + 1}.</span>
                  <span className="flex-1 font-medium">{CONTROL_LABEL[c]}</span>
                  <Button variant="ghost" className="min-h-7 px-2" aria-label={`Move ${CONTROL_LABEL[c]} up`} disabled={disabled || i === 0} onClick={() => move(i, -1)}>
                    ↑
                  </Button>
                  <Button variant="ghost" className="min-h-7 px-2" aria-label={`Move ${CONTROL_LABEL[c]} down`} disabled={disabled || i === list.length - 1} onClick={() => move(i, 1)}>
                    ↓
                  </Button>
                  <Button variant="ghost" className="min-h-7 px-2" aria-label={`Keep ${CONTROL_LABEL[c]} fixed`} disabled={disabled || list.length === 1} onClick={() => field.onChange(list.filter((x) => x !== c))}>
                    ×
                  </Button>
                </li>
              ))}
            </ol>
            {off.length > 0 && (
              <p className="mt-1 flex flex-wrap items-center gap-1 text-xs text-ink-muted">
                Fixed: {off.map((c) => (
                  <Button key={c} variant="ghost" className="min-h-7 px-2 text-xs" disabled={disabled} onClick={() => field.onChange([...list, c])}>
                    + {CONTROL_LABEL[c]}
                  </Button>
                ))}
              </p>
            )}
            {errorAt(errors, 'inputs.priority') && <p className="text-xs font-medium text-danger" role="alert">{errorAt(errors, 'inputs.priority')}</p>}
          </fieldset>
        );
      }}
    />
  );
}

/** Base exposure and the kit's limits: shared by the ISO sweep and the latitude bracket. */
export function ExposureFields({ control, register, errors, disabled }: FieldsProps) {
  return (
    <>
      <fieldset className="grid grid-cols-2 gap-3">
        <legend className="col-span-2 mb-1 text-sm font-semibold">Base exposure</legend>
        <NumberField label="Aperture (f-number)" path="inputs.base.fNumber" register={register} errors={errors} disabled={disabled} />
        <FpsField control={control} path="inputs.base.fps" errors={errors} disabled={disabled} />
        <div className="col-span-2 sm:col-span-1">
          <ShutterField control={control} path="inputs.base.shutter" errors={errors} disabled={disabled} />
        </div>
        <NumberField label="ND density" path="inputs.base.ndDensity" hint="0.3 ≈ 1 stop" register={register} errors={errors} disabled={disabled} />
      </fieldset>
      <fieldset className="grid grid-cols-2 gap-3">
        <legend className="col-span-2 mb-1 text-sm font-semibold">Kit limits</legend>
        <NumberField label="Widest aperture" path="inputs.kit.minFNumber" register={register} errors={errors} disabled={disabled} />
        <NumberField label="Narrowest aperture" path="inputs.kit.maxFNumber" register={register} errors={errors} disabled={disabled} />
        <div className="col-span-2">
          <NumberListField label="ND densities on hand" hint="Comma-separated, e.g. 0, 0.3, 0.6, 0.9" path="inputs.kit.ndDensities" control={control} errors={errors} disabled={disabled} />
        </div>
        <div className="col-span-2">
          <NumberListField label="Shutter angles allowed (°)" hint="e.g. 90, 180, 270; the base angle is always allowed" path="inputs.kit.shutterAngles" control={control} errors={errors} disabled={disabled} />
        </div>
        <label className="col-span-2 flex items-center gap-2 text-sm">
          <input type="checkbox" className="h-4 w-4" disabled={disabled} {...register('inputs.kit.lightsDimmable' as any)} />
          Lights can be dimmed or raised
        </label>
        <NumberField label="Light down (stops)" path="inputs.kit.lightDownStops" register={register} errors={errors} disabled={disabled} />
        <NumberField label="Light up (stops)" path="inputs.kit.lightUpStops" register={register} errors={errors} disabled={disabled} />
      </fieldset>
      <PriorityField control={control} errors={errors} disabled={disabled} />
    </>
  );
}

/** ISO range and spacing of a sweep. */
export function IsoSweepFields(props: FieldsProps) {
  const { register, errors, disabled } = props;
  return (
    <>
      <fieldset className="grid grid-cols-2 gap-3">
        <legend className="col-span-full mb-1 text-sm font-semibold">ISO ladder</legend>
        <NumberField label="Base ISO" path="inputs.baseIso" register={register} errors={errors} disabled={disabled} />
        <NumberField label="Lowest ISO" path="inputs.minIso" register={register} errors={errors} disabled={disabled} />
        <NumberField label="Highest ISO" path="inputs.maxIso" register={register} errors={errors} disabled={disabled} />
        <SelectField label="Step" disabled={disabled} error={errorAt(errors, 'inputs.step')} {...register('inputs.step' as any)}>
          <option value="full">full stops</option>
          <option value="third">⅓ stops</option>
        </SelectField>
      </fieldset>
      <ExposureFields {...props} />
    </>
  );
}

/** Offsets and base ISO of a latitude bracket. */
export function BracketFields(props: FieldsProps) {
  const { register, errors, disabled } = props;
  return (
    <>
      <fieldset className="grid grid-cols-2 gap-3">
        <legend className="col-span-full mb-1 text-sm font-semibold">Bracket</legend>
        <NumberField label="Base ISO" path="inputs.baseIso" register={register} errors={errors} disabled={disabled} />
        <NumberField label="Range ± (stops)" path="inputs.maxOffsetStops" hint="1 to 6" register={register} errors={errors} disabled={disabled} />
        <SelectField label="Step" disabled={disabled} error={errorAt(errors, 'inputs.step')} {...register('inputs.step' as any)}>
          <option value="full">full stops</option>
          <option value="third">⅓ stops</option>
        </SelectField>
      </fieldset>
      <ExposureFields {...props} />
    </>
  );
}

/** Free steps of a custom test. */
export function CustomStepsFields({ control, register, errors, disabled }: FieldsProps) {
  const steps = useFieldArray({ control, name: 'inputs.steps' as any });
  return (
    <>
      <FpsField control={control} path="inputs.fps" errors={errors} disabled={disabled} />
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-1 text-sm font-semibold">Steps</legend>
        {steps.fields.map((f, i) => (
          <div key={f.id} className="rounded-md border border-line p-3">
            <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
              <TextField className="col-span-2 sm:col-span-3" label={`Step ${i + 1} label`} disabled={disabled} error={errorAt(errors, `inputs.steps.${i}.label`)} {...register(`inputs.steps.${i}.label` as any)} />
              <NumberField label="ISO" path={`inputs.steps.${i}.iso`} register={register} errors={errors} disabled={disabled} />
              <NumberField label="Aperture" path={`inputs.steps.${i}.fNumber`} register={register} errors={errors} disabled={disabled} />
              <NumberField label="Shutter (°)" path={`inputs.steps.${i}.shutterAngleDeg`} register={register} errors={errors} disabled={disabled} />
              <NumberField label="ND" path={`inputs.steps.${i}.ndDensity`} register={register} errors={errors} disabled={disabled} />
              <TextField className="col-span-2" label="Notes" disabled={disabled} {...register(`inputs.steps.${i}.notes` as any)} />
            </div>
            <div className="mt-2 flex justify-end">
              <Button variant="ghost" disabled={disabled || steps.fields.length === 1} onClick={() => steps.remove(i)} aria-label={`Remove step ${i + 1}`}>
                Remove step
              </Button>
            </div>
          </div>
        ))}
        {errorAt(errors, 'inputs.steps') && <p className="text-xs font-medium text-danger" role="alert">{errorAt(errors, 'inputs.steps')}</p>}
        <Button disabled={disabled} onClick={() => steps.append({ label: `Step ${steps.fields.length + 1}`, notes: '' })}>
          Add step
        </Button>
      </fieldset>
    </>
  );
}

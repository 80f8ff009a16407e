import { useFieldArray, type UseFormReturn } from 'react-hook-form';
import type { DescriptionSettings } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import type { DescriptionForm } from '../description-form.ts';

const cell = 'w-full rounded-md border border-line-strong bg-card px-2 py-1 text-sm aria-[invalid=true]:border-danger read-only:bg-paper';

/** Links in the description: address, label, and whether the channel earns a commission through it. */
export function GearLinksEditor({ form, readOnly, trackingParams }: { form: UseFormReturn<DescriptionForm>; readOnly: boolean; trackingParams: DescriptionSettings['trackingParams'] }) {
  const { fields, append, remove } = useFieldArray({ control: form.control, name: 'gearLinks' });
  const errors = form.formState.errors.gearLinks;
  return (
    <div className="flex flex-col gap-3">
      {trackingParams.length > 0 && (
        <p className="text-xs text-ink-muted">
          The channel adds {trackingParams.map((p) => `${p.key}=${p.value}`).join('&')} to each web link (keys already in a link are kept as they are).
        </p>
      )}
      {fields.length === 0 && <p className="text-sm text-ink-muted">No links.</p>}
      <ul className="flex flex-col gap-3">
        {fields.map((f, i) => (
          <li key={f.id} className="flex flex-col gap-2 rounded-md border border-line p-2">
            <div>
              <input {...form.register(`gearLinks.${i}.url`)} type="url" placeholder="https://…" aria-label={`Address of link ${i + 1}`} aria-invalid={!!errors?.[i]?.url} readOnly={readOnly} className={cell} />
              {errors?.[i]?.url && <p className="mt-0.5 text-xs text-danger">{errors[i]!.url!.message}</p>}
            </div>
            <div className="flex flex-wrap items-center gap-x-3 gap-y-2">
              <input {...form.register(`gearLinks.${i}.label`)} placeholder="Label, e.g. Korvala K9 body" aria-label={`Label of link ${i + 1}`} readOnly={readOnly} className={`${cell.replace('w-full ', '')} min-w-[10rem] flex-1`} />
              <label className="flex items-center gap-1.5 text-sm whitespace-nowrap">
                <input type="checkbox" {...form.register(`gearLinks.${i}.commission`)} disabled={readOnly} className="h-4 w-4" />
                Earns commission
              </label>
              {!readOnly && (
                <button type="button" className="ml-auto rounded px-2 py-1 text-sm text-danger hover:bg-danger-soft" onClick={() => remove(i)} aria-label={`Remove link ${i + 1}`}>
                  Remove
                </button>
              )}
            </div>
          </li>
        ))}
      </ul>
      {!readOnly && (
        <div>
          <Button onClick={() => append({ url: '', label: '', commission: false })}>Add link</Button>
        </div>
      )}
    </div>
  );
}

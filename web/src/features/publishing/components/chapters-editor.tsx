import { useState } from 'react';
import { useFieldArray, type UseFormReturn } from 'react-hook-form';
import { secondsToChapterTime } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { useParseChapters } from '../api/description.ts';
import type { DescriptionForm } from '../description-form.ts';

const cell = 'w-full rounded-md border border-line-strong bg-card px-2 py-1 text-sm aria-[invalid=true]:border-danger read-only:bg-paper';

/** Chapters as a table (start time, label), plus a box to paste "0:00 Intro" lines that replace them. */
export function ChaptersEditor({ episodeId, form, readOnly }: { episodeId: string; form: UseFormReturn<DescriptionForm>; readOnly: boolean }) {
  const { fields, append, remove, replace, move } = useFieldArray({ control: form.control, name: 'chapters' });
  const errors = form.formState.errors.chapters;
  const parse = useParseChapters(episodeId);
  const toast = useToast();
  const [pasted, setPasted] = useState('');
  const [pasteErrors, setPasteErrors] = useState<string[]>([]);

  const usePasted = () =>
    parse.mutate(pasted, {
      onError: (e) => toast({ tone: 'error', title: e.message }),
      onSuccess: (r) => {
        setPasteErrors(r.errors.map((e) => e.message));
        if (r.chapters.length === 0) {
          toast({ tone: 'error', title: 'No chapter found in the pasted text', lines: r.errors.slice(0, 3).map((e) => e.message) });
          return;
        }
        replace(r.chapters.map((c) => ({ time: secondsToChapterTime(c.startSeconds), label: c.label })));
        form.trigger('chapters');
        toast({ tone: r.errors.length ? 'info' : 'success', title: `${r.chapters.length} chapters taken from the pasted lines${r.errors.length ? `; ${r.errors.length} lines skipped` : ''}` });
        if (r.errors.length === 0) setPasted('');
      },
    });

  return (
    <div className="flex flex-col gap-3">
      {fields.length === 0 ? (
        <p className="text-sm text-ink-muted">No chapters. Add them one by one, or paste the lines below.</p>
      ) : (
        <ol className="flex flex-col gap-2" aria-label="Chapters">
          {fields.map((f, i) => (
            <li key={f.id} className="flex flex-wrap items-start gap-x-2 gap-y-1">
              <div className="w-20 shrink-0">
                <input
                  {...form.register(`chapters.${i}.time`)}
                  aria-label={`Start of chapter ${i + 1}`}
                  aria-invalid={!!errors?.[i]?.time}
                  aria-describedby={errors?.[i]?.time ? `chapter-${i}-time-error` : undefined}
                  readOnly={readOnly}
                  inputMode="numeric"
                  placeholder="0:00"
                  className={`${cell} font-mono`}
                />
              </div>
              <div className="min-w-[10rem] flex-1">
                <input {...form.register(`chapters.${i}.label`)} aria-label={`Label of chapter ${i + 1}`} aria-invalid={!!errors?.[i]?.label} readOnly={readOnly} placeholder="Label" className={cell} />
              </div>
              {!readOnly && (
                <div className="ml-auto flex shrink-0 items-center">
                  <button type="button" className="rounded px-2 py-1 text-ink-soft hover:bg-paper disabled:opacity-40" onClick={() => move(i, i - 1)} disabled={i === 0} aria-label={`Move chapter ${i + 1} up`}>
                    ↑
                  </button>
                  <button type="button" className="rounded px-2 py-1 text-ink-soft hover:bg-paper disabled:opacity-40" onClick={() => move(i, i + 1)} disabled={i === fields.length - 1} aria-label={`Move chapter ${i + 1} down`}>
                    ↓
                  </button>
                  <button type="button" className="rounded px-2 py-1 text-sm text-danger hover:bg-danger-soft" onClick={() => remove(i)} aria-label={`Remove chapter ${i + 1}`}>
                    Remove
                  </button>
                </div>
              )}
              {(errors?.[i]?.time || errors?.[i]?.label) && (
                <p id={`chapter-${i}-time-error`} className="w-full text-xs text-danger">
                  {[errors[i]?.time?.message, errors[i]?.label?.message].filter(Boolean).join(' · ')}
                </p>
              )}
            </li>
          ))}
        </ol>
      )}
      {!readOnly && (
        <>
          <div>
            <Button onClick={() => append({ time: fields.length === 0 ? '0:00' : '', label: '' })}>Add chapter</Button>
          </div>
          <details className="rounded-md border border-line bg-paper/60 p-3" open={fields.length === 0}>
            <summary className="cursor-pointer text-sm font-semibold">Paste chapter lines</summary>
            <div className="mt-2 flex flex-col gap-2">
              <label htmlFor="chapters-paste" className="text-sm text-ink-soft">
                One chapter per line, time first: “0:00 Intro”, “1:02:03 - Latitude test”. The pasted chapters replace the table.
              </label>
              <textarea id="chapters-paste" rows={5} value={pasted} onChange={(e) => setPasted(e.target.value)} className={`${cell} font-mono`} placeholder={'0:00 Intro\n1:15 ISO sweep\n6:40 Verdict'} />
              <div>
                <Button onClick={usePasted} disabled={pasted.trim() === '' || parse.isPending}>
                  Use these lines as chapters
                </Button>
              </div>
              {pasteErrors.length > 0 && (
                <ul className="list-disc pl-5 text-sm text-warn" aria-label="Lines that are not chapters">
                  {pasteErrors.map((e) => (
                    <li key={e}>{e}</li>
                  ))}
                </ul>
              )}
            </div>
          </details>
        </>
      )}
    </div>
  );
}

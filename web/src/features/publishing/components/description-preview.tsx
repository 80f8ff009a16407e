import { descriptionLength, type ComposedDescription, type DescriptionWarning } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { textFileName } from '../description-form.ts';

/** Which editor section fixes each warning; the spec-sheet and title ones live elsewhere. */
const SECTION_OF: Record<DescriptionWarning['code'], string | null> = {
  title_too_long: null,
  description_too_long: 'description-summary',
  chapter_first_not_zero: 'description-chapters',
  chapter_too_few: 'description-chapters',
  chapter_not_ascending: 'description-chapters',
  chapter_too_short: 'description-chapters',
  spec_line_empty: null,
  link_not_http: 'description-links',
  disclosure_missing: 'description-disclosure',
};

function goTo(sectionId: string) {
  const el = document.getElementById(sectionId);
  if (!el) return;
  el.scrollIntoView({ behavior: 'smooth', block: 'start' });
  el.querySelector<HTMLElement>('textarea, input, button')?.focus({ preventScroll: true });
}

/** The composed text as it will be pasted, with its length, warnings (each with its fix), copy and download. */
export function DescriptionPreview({ composed, title, maxChars, dirty }: { composed: ComposedDescription; title: string; maxChars: number; dirty: boolean }) {
  const toast = useToast();
  const length = descriptionLength(composed.text);
  const over = length > maxChars;

  const copy = async () => {
    try {
      await navigator.clipboard.writeText(composed.text);
      toast({ tone: 'success', title: 'Description copied as plain text' });
    } catch {
      // Without clipboard permission, select the text so the person can copy it with the keyboard.
      const range = document.createRange();
      const pre = document.getElementById('description-preview-text');
      if (pre) {
        range.selectNodeContents(pre);
        window.getSelection()?.removeAllRanges();
        window.getSelection()?.addRange(range);
      }
      toast({ tone: 'info', title: 'The browser did not allow copying: the text is selected, press Ctrl+C (⌘C) to copy it' });
    }
  };

  const download = () => {
    const blob = new Blob([composed.text], { type: 'text/plain;charset=utf-8' });
    const url = URL.createObjectURL(blob);
    const a = document.createElement('a');
    a.href = url;
    a.download = textFileName(title);
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  return (
    <section aria-labelledby="preview-heading" className="flex flex-col gap-3 rounded-lg border border-line bg-card p-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="preview-heading" className="text-base font-semibold">
          Preview {dirty && <span className="ml-1 rounded bg-warn-soft px-1.5 py-0.5 text-xs font-medium text-warn">unsaved changes</span>}
        </h2>
        <div className="flex gap-2">
          <Button onClick={() => void copy()} disabled={composed.text === ''}>
            Copy as plain text
          </Button>
          <Button onClick={download} disabled={composed.text === ''}>
            Download .txt
          </Button>
        </div>
      </div>
      <p className={`text-sm ${over ? 'font-semibold text-danger' : 'text-ink-soft'}`} aria-live="polite">
        {length.toLocaleString('en')} of {maxChars.toLocaleString('en')} characters{over ? ` — ${(length - maxChars).toLocaleString('en')} over the limit` : ''}
      </p>
      <div className="h-1.5 overflow-hidden rounded-full bg-paper" aria-hidden="true">
        <div className={`h-full ${over ? 'bg-danger' : 'bg-ink-soft'}`} style={{ width: `${Math.min(100, (length / maxChars) * 100)}%` }} />
      </div>
      {composed.warnings.length > 0 ? (
        <ul className="flex flex-col gap-2" aria-label="Warnings">
          {composed.warnings.map((w, i) => {
            const section = SECTION_OF[w.code];
            return (
              <li key={`${w.code}-${i}`} className="rounded-md border-l-4 border-warn bg-warn-soft p-2.5 text-sm">
                <p className="font-medium text-ink">
                  <span aria-hidden="true">⚠ </span>
                  {w.message}
                </p>
                <p className="mt-1 text-ink-soft">
                  <span className="font-semibold">Fix: </span>
                  {w.fix}
                  {section && (
                    <>
                      {' '}
                      <button type="button" className="font-semibold text-accent underline" onClick={() => goTo(section)}>
                        Go there
                      </button>
                    </>
                  )}
                </p>
              </li>
            );
          })}
        </ul>
      ) : (
        <p className="rounded-md border-l-4 border-ok bg-ok-soft p-2.5 text-sm text-ok">No warnings: the description is within the platform’s limits.</p>
      )}
      {composed.text === '' ? (
        <p className="text-sm text-ink-muted">Nothing to show yet: write a summary or add chapters.</p>
      ) : (
        <pre id="description-preview-text" tabIndex={0} aria-label="Composed description" className="max-h-[32rem] overflow-auto rounded-md border border-line bg-paper p-3 font-sans text-sm leading-relaxed break-words whitespace-pre-wrap">
          {composed.text}
        </pre>
      )}
    </section>
  );
}

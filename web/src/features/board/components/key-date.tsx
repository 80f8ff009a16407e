import { urgencyWords, type DateFlag, type KeyDate } from '@midgray/shared';
import { ClockIcon, WarningIcon } from '../../../components/ui/icons.tsx';
import { formatDay, formatInstant } from '../dates.ts';

const TONE = {
  past: 'border-danger/50 bg-danger-soft text-danger',
  soon: 'border-warn/50 bg-warn-soft text-warn',
  later: 'border-line bg-paper text-ink-soft',
} as const;

/** The next date that matters, with an icon and words (never colour alone) when it is close or past. */
export function KeyDateLine({ date, compact = false }: { date: KeyDate; compact?: boolean }) {
  const when = date.zone ? `${formatInstant(date.at, date.zone)} (${date.zone})` : formatDay(date.at);
  const urgent = date.urgency !== 'later';
  return (
    <p className={`flex items-start gap-1.5 rounded border px-1.5 py-1 text-xs ${TONE[date.urgency]}`} data-urgency={date.urgency}>
      {urgent ? <WarningIcon className="mt-px shrink-0" /> : <ClockIcon className="mt-px shrink-0" />}
      <span className="min-w-0">
        <span className="font-semibold">{urgencyWords(date)}:</span> {date.what}
        {date.gearName && !compact ? ` · ${date.gearName}` : ''}
        {date.gearName && compact ? <span className="sr-only"> ({date.gearName})</span> : null}
        <span className="block">{when}</span>
      </span>
    </p>
  );
}

/** Date conflicts (gear due back before the shoot, a slot before an embargo), each with its sentence. */
export function DateFlags({ flags, compact = false }: { flags: DateFlag[]; compact?: boolean }) {
  if (flags.length === 0) return null;
  return (
    <ul className="flex flex-col gap-1" aria-label="Date conflicts">
      {flags.map((f) => (
        <li key={`${f.code}:${f.message}`} className="flex items-start gap-1.5 rounded border border-danger/50 bg-danger-soft px-1.5 py-1 text-xs text-danger">
          <WarningIcon className="mt-px shrink-0" />
          <span>
            <span className="font-semibold">{f.code === 'due_back_before_shoot' ? 'Due back before the shoot' : 'Slot before embargo'}</span>
            {compact ? <span className="sr-only">: {f.message}</span> : <>: {f.message}</>}
            {compact && (
              <span className="block" aria-hidden="true">
                {f.gearName}
              </span>
            )}
          </span>
        </li>
      ))}
    </ul>
  );
}

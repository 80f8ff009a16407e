import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { CALENDAR_EVENT_LABELS, formatInstantWithZoneName, isValidTimeZone, type CalendarEvent, type CalendarEventKind } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { ErrorNote, Loading, PageHeader } from '../../../components/ui/page.tsx';
import { ZonePicker } from '../../../components/ui/zone-picker.tsx';
import { browserTimeZone } from '../../../lib/time-zones.ts';
import { useChannel } from '../../channels/current-channel.tsx';
import { useCalendar } from '../api/calendar.ts';
import { addDays, addMonths, dayTitle, eventsByDay, eventTime, monthGrid, monthStart, monthTitle, todayIn } from '../calendar-dates.ts';

/** Each kind's symbol, short word and style: the words and symbols tell kinds apart, colour only helps. */
const KIND: Record<CalendarEventKind, { symbol: string; short: string; style: string }> = {
  slot_proposed: { symbol: '◌', short: 'Proposed', style: 'border border-dashed border-warn bg-card text-ink' },
  slot_approved: { symbol: '✓', short: 'Approved', style: 'border border-ok bg-ok-soft text-ink' },
  embargo_lift: { symbol: '◆', short: 'Embargo lifts', style: 'border border-line-strong bg-paper text-ink' },
  gear_due_back: { symbol: '↩', short: 'Due back', style: 'border border-line-strong bg-card text-ink' },
  shoot_day: { symbol: '●', short: 'Shoot', style: 'border border-transparent bg-accent-soft text-ink' },
};

const WEEKDAYS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];
const AGENDA_DAYS = 90;

function linkOf(e: CalendarEvent): string {
  if (e.episodeId) return `/episodes/${e.episodeId}${e.kind.startsWith('slot') ? '?tab=schedule' : ''}`;
  return '/gear';
}

/** One event as a link: symbol, kind word, time in the chosen zone, title. */
function EventChip({ e, zone, compact = false }: { e: CalendarEvent; zone: string; compact?: boolean }) {
  const k = KIND[e.kind];
  const time = eventTime(e, zone);
  const full = `${CALENDAR_EVENT_LABELS[e.kind]}${time ? ` at ${time}` : ''}: ${e.title}`;
  return (
    <Link to={linkOf(e)} className={`block rounded px-1.5 py-0.5 text-xs leading-snug hover:underline ${k.style}`} title={full} aria-label={full}>
      <span aria-hidden="true" className="font-semibold">
        {k.symbol} {k.short}
        {time ? ` ${time}` : ''}
      </span>
      {!compact && <span aria-hidden="true" className="block truncate">{e.title}</span>}
    </Link>
  );
}

/** The calendar: month grid or agenda, in a time zone the viewer chooses. */
export function CalendarPage() {
  const channel = useChannel();
  const [zone, setZone] = useState(browserTimeZone());
  const viewZone = isValidTimeZone(zone) ? zone : channel.timeZone;
  const today = todayIn(viewZone);
  const [month, setMonth] = useState(monthStart(today));
  const [view, setView] = useState<'month' | 'agenda'>('month');

  const grid = useMemo(() => monthGrid(month), [month]);
  const from = view === 'month' ? grid[0] : today;
  const to = view === 'month' ? grid[grid.length - 1] : addDays(today, AGENDA_DAYS);
  const calendar = useCalendar(channel.id, from, to);
  const byDay = useMemo(() => eventsByDay(calendar.data ?? [], viewZone), [calendar.data, viewZone]);
  const agendaDays = useMemo(() => [...byDay.keys()].filter((d) => d >= from && d <= to).sort(), [byDay, from, to]);

  return (
    <div>
      <PageHeader title="Calendar" description="Publish slots, embargo lifts, gear due-back days and shoot days. Select an entry to open its episode." />
      <div className="mb-4 flex flex-wrap items-end gap-4">
        <div className="flex gap-1" role="group" aria-label="View">
          <Button variant={view === 'month' ? 'primary' : 'secondary'} aria-pressed={view === 'month'} onClick={() => setView('month')}>
            Month
          </Button>
          <Button variant={view === 'agenda' ? 'primary' : 'secondary'} aria-pressed={view === 'agenda'} onClick={() => setView('agenda')}>
            Agenda
          </Button>
        </div>
        {view === 'month' && (
          <div className="flex items-center gap-1">
            <Button onClick={() => setMonth(addMonths(month, -1))} aria-label="Previous month">
              ←
            </Button>
            <Button onClick={() => setMonth(monthStart(today))}>Today</Button>
            <Button onClick={() => setMonth(addMonths(month, 1))} aria-label="Next month">
              →
            </Button>
          </div>
        )}
        <ZonePicker
          className="w-full max-w-sm"
          label="Time zone"
          value={zone}
          onChange={setZone}
          quick={[
            { label: 'Mine', zone: browserTimeZone() },
            { label: 'Channel', zone: channel.timeZone },
            { label: 'UTC', zone: 'UTC' },
          ]}
        />
      </div>

      <ul className="mb-4 flex flex-wrap gap-2 text-xs" aria-label="Legend">
        {(Object.keys(KIND) as CalendarEventKind[]).map((k) => (
          <li key={k} className={`rounded px-1.5 py-0.5 ${KIND[k].style}`}>
            <span aria-hidden="true">{KIND[k].symbol} </span>
            {CALENDAR_EVENT_LABELS[k]}
          </li>
        ))}
      </ul>

      {calendar.isLoading && <Loading what="Loading the calendar" />}
      {calendar.error && <ErrorNote error={calendar.error} />}

      {view === 'month' ? (
        <section aria-labelledby="month-title">
          <h2 id="month-title" className="mb-2 text-lg font-semibold">
            {monthTitle(month)} <span className="text-sm font-normal text-ink-muted">({viewZone})</span>
          </h2>
          {/* Wide screens: the grid. Narrow screens: the month's days with entries, as a list. */}
          <div className="hidden overflow-hidden rounded-lg border border-line bg-card sm:block">
            <div className="grid grid-cols-7 border-b border-line bg-paper text-xs font-semibold text-ink-muted" aria-hidden="true">
              {WEEKDAYS.map((d) => (
                <div key={d} className="px-2 py-1">
                  {d}
                </div>
              ))}
            </div>
            <ol className="grid grid-cols-7">
              {grid.map((day) => {
                const inMonth = day.slice(0, 7) === month.slice(0, 7);
                const events = byDay.get(day) ?? [];
                return (
                  <li key={day} className={`min-h-28 border-r border-b border-line p-1 ${inMonth ? '' : 'bg-paper/70'}`} aria-label={`${dayTitle(day)}${events.length ? `, ${events.length} ${events.length === 1 ? 'entry' : 'entries'}` : ''}`}>
                    <p className={`mb-1 text-xs ${day === today ? 'inline-block rounded-full bg-ink px-1.5 font-bold text-white' : inMonth ? 'text-ink-soft' : 'text-ink-muted'}`}>
                      {day === today && <span className="sr-only">Today, </span>}
                      {Number(day.slice(8))}
                    </p>
                    <ul className="flex flex-col gap-1">
                      {events.map((e) => (
                        <li key={e.id}>
                          <EventChip e={e} zone={viewZone} />
                        </li>
                      ))}
                    </ul>
                  </li>
                );
              })}
            </ol>
          </div>
          <div className="sm:hidden">
            <AgendaList days={agendaDays.filter((d) => d.slice(0, 7) === month.slice(0, 7))} byDay={byDay} zone={viewZone} channelZone={channel.timeZone} today={today} />
          </div>
        </section>
      ) : (
        <section aria-labelledby="agenda-title">
          <h2 id="agenda-title" className="mb-2 text-lg font-semibold">
            Next {AGENDA_DAYS} days <span className="text-sm font-normal text-ink-muted">({viewZone})</span>
          </h2>
          <AgendaList days={agendaDays} byDay={byDay} zone={viewZone} channelZone={channel.timeZone} today={today} />
        </section>
      )}
    </div>
  );
}

function AgendaList({ days, byDay, zone, channelZone, today }: { days: string[]; byDay: Map<string, CalendarEvent[]>; zone: string; channelZone: string; today: string }) {
  if (days.length === 0) return <p className="rounded-lg border border-line bg-card p-4 text-sm text-ink-muted">Nothing in this period.</p>;
  return (
    <ol className="flex flex-col gap-3">
      {days.map((day) => (
        <li key={day} className="rounded-lg border border-line bg-card">
          <h3 className="border-b border-line bg-paper px-3 py-1.5 text-sm font-semibold">
            {dayTitle(day)}
            {day === today && <span className="ml-2 rounded bg-ink px-1.5 text-xs text-white">today</span>}
          </h3>
          <ul className="divide-y divide-line">
            {(byDay.get(day) ?? []).map((e) => {
              const k = KIND[e.kind];
              const time = eventTime(e, zone);
              return (
                <li key={e.id}>
                  <Link to={linkOf(e)} className="flex flex-wrap items-baseline gap-x-3 gap-y-0.5 px-3 py-2 text-sm hover:bg-paper">
                    <span className="w-14 shrink-0 font-mono text-xs text-ink-soft">{time ?? 'all day'}</span>
                    <span className={`rounded px-1.5 py-0.5 text-xs font-semibold ${k.style}`}>
                      <span aria-hidden="true">{k.symbol} </span>
                      {CALENDAR_EVENT_LABELS[e.kind]}
                    </span>
                    <span className="min-w-0 flex-1 font-medium">{e.title}</span>
                    {e.at && e.zone && e.zone !== zone && <span className="w-full pl-[4.25rem] text-xs text-ink-muted">Entered as {formatInstantWithZoneName(e.at, e.zone)}</span>}
                    {e.at && channelZone !== zone && channelZone !== e.zone && <span className="w-full pl-[4.25rem] text-xs text-ink-muted">Channel time {formatInstantWithZoneName(e.at, channelZone)}</span>}
                  </Link>
                </li>
              );
            })}
          </ul>
        </li>
      ))}
    </ol>
  );
}

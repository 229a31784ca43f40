import { dayKey, formatDay, formatTime } from '../time';

/** A job's time in two short lines (day, then hours), in the site's time zone. */
export function JobWhen({ start, end, timeZone }: { start: string | null; end: string | null; timeZone: string }) {
  if (!start) return <span className="text-slate-500">Not scheduled</span>;
  const sameDay = !end || dayKey(start, timeZone) === dayKey(end, timeZone);
  return (
    <span className="block tabular-nums md:whitespace-nowrap">
      <span className="block font-medium whitespace-nowrap">{formatDay(start, timeZone)}</span>
      <span className="block text-xs text-slate-500">
        {formatTime(start, timeZone)}
        {end && ` – ${sameDay ? formatTime(end, timeZone) : `${formatDay(end, timeZone)} ${formatTime(end, timeZone)}`}`}
      </span>
    </span>
  );
}

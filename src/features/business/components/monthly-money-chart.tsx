import { useId } from 'react';
import { Area, AreaChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatCents } from '@domain/plans';

/** Our colour tokens (src/index.css); the chart draws in SVG, outside Tailwind's classes. */
const INK = '#1d2a30';
const BRASS = '#8f5c17';
const LINE = '#d9d4c8';
const SLATE = '#5d6b73';

export interface MoneyPoint {
  month: string;
  label: string;
  cents: number;
}

export interface ExtraColumn {
  header: string;
  values: readonly number[];
}

const count = new Intl.NumberFormat('en-US');

/** "$1.2k"-style axis labels, so long amounts do not crowd the axis. */
function axisCents(cents: number): string {
  const dollars = cents / 100;
  if (Math.abs(dollars) >= 1000) return `$${count.format(Math.round(dollars / 100) / 10)}k`;
  return formatCents(Math.round(cents / 100) * 100);
}

/**
 * An amount month by month as an area chart, with the same numbers in a table for screen readers
 * (the drawing itself is hidden from them) and a one-line summary in words under the chart.
 */
export function MonthlyMoneyChart({
  title,
  valueLabel,
  points,
  extra,
}: {
  title: string;
  valueLabel: string;
  points: readonly MoneyPoint[];
  extra?: ExtraColumn;
}) {
  const summaryId = useId();
  const first = points[0];
  const last = points.at(-1);
  const summary =
    first && last
      ? `${valueLabel} went from ${formatCents(first.cents)} in ${first.label} to ${formatCents(last.cents)} in ${last.label}.`
      : 'No months to show.';

  return (
    <figure aria-describedby={summaryId}>
      <div className="h-60 w-full" aria-hidden="true">
        <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 640, height: 240 }}>
          <AreaChart data={[...points]} margin={{ top: 8, right: 12, bottom: 0, left: 0 }} accessibilityLayer={false}>
            <CartesianGrid stroke={LINE} vertical={false} />
            <XAxis
              dataKey="label"
              tick={{ fill: SLATE, fontSize: 13 }}
              tickLine={false}
              axisLine={{ stroke: LINE }}
              interval="preserveStartEnd"
              minTickGap={16}
            />
            <YAxis
              tickFormatter={axisCents}
              tick={{ fill: SLATE, fontSize: 13 }}
              tickLine={false}
              axisLine={false}
              width={56}
              allowDecimals={false}
            />
            <Tooltip
              formatter={(value) => [formatCents(Number(value)), valueLabel]}
              contentStyle={{ borderColor: LINE, borderRadius: 6, color: INK, fontSize: 13 }}
              labelStyle={{ color: INK, fontWeight: 600 }}
            />
            <Area
              type="linear"
              dataKey="cents"
              name={valueLabel}
              stroke={BRASS}
              strokeWidth={2}
              fill={BRASS}
              fillOpacity={0.12}
              dot={{ r: 2.5, fill: BRASS, stroke: BRASS }}
              isAnimationActive={false}
            />
          </AreaChart>
        </ResponsiveContainer>
      </div>
      <figcaption id={summaryId} className="mt-2 text-xs text-slate-500">
        {summary}
      </figcaption>
      <table className="sr-only">
        <caption>{title}</caption>
        <thead>
          <tr>
            <th scope="col">Month</th>
            <th scope="col">{valueLabel}</th>
            {extra && <th scope="col">{extra.header}</th>}
          </tr>
        </thead>
        <tbody>
          {points.map((point, i) => (
            <tr key={point.month}>
              <th scope="row">{point.label}</th>
              <td>{formatCents(point.cents)}</td>
              {extra && <td>{count.format(extra.values[i] ?? 0)}</td>}
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}

import { useId, useMemo } from 'react';
import { Brush, CartesianGrid, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { mergeRows, type ChartLine } from '../chart/lines';
import type { TimeMarks } from '../chart/marks';
import { KNOCK_STROKE, PULL_FILL } from '../chart/palette';
import { formatClock, timeTicks, valueAt } from '../chart/time';
import { axisLabel, formatChange, formatNumber, formatValue, groupByUnit, withUnit } from '../chart/units';

interface TimeChartProps {
  title: string;
  lines: ChartLine[];
  domain: [number, number];
  /** "Time from the start of the log" or "Time from the start of the pull". */
  xLabel: string;
  marks: TimeMarks;
  cursor: number;
  onCursor: (t: number) => void;
  /** Called with the stretch picked under the chart (seconds on the chart's axis), or null for all of it. */
  onBrush?: (range: { from: number; to: number } | null) => void;
}

const INK = '#3c423f';
const GRID = '#eceeec';

/** Small line sample for the legend: the line's colour and dash, drawn as in the chart. */
function LineSwatch({ colour, dashed }: { colour: string; dashed: boolean }) {
  return (
    <svg width="28" height="10" aria-hidden="true" className="shrink-0">
      <line x1="1" y1="5" x2="27" y2="5" stroke={colour} strokeWidth="2.5" strokeDasharray={dashed ? '5 3' : undefined} />
    </svg>
  );
}

/**
 * Lines of one or two logs over time: one y-axis per unit (left and right in turn), pulls shaded, knock marked,
 * a cursor the pointer or the slider moves, and a readout of every line's value at the cursor.
 */
export function TimeChart({ title, lines, domain, xLabel, marks, cursor, onCursor, onBrush }: TimeChartProps) {
  const sliderId = useId();
  const rows = useMemo(() => mergeRows(lines), [lines]);
  const groups = useMemo(() => groupByUnit(lines), [lines]);
  const firstAxis = groups[0]?.axisId;
  const span = domain[1] - domain[0];
  const step = span > 600 ? 1 : 0.1;
  const sources = [...new Set(lines.map((l) => l.source))];
  const channels = [...new Map(lines.map((l) => [l.channel, l])).values()];

  return (
    <figure className="flex min-w-0 flex-col gap-3">
      <figcaption className="sr-only">{title}</figcaption>
      {/* Wide content scrolls inside its own focusable box on a phone; the page itself never gets wider. */}
      <div
        tabIndex={0}
        role="group"
        aria-label={`${title}. On a narrow screen the chart scrolls sideways.`}
        className="overflow-x-auto rounded-md focus-visible:outline-2 focus-visible:outline-accent-600"
      >
        <div className="h-[26rem] min-w-[34rem]">
          <ResponsiveContainer width="100%" height="100%">
            <LineChart
              data={rows}
              accessibilityLayer={false}
              margin={{ top: 16, right: 8, bottom: 8, left: 8 }}
              onMouseMove={(state) => {
                if (typeof state.activeLabel === 'number') onCursor(state.activeLabel);
              }}
            >
              <CartesianGrid stroke={GRID} />
              <XAxis
                dataKey="t"
                type="number"
                domain={domain}
                allowDataOverflow
                ticks={timeTicks(domain[0], domain[1])}
                tickFormatter={(t: number) => formatClock(t)}
                tick={{ fill: INK, fontSize: 12 }}
                height={44}
                label={{ value: `${xLabel} (m:ss)`, position: 'insideBottom', fill: INK, fontSize: 12 }}
              />
              {groups.map((group, i) => {
                const left = i % 2 === 0;
                const only = group.channels.length === 1 ? group.channels[0] : undefined;
                return (
                  <YAxis
                    key={group.axisId}
                    yAxisId={group.axisId}
                    orientation={left ? 'left' : 'right'}
                    domain={['auto', 'auto']}
                    width={60}
                    stroke={only?.colour ?? INK}
                    tick={{ fill: INK, fontSize: 12 }}
                    tickFormatter={(v: number) => formatNumber(v, group.unit)}
                    label={{ value: axisLabel(group.unit), angle: left ? -90 : 90, position: left ? 'insideLeft' : 'insideRight', fill: INK, fontSize: 13, fontWeight: 600 }}
                  />
                );
              })}
              {/* Hover drives the cursor line and the readout below; recharts' own box would repeat it. */}
              <Tooltip content={() => null} cursor={false} isAnimationActive={false} />
              {firstAxis &&
                marks.pulls.map((pull) => (
                  <ReferenceArea
                    key={`${pull.startS}`}
                    yAxisId={firstAxis}
                    x1={pull.startS}
                    x2={pull.endS}
                    fill={PULL_FILL}
                    fillOpacity={0.16}
                    ifOverflow="hidden"
                    label={{ value: pull.label, position: 'insideTop', fill: INK, fontSize: 12 }}
                  />
                ))}
              {firstAxis &&
                marks.knock.map((event) => (
                  <ReferenceLine
                    key={`${event.label}:${event.timeS}`}
                    yAxisId={firstAxis}
                    x={event.timeS}
                    stroke={KNOCK_STROKE}
                    strokeWidth={1.5}
                    strokeDasharray={event.dashed ? '2 3' : '6 3'}
                    ifOverflow="hidden"
                    label={{ value: event.label, position: 'insideTopLeft', fill: KNOCK_STROKE, fontSize: 11 }}
                  />
                ))}
              {lines.map((line) => (
                <Line
                  key={line.key}
                  yAxisId={groups.find((g) => g.unit === line.unit)!.axisId}
                  dataKey={line.key}
                  name={line.label}
                  type={line.unit === '' ? 'stepAfter' : 'linear'}
                  stroke={line.colour}
                  strokeDasharray={line.dashed ? '5 3' : undefined}
                  dot={false}
                  activeDot={false}
                  strokeWidth={1.6}
                  connectNulls
                  isAnimationActive={false}
                />
              ))}
              {firstAxis && <ReferenceLine yAxisId={firstAxis} x={cursor} stroke="#191d1b" strokeWidth={1} ifOverflow="hidden" />}
              {onBrush && rows.length > 1 && (
                <Brush
                  dataKey="t"
                  height={24}
                  stroke="#1e6c76"
                  ariaLabel="Stretch to zoom into: move each handle with the arrow keys"
                  tickFormatter={(t: number) => formatClock(Number(t))}
                  onChange={(range) => {
                    const from = rows[range.startIndex ?? 0]?.t;
                    const to = rows[range.endIndex ?? rows.length - 1]?.t;
                    const whole = (range.startIndex ?? 0) === 0 && (range.endIndex ?? rows.length - 1) === rows.length - 1;
                    onBrush(from !== undefined && to !== undefined && to > from && !whole ? { from, to } : null);
                  }}
                />
              )}
            </LineChart>
          </ResponsiveContainer>
        </div>
      </div>

      <ul aria-label="Legend" className="flex flex-wrap gap-x-5 gap-y-1.5 text-sm text-ink-700">
        {channels.map((line) => (
          <li key={line.channel} className="inline-flex items-center gap-1.5">
            <LineSwatch colour={line.colour} dashed={false} />
            {withUnit(line.label, line.unit)}
          </li>
        ))}
        {sources.length > 1 &&
          sources.map((source, i) => (
            <li key={source} className="inline-flex items-center gap-1.5">
              <LineSwatch colour={INK} dashed={i > 0} />
              {source}
            </li>
          ))}
        {marks.pulls.length > 0 && (
          <li className="inline-flex items-center gap-1.5">
            <span aria-hidden="true" className="inline-block h-3 w-7 rounded-sm" style={{ background: PULL_FILL, opacity: 0.35 }} />
            Full-throttle pull
          </li>
        )}
        {marks.knock.length > 0 && (
          <li className="inline-flex items-center gap-1.5">
            <LineSwatch colour={KNOCK_STROKE} dashed />
            Knock retard event
          </li>
        )}
      </ul>

      <div className="flex flex-col gap-1">
        <label htmlFor={sliderId} className="text-sm font-medium text-ink-800">
          Cursor at {formatClock(cursor, 1)} ({formatNumber(cursor, 's')} s) — move it with the arrow keys, or point at the chart
        </label>
        <input
          id={sliderId}
          type="range"
          min={domain[0]}
          max={domain[1]}
          step={step}
          value={Math.min(domain[1], Math.max(domain[0], cursor))}
          aria-valuetext={`${formatClock(cursor, 1)}, ${formatNumber(cursor, 's')} seconds`}
          onChange={(e) => onCursor(Number(e.target.value))}
          className="w-full accent-accent-600"
        />
      </div>
      <CursorReadout lines={lines} sources={sources} cursor={cursor} />
    </figure>
  );
}

/** Every line's value at the cursor with its unit; with two logs, side by side with the change. */
function CursorReadout({ lines, sources, cursor }: { lines: ChartLine[]; sources: string[]; cursor: number }) {
  const channels = [...new Map(lines.map((l) => [l.channel, l])).values()];
  const valueOf = (channel: string, source: string) => {
    const line = lines.find((l) => l.channel === channel && l.source === source);
    return line ? valueAt(line.t, line.v, cursor) : null;
  };
  const two = sources.length === 2;
  return (
    <div className="overflow-x-auto" aria-live="polite">
      <table className="w-full max-w-3xl text-sm tabular-nums">
        <caption className="mb-1 text-left font-medium text-ink-800">
          Values at {formatClock(cursor, 1)} ({formatNumber(cursor, 's')} s)
        </caption>
        <thead className="text-left text-ink-600">
          <tr>
            <th scope="col" className="py-1 pr-3 font-medium">
              Channel
            </th>
            {sources.map((source) => (
              <th key={source} scope="col" className="py-1 pr-3 text-right font-medium">
                {two ? source : 'Value'}
              </th>
            ))}
            {two && (
              <th scope="col" className="py-1 text-right font-medium">
                Change
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {channels.map((line) => {
            const values = sources.map((s) => valueOf(line.channel, s));
            const [a, b] = values;
            return (
              <tr key={line.channel} className="border-t border-ink-100">
                <th scope="row" className="py-1 pr-3 text-left font-normal">
                  <span className="inline-flex items-center gap-1.5">
                    <LineSwatch colour={line.colour} dashed={false} />
                    {line.label}
                  </span>
                </th>
                {values.map((value, i) => (
                  <td key={sources[i]} className="py-1 pr-3 text-right whitespace-nowrap">
                    {formatValue(value, line.unit)}
                  </td>
                ))}
                {two && (
                  <td className="py-1 text-right whitespace-nowrap">
                    {formatChange(a === null || a === undefined || b === null || b === undefined ? null : a - b, line.unit)}
                  </td>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

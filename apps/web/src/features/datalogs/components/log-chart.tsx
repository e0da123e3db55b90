import { useMemo, useState } from 'react';
import { Brush, CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { CanonicalChannel } from '@revloop/domain/datalog';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useDatalogSeries, type SeriesChannel } from '../api/get-datalog-series';

/** Okabe & Ito (2008) "Color Universal Design" palette: told apart with every common colour-vision deficiency. */
const LINE_COLOURS = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#000000', '#F0E442'];
const DEFAULT_CHANNELS: CanonicalChannel[] = ['rpm', 'map', 'lambda_meas', 'knock_retard'];
const MAX_CHANNELS = 6;

type Row = { t: number } & Partial<Record<CanonicalChannel, number>>;

/** One row per time stamp of any series; each series was downsampled on its own, so others are blank there. */
function mergeSeries(channels: SeriesChannel[]): Row[] {
  const rows = new Map<number, Row>();
  for (const series of channels) {
    series.t.forEach((t, i) => {
      const row = rows.get(t) ?? { t };
      row[series.channel] = series.v[i];
      rows.set(t, row);
    });
  }
  return [...rows.values()].sort((a, b) => a.t - b.t);
}

/** Time-series chart of a log: pick channels, brush a stretch and zoom into it at full detail, knock marked. */
export function LogChart({ datalogId, available }: { datalogId: string; available: { channel: CanonicalChannel; label: string }[] }) {
  const [picked, setPicked] = useState<CanonicalChannel[]>(() => DEFAULT_CHANNELS.filter((c) => available.some((a) => a.channel === c)));
  const [window, setWindow] = useState<{ from: number; to: number } | null>(null);
  const [brushed, setBrushed] = useState<{ from: number; to: number } | null>(null);
  const series = useDatalogSeries(datalogId, { channels: picked, from: window?.from, to: window?.to });
  const data = useMemo(() => mergeSeries(series.data?.data.channels ?? []), [series.data]);
  const channels = series.data?.data.channels ?? [];

  const toggle = (channel: CanonicalChannel) =>
    setPicked((current) => (current.includes(channel) ? current.filter((c) => c !== channel) : current.length >= MAX_CHANNELS ? current : [...current, channel]));

  return (
    <div className="flex flex-col gap-3">
      <fieldset>
        <legend className="mb-1 text-sm font-medium text-ink-800">Channels (up to {MAX_CHANNELS}; each has its own scale)</legend>
        <div className="flex flex-wrap gap-x-4 gap-y-1">
          {available.map(({ channel, label }) => (
            <label key={channel} className="inline-flex items-center gap-1.5 text-sm text-ink-700">
              <input type="checkbox" checked={picked.includes(channel)} onChange={() => toggle(channel)} />
              {label}
            </label>
          ))}
        </div>
      </fieldset>
      {series.isError && <Banner tone="bad" title="The chart could not be loaded">{errorMessage(series.error)}</Banner>}
      {picked.length === 0 ? (
        <p className="text-sm text-ink-600">Pick at least one channel.</p>
      ) : (
        <div className="relative h-96 w-full" role="img" aria-label={`Chart of ${channels.map((c) => c.label).join(', ')} over time`}>
          {series.isFetching && <Spinner label="Loading the chart" className="absolute top-2 right-2" />}
          <ResponsiveContainer width="100%" height="100%">
            <LineChart data={data} margin={{ top: 8, right: 16, bottom: 8, left: 16 }}>
              <CartesianGrid stroke="#eceeec" />
              <XAxis dataKey="t" type="number" domain={['dataMin', 'dataMax']} unit=" s" tickFormatter={(t: number) => t.toFixed(0)} />
              {channels.map((c) => (
                <YAxis key={c.channel} yAxisId={c.channel} hide domain={['auto', 'auto']} />
              ))}
              <Tooltip
                labelFormatter={(t) => `${Number(t).toFixed(2)} s`}
                formatter={(value, name) => {
                  const c = channels.find((s) => s.label === name);
                  return [`${Number(value).toFixed(2)} ${c?.unit ?? ''}`, name];
                }}
              />
              {channels.map((c, i) => (
                <Line
                  key={c.channel}
                  yAxisId={c.channel}
                  dataKey={c.channel}
                  name={c.label}
                  stroke={LINE_COLOURS[i % LINE_COLOURS.length]}
                  dot={false}
                  strokeWidth={1.5}
                  connectNulls
                  isAnimationActive={false}
                />
              ))}
              {channels[0] &&
                (series.data?.data.knock ?? []).map((event) => (
                  <ReferenceLine
                    key={event.timeS}
                    yAxisId={channels[0]!.channel}
                    x={event.timeS}
                    stroke="#ad2318"
                    strokeDasharray="4 3"
                    label={{ value: `knock −${event.retardDeg.toFixed(1)}°`, position: 'insideTopLeft', fill: '#ad2318', fontSize: 11 }}
                  />
                ))}
              {data.length > 1 && (
                <Brush
                  dataKey="t"
                  height={24}
                  stroke="#1e6c76"
                  tickFormatter={(t: number) => `${Number(t).toFixed(0)} s`}
                  onChange={(range) => {
                    const from = data[range.startIndex ?? 0]?.t;
                    const to = data[range.endIndex ?? data.length - 1]?.t;
                    setBrushed(from !== undefined && to !== undefined && to > from ? { from, to } : null);
                  }}
                />
              )}
            </LineChart>
          </ResponsiveContainer>
        </div>
      )}
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <Button size="sm" variant="secondary" disabled={!brushed} onClick={() => brushed && setWindow(brushed)}>
          Zoom to the brushed stretch
        </Button>
        <Button size="sm" variant="ghost" disabled={!window} onClick={() => { setWindow(null); setBrushed(null); }}>
          Show the whole log
        </Button>
        <span className="text-ink-600">
          Drag the handles under the chart to pick a stretch; zooming reloads it at full detail (at most 2000 points a channel). Dashed red lines mark knock.
        </span>
      </div>
    </div>
  );
}

import { useMemo, useState } from 'react';
import { CartesianGrid, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis } from 'recharts';
import { lambdaErrorPct, type CanonicalChannel, type DatalogReport } from '@revloop/domain/datalog';
import { Banner } from '../../../components/ui/banner';
import { Select } from '../../../components/ui/select';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useDatalogSeries } from '../api/get-datalog-series';
import type { ChannelChoice, Stretch } from '../chart/lines';
import { pullLabel } from '../chart/marks';
import { LINE_COLOURS, VIRIDIS_7 } from '../chart/palette';
import { binEdges, binOf, formatClock } from '../chart/time';
import { formatNumber, formatValue, withUnit } from '../chart/units';

/** A channel of the log, or λ error worked out row by row from measured and commanded λ. */
type Axis = CanonicalChannel | 'lambda_error';
const LAMBDA_ERROR: ChannelChoice & { needs: CanonicalChannel[] } = {
  channel: 'lambda_meas',
  label: 'λ error (+ lean)',
  unit: '%',
  needs: ['lambda_meas', 'lambda_cmd'],
};
const POINTS = 3000;
const INK = '#3c423f';

interface Point {
  x: number;
  y: number;
  c: number | null;
  t: number;
}

const firstOf = (options: Axis[], wanted: Axis[]) => wanted.find((w) => options.includes(w)) ?? options[0]!;

/**
 * Any channel against any other, each point coloured by a third on a viridis scale, from the whole log, a pull or
 * the stretch brushed in the over-time view. The same rows of every channel are paired (sampling=rows).
 */
export function LogScatter({ datalogId, report, available, stretch }: { datalogId: string; report: DatalogReport; available: ChannelChoice[]; stretch: Stretch | null }) {
  const hasLambdaError = ['lambda_meas', 'lambda_cmd'].every((c) => available.some((a) => a.channel === c));
  const axes: Axis[] = [...(hasLambdaError ? (['lambda_error'] as const) : []), ...available.map((a) => a.channel)];
  const info = (axis: Axis) => (axis === 'lambda_error' ? LAMBDA_ERROR : available.find((a) => a.channel === axis)!);
  const [x, setX] = useState<Axis>(() => firstOf(axes, ['rpm']));
  const [y, setY] = useState<Axis>(() => firstOf(axes, ['lambda_error', 'knock_retard', 'map']));
  const [colour, setColour] = useState<Axis | 'none'>(() => (axes.includes('map') ? 'map' : 'none'));
  const [scope, setScope] = useState<string>(stretch ? 'stretch' : 'all');

  const pull = scope.startsWith('pull:') ? report.wot.pulls[Number(scope.slice(5))] : undefined;
  const range = pull ? { from: pull.startS, to: pull.endS } : scope === 'stretch' && stretch ? stretch : null;
  const needs = (axis: Axis | 'none'): CanonicalChannel[] => (axis === 'none' ? [] : axis === 'lambda_error' ? LAMBDA_ERROR.needs : [axis]);
  const channels = [...new Set([...needs(x), ...needs(y), ...needs(colour)])];
  const series = useDatalogSeries(datalogId, { channels, from: range?.from, to: range?.to, points: POINTS, sampling: 'rows' });

  const points = useMemo<Point[]>(() => {
    const got = series.data?.data.channels ?? [];
    const column = (c: CanonicalChannel) => got.find((s) => s.channel === c)?.v;
    const times = got[0]?.t ?? [];
    const read = (axis: Axis): ((i: number) => number) | null => {
      if (axis === 'lambda_error') {
        const meas = column('lambda_meas');
        const cmd = column('lambda_cmd');
        return meas && cmd ? (i) => lambdaErrorPct(meas[i] as number, cmd[i] as number) : null;
      }
      const values = column(axis);
      return values ? (i) => values[i] as number : null;
    };
    const rx = read(x);
    const ry = read(y);
    const rc = colour === 'none' ? null : read(colour);
    if (!rx || !ry) return [];
    return times
      .map((t, i) => ({ t, x: rx(i), y: ry(i), c: rc ? rc(i) : null }))
      .filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y) && (p.c === null || Number.isFinite(p.c)));
  }, [series.data, x, y, colour]);

  const edges = useMemo(() => (colour === 'none' ? [] : binEdges(points.map((p) => p.c as number), VIRIDIS_7.length)), [points, colour]);
  const bins = useMemo(() => {
    if (colour === 'none' || edges.length === 0) return [{ fill: LINE_COLOURS[0] as string, name: 'samples', points }];
    const out = Array.from({ length: edges.length - 1 }, (_, i) => ({
      fill: VIRIDIS_7[edges.length === 2 ? 3 : i] as string,
      name: `${formatNumber(edges[i] as number, info(colour).unit)}–${formatValue(edges[i + 1] as number, info(colour).unit)}`,
      points: [] as Point[],
    }));
    for (const p of points) out[binOf(p.c as number, edges)]!.points.push(p);
    return out;
    // info() reads `available`, which is fixed for the log.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [points, edges, colour]);

  const xi = info(x);
  const yi = info(y);
  const ci = colour === 'none' ? null : info(colour);
  const options = axes.map((a) => ({ value: a, label: withUnit(info(a).label, info(a).unit) }));
  const title = `${yi.label} against ${xi.label}${ci ? `, coloured by ${ci.label}` : ''}`;

  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
          Across (x)
          <Select value={x} onChange={(e) => setX(e.target.value as Axis)} options={options} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
          Up (y)
          <Select value={y} onChange={(e) => setY(e.target.value as Axis)} options={options} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
          Colour by
          <Select value={colour} onChange={(e) => setColour(e.target.value as Axis | 'none')} options={[{ value: 'none', label: 'One colour' }, ...options]} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
          Samples from
          <Select
            value={scope}
            onChange={(e) => setScope(e.target.value)}
            options={[
              { value: 'all', label: 'The whole log' },
              ...report.wot.pulls.map((p, i) => ({ value: `pull:${i}`, label: pullLabel(p, i) })),
              ...(stretch ? [{ value: 'stretch', label: `The brushed stretch, ${formatClock(stretch.from)}–${formatClock(stretch.to)}` }] : []),
            ]}
          />
        </label>
      </div>
      {!stretch && <p className="text-sm text-ink-600">To plot only part of the log, brush or zoom a stretch in the “Over time” view.</p>}
      {series.isFetching && <Spinner label="Loading the samples" />}
      {series.isError && <Banner tone="bad" title="The samples could not be loaded">{errorMessage(series.error)}</Banner>}
      <figure className="flex min-w-0 flex-col gap-3">
        <figcaption className="text-sm text-ink-700">
          {title}: {points.length.toLocaleString()} samples{range ? ` from ${formatClock(range.from)} to ${formatClock(range.to)}` : ' from the whole log'}.
        </figcaption>
        <div
          tabIndex={0}
          role="group"
          aria-label={`${title}. On a narrow screen the chart scrolls sideways.`}
          className="overflow-x-auto rounded-md focus-visible:outline-2 focus-visible:outline-accent-600"
        >
          <div className="h-[26rem] min-w-[36rem]">
            <ResponsiveContainer width="100%" height="100%">
              <ScatterChart accessibilityLayer={false} margin={{ top: 8, right: 16, bottom: 8, left: 8 }}>
                <CartesianGrid stroke="#eceeec" />
                <XAxis
                  type="number"
                  dataKey="x"
                  name={xi.label}
                  domain={['auto', 'auto']}
                  tick={{ fill: INK, fontSize: 12 }}
                  tickFormatter={(v: number) => formatNumber(v, xi.unit)}
                  height={44}
                  label={{ value: withUnit(xi.label, xi.unit), position: 'insideBottom', fill: INK, fontSize: 12 }}
                />
                <YAxis
                  type="number"
                  dataKey="y"
                  name={yi.label}
                  domain={['auto', 'auto']}
                  width={64}
                  tick={{ fill: INK, fontSize: 12 }}
                  tickFormatter={(v: number) => formatNumber(v, yi.unit)}
                  label={{ value: withUnit(yi.label, yi.unit), angle: -90, position: 'insideLeft', fill: INK, fontSize: 12 }}
                />
                <ZAxis range={[14, 14]} />
                <Tooltip
                  isAnimationActive={false}
                  cursor={{ strokeDasharray: '3 3' }}
                  content={({ active, payload }) => {
                    const p = active ? (payload?.[0]?.payload as Point | undefined) : undefined;
                    if (!p) return null;
                    return (
                      <div className="rounded border border-ink-200 bg-white px-2 py-1 text-xs text-ink-800 shadow-sm tabular-nums">
                        <div>at {formatClock(p.t, 1)}</div>
                        <div>{xi.label}: {formatValue(p.x, xi.unit)}</div>
                        <div>{yi.label}: {formatValue(p.y, yi.unit)}</div>
                        {ci && <div>{ci.label}: {formatValue(p.c, ci.unit)}</div>}
                      </div>
                    );
                  }}
                />
                {bins.map((bin) => (
                  <Scatter key={bin.name} name={bin.name} data={bin.points} fill={bin.fill} stroke="#191d1b" strokeOpacity={0.35} strokeWidth={0.5} isAnimationActive={false} />
                ))}
              </ScatterChart>
            </ResponsiveContainer>
          </div>
        </div>
        {ci && edges.length > 0 && (
          <div className="text-sm text-ink-700">
            <p id={`${datalogId}-colour-scale`} className="font-medium text-ink-800">
              Colour: {withUnit(ci.label, ci.unit)} — viridis scale, low (dark) to high (light)
            </p>
            <ul aria-labelledby={`${datalogId}-colour-scale`} className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
              {bins.map((bin) => (
                <li key={bin.name} className="inline-flex items-center gap-1.5 tabular-nums">
                  <span aria-hidden="true" className="inline-block size-3.5 rounded-full border border-ink-400" style={{ background: bin.fill }} />
                  {bin.name}
                  <span className="text-ink-600">({bin.points.length})</span>
                </li>
              ))}
            </ul>
          </div>
        )}
      </figure>
    </div>
  );
}

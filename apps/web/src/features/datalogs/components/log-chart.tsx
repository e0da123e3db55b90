import { useMemo, useState } from 'react';
import type { Datalog } from '@revloop/contract';
import { CHANNEL_INFO, type CanonicalChannel, type DatalogReport } from '@revloop/domain/datalog';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Select } from '../../../components/ui/select';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useDatalogSeries } from '../api/get-datalog-series';
import type { ChannelChoice, ChartLine, Stretch } from '../chart/lines';
import { lineColour } from '../chart/palette';
import { marksOf, pullLabel } from '../chart/marks';
import { formatClock } from '../chart/time';
import { withUnit } from '../chart/units';
import { LogOverlay } from './log-overlay';
import { LogScatter } from './log-scatter';
import { TimeChart } from './time-chart';

const DEFAULT_CHANNELS: CanonicalChannel[] = ['rpm', 'map', 'lambda_meas', 'lambda_cmd', 'knock_retard'];
const MAX_CHANNELS = 6;

type Mode = 'time' | 'overlay' | 'scatter';

const MODES: { value: Mode; label: string }[] = [
  { value: 'time', label: 'Over time' },
  { value: 'overlay', label: 'Two logs overlaid' },
  { value: 'scatter', label: 'One channel against another' },
];

function ModeSwitch({ mode, onChange }: { mode: Mode; onChange: (m: Mode) => void }) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-medium text-ink-800">View</legend>
      <div className="inline-flex flex-wrap rounded-md border border-ink-300 bg-white p-0.5">
        {MODES.map((m) => (
          <label
            key={m.value}
            className="cursor-pointer rounded px-3 py-1.5 text-sm text-ink-700 has-checked:bg-accent-600 has-checked:text-white has-focus-visible:outline-2 has-focus-visible:outline-offset-1 has-focus-visible:outline-accent-700"
          >
            <input type="radio" name="chart-mode" value={m.value} checked={mode === m.value} onChange={() => onChange(m.value)} className="sr-only" />
            {m.label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

function ChannelPicker({ available, picked, onToggle }: { available: ChannelChoice[]; picked: CanonicalChannel[]; onToggle: (c: CanonicalChannel) => void }) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-medium text-ink-800">Channels (up to {MAX_CHANNELS}; one axis per unit)</legend>
      <div className="flex flex-wrap gap-x-4 gap-y-1">
        {available.map(({ channel, label, unit }) => (
          <label key={channel} className="inline-flex items-center gap-1.5 text-sm text-ink-700">
            <input
              type="checkbox"
              checked={picked.includes(channel)}
              disabled={!picked.includes(channel) && picked.length >= MAX_CHANNELS}
              onChange={() => onToggle(channel)}
            />
            {withUnit(label, unit)}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

/** What the time view shows: the whole log, a pull with a little either side, or a zoomed stretch. */
type Shown = { kind: 'all' } | { kind: 'pull'; index: number } | { kind: 'zoom'; from: number; to: number };

const PULL_MARGIN_S = 3;

function windowOf(shown: Shown, report: DatalogReport): Stretch | null {
  if (shown.kind === 'zoom') return { from: shown.from, to: shown.to };
  const pull = shown.kind === 'pull' ? report.wot.pulls[shown.index] : undefined;
  return pull ? { from: Math.max(0, pull.startS - PULL_MARGIN_S), to: Math.min(report.durationS, pull.endS + PULL_MARGIN_S) } : null;
}

interface TimeViewProps {
  datalogId: string;
  report: DatalogReport;
  picked: CanonicalChannel[];
  shown: Shown;
  onShow: (shown: Shown) => void;
  brushed: Stretch | null;
  onBrush: (stretch: Stretch | null) => void;
}

/** One log over time: the stretch to show (whole log, a pull, or the brushed stretch), pulls and knock marked. */
function TimeView({ datalogId, report, picked, shown, onShow, brushed, onBrush }: TimeViewProps) {
  const window = windowOf(shown, report);
  const [cursor, setCursor] = useState(() => report.wot.pulls[0]?.startS ?? 0);
  const series = useDatalogSeries(datalogId, { channels: picked, from: window?.from, to: window?.to });
  const data = series.data?.data;
  const lines = useMemo<ChartLine[]>(
    () =>
      (data?.channels ?? []).map((c) => ({
        key: c.channel,
        channel: c.channel,
        label: c.label,
        unit: c.unit,
        colour: lineColour(picked.indexOf(c.channel)),
        source: 'this log',
        dashed: false,
        t: c.t,
        v: c.v,
      })),
    [data, picked],
  );
  const domain: [number, number] = window ? [window.from, window.to] : [0, report.durationS];
  const show = (next: Shown) => {
    onShow(next);
    onBrush(null);
    const w = windowOf(next, report);
    if (w && (cursor < w.from || cursor > w.to)) setCursor(w.from);
  };

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
          Show
          <Select
            className="w-auto min-w-64"
            value={shown.kind === 'pull' ? `pull:${shown.index}` : shown.kind}
            onChange={(e) => {
              const value = e.target.value;
              if (value.startsWith('pull:')) show({ kind: 'pull', index: Number(value.slice(5)) });
              else if (value === 'all') show({ kind: 'all' });
            }}
            options={[
              { value: 'all', label: `The whole log (${formatClock(report.durationS)})` },
              ...report.wot.pulls.map((p, i) => ({ value: `pull:${i}`, label: pullLabel(p, i) })),
              ...(shown.kind === 'zoom' ? [{ value: 'zoom', label: `Zoomed: ${formatClock(shown.from)}–${formatClock(shown.to)}` }] : []),
            ]}
          />
        </label>
        <Button size="sm" variant="secondary" disabled={!brushed} onClick={() => brushed && show({ kind: 'zoom', ...brushed })}>
          Zoom to the brushed stretch
        </Button>
        <Button size="sm" variant="ghost" disabled={shown.kind === 'all'} onClick={() => show({ kind: 'all' })}>
          Show the whole log
        </Button>
        {series.isFetching && <Spinner label="Loading the chart" />}
      </div>
      {series.isError && <Banner tone="bad" title="The chart could not be loaded">{errorMessage(series.error)}</Banner>}
      {lines.length > 0 && (
        <TimeChart
          title={`Chart of ${lines.map((l) => l.label).join(', ')} over time`}
          lines={lines}
          domain={domain}
          xLabel="Time from the start of the log"
          marks={marksOf(report)}
          cursor={cursor}
          onCursor={setCursor}
          onBrush={onBrush}
        />
      )}
      <p className="text-sm text-ink-600">
        Drag the handles under the chart (or focus one and use the arrow keys) to pick a stretch; zooming reloads it at full
        detail (at most 2000 points a channel). Shaded: full-throttle pulls. Dashed red lines: knock retard events.
      </p>
    </div>
  );
}

/**
 * The tuner's chart of a log: over time with a cursor readout, overlaid on another log of the job (aligned on a pull
 * or on time), or one channel against another coloured by a third.
 */
export function LogChart({ log, report, others }: { log: Datalog; report: DatalogReport; others: Datalog[] }) {
  const available = useMemo<ChannelChoice[]>(
    () =>
      (Object.keys(report.channels) as CanonicalChannel[])
        .filter((c) => c !== 'time')
        .map((channel) => ({ channel, label: CHANNEL_INFO[channel].label, unit: CHANNEL_INFO[channel].unit })),
    [report],
  );
  const [mode, setMode] = useState<Mode>('time');
  const [shown, setShown] = useState<Shown>({ kind: 'all' });
  const [brushed, setBrushed] = useState<Stretch | null>(null);
  const [picked, setPicked] = useState<CanonicalChannel[]>(() => DEFAULT_CHANNELS.filter((c) => available.some((a) => a.channel === c)));
  const toggle = (channel: CanonicalChannel) =>
    setPicked((current) => (current.includes(channel) ? current.filter((c) => c !== channel) : current.length >= MAX_CHANNELS ? current : [...current, channel]));

  return (
    <div className="flex min-w-0 flex-col gap-4">
      <ModeSwitch mode={mode} onChange={setMode} />
      {mode !== 'scatter' && <ChannelPicker available={available} picked={picked} onToggle={toggle} />}
      {mode !== 'scatter' && picked.length === 0 && <p className="text-sm text-ink-600">Pick at least one channel.</p>}
      {mode === 'time' && picked.length > 0 && (
        <TimeView datalogId={log.id} report={report} picked={picked} shown={shown} onShow={setShown} brushed={brushed} onBrush={setBrushed} />
      )}
      {mode === 'overlay' && picked.length > 0 && <LogOverlay log={log} report={report} others={others} picked={picked} />}
      {mode === 'scatter' && <LogScatter datalogId={log.id} report={report} available={available} stretch={brushed ?? windowOf(shown, report)} />}
    </div>
  );
}

import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import type { Datalog, SeriesChannel } from '@revloop/contract';
import type { CanonicalChannel, DatalogReport } from '@revloop/domain/datalog';
import { Banner } from '../../../components/ui/banner';
import { Select } from '../../../components/ui/select';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { getDatalogQueryOptions, revisionLabel } from '../api/get-datalog';
import { useDatalogSeries } from '../api/get-datalog-series';
import type { ChartLine } from '../chart/lines';
import { marksOf, pullLabel } from '../chart/marks';
import { lineColour } from '../chart/palette';
import { pullAlignment } from '../chart/time';
import { TimeChart } from './time-chart';

type Align = 'pull' | 'time';
/** Seconds shown before and after the aligned pulls. */
const PAD_S = 5;
const POINTS = 1000;

function toLines(channels: SeriesChannel[], picked: CanonicalChannel[], source: string, shiftS: number, dashed: boolean): ChartLine[] {
  return channels.map((c) => ({
    key: `${dashed ? 'other' : 'base'}:${c.channel}`,
    channel: c.channel,
    label: c.label,
    unit: c.unit,
    colour: lineColour(picked.indexOf(c.channel)),
    source,
    dashed,
    t: shiftS === 0 ? c.t : c.t.map((t) => Math.round((t - shiftS) * 1000) / 1000),
    v: c.v,
  }));
}

/** Two logs of one job on one chart, lined up on the start of a full-throttle pull or on time from their start. */
export function LogOverlay({ log, report, others, picked }: { log: Datalog; report: DatalogReport; others: Datalog[]; picked: CanonicalChannel[] }) {
  const [chosenId, setOtherId] = useState<string | null>(null);
  // The job's log list may arrive after this view opens: until a log is chosen, the newest other one is shown.
  const otherId = chosenId ?? others[0]?.id ?? null;
  const [align, setAlign] = useState<Align>('pull');
  const [basePull, setBasePull] = useState(0);
  const [otherPull, setOtherPull] = useState(0);
  const [cursor, setCursor] = useState(0);
  const other = useQuery({ ...getDatalogQueryOptions(otherId ?? ''), enabled: otherId !== null });
  const otherLog = other.data?.data;
  const otherReport = otherLog?.report ?? null;

  const basePulls = report.wot.pulls;
  const otherPulls = otherReport?.wot.pulls ?? [];
  const pullA = basePulls[basePull];
  const pullB = otherPulls[otherPull];
  const byPull = align === 'pull' && pullA !== undefined && pullB !== undefined;
  const alignment = byPull ? pullAlignment(pullA, pullB, PAD_S) : null;

  const baseSeries = useDatalogSeries(log.id, { channels: picked, from: alignment?.base.from, to: alignment?.base.to, points: POINTS });
  const otherSeries = useDatalogSeries(otherReport ? otherId : null, { channels: picked, from: alignment?.other.from, to: alignment?.other.to, points: POINTS });

  const baseSource = `This log, ${revisionLabel(log.round)}`;
  const otherSource = otherLog ? `${otherLog.originalName}, ${revisionLabel(otherLog.round)}` : 'Other log';
  const baseShift = alignment?.base.shiftS ?? 0;
  const otherShift = alignment?.other.shiftS ?? 0;
  const lines = useMemo(
    () => [
      ...toLines(baseSeries.data?.data.channels ?? [], picked, baseSource, baseShift, false),
      ...toLines(otherSeries.data?.data.channels ?? [], picked, otherSource, otherShift, true),
    ],
    [baseSeries.data, otherSeries.data, picked, baseSource, otherSource, baseShift, otherShift],
  );

  if (others.length === 0) return <p className="text-sm text-ink-600">This job has no other checked log to overlay yet.</p>;

  const domain: [number, number] = alignment
    ? [alignment.axis.from, alignment.axis.to]
    : [0, Math.max(report.durationS, otherReport?.durationS ?? 0)];
  const baseMarks = marksOf(report, baseShift);
  const otherMarks = otherReport ? marksOf(otherReport, otherShift, true, 'other log: ') : null;
  const marks = { pulls: byPull ? [{ startS: 0, endS: pullA.endS - pullA.startS, label: 'Pull, this log' }] : baseMarks.pulls, knock: [...baseMarks.knock, ...(otherMarks?.knock ?? [])] };
  const failed = baseSeries.error ?? otherSeries.error ?? other.error;

  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
          Other log of this job
          <Select
            value={otherId ?? ''}
            onChange={(e) => {
              setOtherId(e.target.value || null);
              setOtherPull(0);
            }}
            options={others.map((o) => ({ value: o.id, label: `${o.originalName} — ${revisionLabel(o.round)}, ${formatDateTime(o.createdAt)}` }))}
          />
        </label>
        <fieldset>
          <legend className="mb-1 text-sm font-medium text-ink-800">Line up on</legend>
          <div className="flex flex-col gap-1 text-sm text-ink-700">
            <label className="inline-flex items-center gap-1.5">
              <input type="radio" name="overlay-align" checked={align === 'pull'} onChange={() => setAlign('pull')} />
              The start of a full-throttle pull
            </label>
            <label className="inline-flex items-center gap-1.5">
              <input type="radio" name="overlay-align" checked={align === 'time'} onChange={() => setAlign('time')} />
              Time from the start of each log
            </label>
          </div>
        </fieldset>
        <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
          Pull in this log
          <Select
            value={String(basePull)}
            disabled={align !== 'pull' || basePulls.length === 0}
            onChange={(e) => setBasePull(Number(e.target.value))}
            options={basePulls.length === 0 ? [{ value: '0', label: 'No full-throttle pull' }] : basePulls.map((p, i) => ({ value: String(i), label: pullLabel(p, i) }))}
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
          Pull in the other log
          <Select
            value={String(otherPull)}
            disabled={align !== 'pull' || otherPulls.length === 0}
            onChange={(e) => setOtherPull(Number(e.target.value))}
            options={otherPulls.length === 0 ? [{ value: '0', label: 'No full-throttle pull' }] : otherPulls.map((p, i) => ({ value: String(i), label: pullLabel(p, i) }))}
          />
        </label>
      </div>
      {align === 'pull' && !byPull && otherReport && (
        <Banner tone="warn">{basePulls.length === 0 ? 'This log' : 'The other log'} has no full-throttle pull to line up on, so the logs are lined up on time.</Banner>
      )}
      {(baseSeries.isFetching || otherSeries.isFetching || other.isFetching) && <Spinner label="Loading the overlay" />}
      {failed && <Banner tone="bad" title="The overlay could not be loaded">{errorMessage(failed)}</Banner>}
      {lines.length > 0 && (
        <TimeChart
          title={`Overlay of ${baseSource} (solid) and ${otherSource} (dashed)`}
          lines={lines}
          domain={domain}
          xLabel={byPull ? 'Time from the start of the pull' : 'Time from the start of each log'}
          marks={marks}
          cursor={cursor}
          onCursor={setCursor}
        />
      )}
      <p className="text-sm text-ink-600">
        Solid lines are this log, dashed lines the other; the same channel keeps its colour. The readout's change column is this log
        minus the other.
      </p>
    </div>
  );
}

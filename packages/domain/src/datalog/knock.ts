import { round, type AnalysisContext } from './context';
import type { KnockEvent } from './report';

/** One event per burst: samples with retard > 0, merged across gaps up to knockGapS; reported at the burst's peak. */
export function analyzeKnock(ctx: AnalysisContext): { events: KnockEvent[]; maxRetardDeg: number } {
  const knock = ctx.series.channels.knock_retard;
  if (knock === undefined) return { events: [], maxRetardDeg: 0 };
  const { map } = ctx.series.channels;
  const time = ctx.time;
  const events: KnockEvent[] = [];
  let peak = -1;
  let first = -1;
  let last = -1;
  const close = () => {
    const value = (i: number, values: Float32Array | undefined, digits: number) => {
      const v = values?.[i];
      return v === undefined || !Number.isFinite(v) ? null : round(v, digits);
    };
    events.push({
      timeS: round(time[peak] as number),
      rpm: value(peak, ctx.rpm, 0),
      map: value(peak, map, 1),
      gear: ctx.gearAt(peak),
      retardDeg: round(knock[peak] as number),
      durationS: round((time[last] as number) - (time[first] as number)),
    });
  };
  for (let i = 0; i < ctx.rows; i++) {
    const retard = knock[i] as number;
    if (!(retard > 0)) continue;
    if (first >= 0 && (time[i] as number) - (time[last] as number) > ctx.settings.knockGapS) {
      close();
      first = -1;
    }
    if (first < 0) {
      first = i;
      peak = i;
    }
    if (retard > (knock[peak] as number)) peak = i;
    last = i;
  }
  if (first >= 0) close();
  return { events, maxRetardDeg: events.reduce((max, e) => Math.max(max, e.retardDeg), 0) };
}

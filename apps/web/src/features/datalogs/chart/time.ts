/**
 * Seconds as a clock reading, m:ss (h:mm:ss past an hour), with `decimals` tenths or hundredths of a second;
 * negative times (before an aligned pull starts) get a minus sign.
 */
export function formatClock(seconds: number, decimals = 0): string {
  if (!Number.isFinite(seconds)) return '—';
  const factor = 10 ** decimals;
  const total = Math.round(Math.abs(seconds) * factor) / factor;
  const sign = seconds < 0 && total > 0 ? '−' : '';
  const hours = Math.floor(total / 3600);
  const minutes = Math.floor((total % 3600) / 60);
  const secs = (total % 60).toFixed(decimals).padStart(decimals > 0 ? 3 + decimals : 2, '0');
  return hours > 0 ? `${sign}${hours}:${String(minutes).padStart(2, '0')}:${secs}` : `${sign}${minutes}:${secs}`;
}

/** First index with t[i] ≥ at (t ascending). */
function lowerBound(t: readonly number[], at: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((t[mid] as number) < at) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * A series' value at a moment, interpolated linearly between its neighbouring samples; null outside the series.
 * Each channel is downsampled on its own, so channels rarely share time stamps: this gives every one a value.
 */
export function valueAt(t: readonly number[], v: readonly number[], at: number): number | null {
  if (t.length === 0 || at < (t[0] as number) || at > (t[t.length - 1] as number)) return null;
  const i = lowerBound(t, at);
  const t1 = t[i] as number;
  if (t1 === at || i === 0) return v[i] ?? null;
  const t0 = t[i - 1] as number;
  const v0 = v[i - 1] as number;
  const v1 = v[i] as number;
  return v0 + ((v1 - v0) * (at - t0)) / (t1 - t0);
}

export interface Span {
  startS: number;
  endS: number;
}

/**
 * Two logs lined up on the start of one pull each: where to read each log (absolute seconds, never before 0) and
 * the shared axis in seconds from the pull's start, long enough for the longer pull plus `padS` either side.
 */
export function pullAlignment(base: Span, other: Span, padS: number) {
  const length = Math.max(base.endS - base.startS, other.endS - other.startS);
  const window = (pull: Span) => ({ from: Math.max(0, pull.startS - padS), to: pull.startS + length + padS, shiftS: pull.startS });
  return { axis: { from: -padS, to: length + padS }, base: window(base), other: window(other) };
}

/** Equal-width bins over [min, max] for colouring points by a third channel; `n` bins, `n + 1` edges. */
export function binEdges(values: readonly number[], n: number): number[] {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (!Number.isFinite(min)) return [];
  if (max === min) return [min, max];
  return Array.from({ length: n + 1 }, (_, i) => min + ((max - min) * i) / n);
}

/** The bin a value falls in; the top edge belongs to the last bin. */
export function binOf(value: number, edges: readonly number[]): number {
  const last = Math.max(0, edges.length - 2);
  for (let i = 0; i < last; i++) if (value < (edges[i + 1] as number)) return i;
  return last;
}

const TICK_STEPS_S = [0.5, 1, 2, 5, 10, 15, 30, 60, 120, 300, 600, 900, 1800, 3600];

/** Time-axis ticks on round clock steps (1 s, 5 s, 30 s, 1 min, 5 min …), about `target` of them over the span. */
export function timeTicks(from: number, to: number, target = 8): number[] {
  if (!(to > from)) return [from];
  const step = TICK_STEPS_S.find((s) => (to - from) / s <= target) ?? TICK_STEPS_S[TICK_STEPS_S.length - 1]!;
  const ticks: number[] = [];
  for (let t = Math.ceil(from / step) * step; t <= to + 1e-9; t += step) ticks.push(Math.round(t * 1000) / 1000);
  return ticks;
}

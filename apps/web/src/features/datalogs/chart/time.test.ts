import { describe, expect, it } from 'vitest';
import { binEdges, binOf, formatClock, pullAlignment, timeTicks, valueAt } from './time';

describe('formatClock', () => {
  it('writes seconds as m:ss, the minutes and seconds of an ISO 8601 time of day', () => {
    // [STD] ISO 8601-1:2019 extended time format hh:mm:ss; oracle: the platform's Date.toISOString.
    for (const s of [0, 5, 59, 60, 61, 320, 599, 3599]) {
      expect(formatClock(s)).toBe(new Date(s * 1000).toISOString().slice(14, 19).replace(/^0/, ''));
    }
    expect(formatClock(3723)).toBe('1:02:03');
    expect(formatClock(320.44, 1)).toBe('5:20.4');
    expect(formatClock(59.96, 1)).toBe('1:00.0');
  });

  it('signs times before an aligned pull starts', () => {
    expect(formatClock(-5)).toBe('−0:05');
    expect(formatClock(-0.01)).toBe('0:00');
  });
});

describe('valueAt', () => {
  const t = [0, 1, 3];
  const v = [10, 20, 0];
  it('interpolates linearly between neighbouring samples', () => {
    // [CALC] halfway from (1, 20) to (3, 0) is 10; a quarter of the way from (0, 10) to (1, 20) is 12.5.
    expect(valueAt(t, v, 2)).toBe(10);
    expect(valueAt(t, v, 0.25)).toBe(12.5);
    expect(valueAt(t, v, 1)).toBe(20);
    expect(valueAt(t, v, 0)).toBe(10);
    expect(valueAt(t, v, 3)).toBe(0);
  });
  it('is blank outside the series', () => {
    expect(valueAt(t, v, -0.1)).toBeNull();
    expect(valueAt(t, v, 3.1)).toBeNull();
    expect(valueAt([], [], 0)).toBeNull();
  });
});

describe('pullAlignment', () => {
  it('reads both logs from their own pull start over the longer pull, padded', () => {
    // [CALC] pulls of 6 s and 8 s: both shown over 8 s plus 5 s either side, each from its own start.
    const a = pullAlignment({ startS: 400, endS: 406 }, { startS: 390, endS: 398 }, 5);
    expect(a.axis).toEqual({ from: -5, to: 13 });
    expect(a.base).toEqual({ from: 395, to: 413, shiftS: 400 });
    expect(a.other).toEqual({ from: 385, to: 403, shiftS: 390 });
  });
  it('never reads before the start of a log', () => {
    expect(pullAlignment({ startS: 2, endS: 8 }, { startS: 10, endS: 12 }, 5).base.from).toBe(0);
  });
});

describe('binEdges and binOf', () => {
  it('splits the range into equal bins, the top edge in the last bin', () => {
    // [CALC] 0–70 in 7 bins of 10.
    const edges = binEdges([0, 35, 70], 7);
    expect(edges).toEqual([0, 10, 20, 30, 40, 50, 60, 70]);
    expect(binOf(0, edges)).toBe(0);
    expect(binOf(9.99, edges)).toBe(0);
    expect(binOf(10, edges)).toBe(1);
    expect(binOf(70, edges)).toBe(6);
  });
  it('keeps a constant channel in one bin and an empty one in none', () => {
    expect(binEdges([4, 4], 7)).toEqual([4, 4]);
    expect(binOf(4, [4, 4])).toBe(0);
    expect(binEdges([], 7)).toEqual([]);
  });
});

describe('timeTicks', () => {
  it('puts ticks on round clock steps', () => {
    // [CALC] 0–418 s in at most 8 ticks: 60 s steps (30 s would make 14).
    expect(timeTicks(0, 418)).toEqual([0, 60, 120, 180, 240, 300, 360]);
    // An aligned overlay from 5 s before the pull to 10 s after it: 2 s steps, through 0.
    expect(timeTicks(-5, 10)).toEqual([-4, -2, 0, 2, 4, 6, 8, 10]);
    expect(timeTicks(3, 3)).toEqual([3]);
  });
});

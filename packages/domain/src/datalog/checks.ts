import { CHANNEL_INFO } from './channels';
import { round, type AnalysisContext } from './context';
import type { LogRequest } from './log-request';
import type { DatalogCheck, FuelTrimGrid, SensorIssue, WotPull } from './report';

const ordinal = (n: number) =>
  `${n}${n % 10 === 1 && n % 100 !== 11 ? 'st' : n % 10 === 2 && n % 100 !== 12 ? 'nd' : n % 10 === 3 && n % 100 !== 13 ? 'rd' : 'th'}`;
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const listWords = (words: string[]) =>
  words.length <= 1 ? words.join('') : `${words.slice(0, -1).join(', ')} and ${words.at(-1)}`;

export function requiredChannelsCheck(ctx: AnalysisContext, request: LogRequest): DatalogCheck {
  const present = ctx.series.mapping.channels;
  const missing = request.channels.filter((c) => present[c] === undefined);
  if (missing.length === 0) {
    return {
      id: 'required_channels',
      status: 'pass',
      message: `All ${request.channels.length} requested channels are in the log.`,
    };
  }
  return {
    id: 'required_channels',
    status: 'fail',
    message: `The log is missing ${listWords(missing.map((c) => CHANNEL_INFO[c].label))}. Add ${missing.length === 1 ? 'it' : 'them'} to the logger and record the drive again.`,
  };
}

export function engineWarmCheck(
  ctx: AnalysisContext,
  pulls: [number, number][],
  request: LogRequest,
): DatalogCheck {
  const coolant = ctx.series.channels.coolant_temp;
  const warm = ctx.settings.warmCoolantC;
  const id = 'engine_warm';
  if (coolant === undefined)
    return {
      id,
      status: 'warn',
      message: 'Coolant temperature was not logged, so the warm-up cannot be checked.',
    };
  const firstFinite = coolant.findIndex((v) => Number.isFinite(v));
  if (firstFinite < 0)
    return {
      id,
      status: 'warn',
      message: 'The coolant temperature column is empty, so the warm-up cannot be checked.',
    };
  const startC = coolant[firstFinite] as number;
  if (startC >= warm) {
    return {
      id,
      status: 'pass',
      message: `The engine was already warm (${round(startC, 0)} °C) when the log started.`,
    };
  }
  const firstWot = pulls[0]?.[0];
  const warmAt = coolant.findIndex((v) => v >= warm);
  const wotTime = firstWot === undefined ? undefined : (ctx.time[firstWot] as number);
  if (warmAt < 0 || (firstWot !== undefined && warmAt > firstWot)) {
    const atWot = firstWot === undefined ? undefined : coolant[firstWot];
    return {
      id,
      status: 'fail',
      message:
        atWot === undefined
          ? `The engine never reached ${warm} °C during the log. Drive about ${request.warmupMinutes} minutes until it is fully warm before logging.`
          : `The engine was still cold (${round(atWot, 0)} °C) at the first full-throttle pull. Drive about ${request.warmupMinutes} minutes until it reaches ${warm} °C before pressing the pedal to the floor.`,
    };
  }
  let engineStart = 0;
  while (engineStart < ctx.rows && !ctx.running(engineStart)) engineStart++;
  const warmMinutes = ((ctx.time[warmAt] as number) - (ctx.time[engineStart] as number)) / 60;
  const drivenMinutes =
    wotTime === undefined ? undefined : (wotTime - (ctx.time[engineStart] as number)) / 60;
  if (drivenMinutes !== undefined && drivenMinutes < request.warmupMinutes) {
    return {
      id,
      status: 'warn',
      message: `The engine reached ${warm} °C, but full throttle came after only ${round(drivenMinutes, 1)} minutes of driving; about ${request.warmupMinutes} were asked for.`,
    };
  }
  return {
    id,
    status: 'pass',
    message: `The engine reached ${warm} °C after ${round(warmMinutes, 1)} minutes and was warm before full throttle.`,
  };
}

export function fullThrottleCheck(
  ctx: AnalysisContext,
  pulls: WotPull[],
  partials: { maxPct: number }[],
): DatalogCheck {
  const id = 'full_throttle';
  const drive = ctx.drive;
  if (drive === undefined) {
    return {
      id,
      status: 'fail',
      message:
        'Neither accelerator pedal nor throttle position was logged, so full throttle cannot be found.',
    };
  }
  const what = drive.channel === 'pedal_pos' ? 'pedal' : 'throttle';
  const threshold = ctx.settings.wotThresholdPct;
  if (pulls.length > 0) {
    const max = Math.max(...pulls.map((p) => p.maxPedalPct));
    return {
      id,
      status: 'pass',
      message: `Found ${plural(pulls.length, 'full-throttle pull')}, with the ${what} at up to ${round(max, 0)} %.`,
    };
  }
  if (partials.length > 0) {
    const max = Math.max(...partials.map((p) => p.maxPct));
    return {
      id,
      status: 'fail',
      message: `The ${what} only reached ${round(max, 0)} % during the pull. Press the pedal all the way to the floor (at least ${threshold} %) for the whole gear; a partly pressed pedal gives no usable full-throttle data.`,
    };
  }
  return {
    id,
    status: 'fail',
    message:
      'No full-throttle pull was found. Press the pedal to the floor through a gear while logging.',
  };
}

export function wotGearsCheck(
  ctx: AnalysisContext,
  pulls: WotPull[],
  request: LogRequest,
  ratioGears: number | null,
): DatalogCheck {
  const id = 'wot_gears';
  const asked = plural(request.wotGears, 'gear');
  const wasAsked = `${asked} ${request.wotGears === 1 ? 'was' : 'were'} asked for`;
  if (pulls.length === 0)
    return { id, status: 'fail', message: `There is no full-throttle pull, and ${wasAsked}.` };
  if (!ctx.gearKnown) {
    if (ratioGears === null || ratioGears === 0) {
      return {
        id,
        status: 'warn',
        message:
          'The gear could not be told: no gear channel, no gear ratios and no steady road speed during the pulls, so the number of full-throttle gears is unknown.',
      };
    }
    const held = `${plural(ratioGears, 'gear')} held, told from the steps of engine speed over road speed (give the vehicle's gear ratios to name them)`;
    return ratioGears >= request.wotGears
      ? { id, status: 'pass', message: `Full throttle: ${held}; ${wasAsked}.` }
      : { id, status: 'warn', message: `Full throttle: ${held}, but ${wasAsked}.` };
  }
  const gears = [...new Set(pulls.flatMap((p) => p.gears))].sort((a, b) => a - b);
  const held =
    gears.length === 0
      ? 'no gear that could be told'
      : `${plural(gears.length, 'gear')} (${listWords(gears.map(ordinal))})`;
  if (gears.length >= request.wotGears) {
    return { id, status: 'pass', message: `Full throttle was held in ${held}; ${wasAsked}.` };
  }
  return { id, status: 'warn', message: `Full throttle was held in ${held}, but ${wasAsked}.` };
}

/** Both banks logged: a cell where they disagree by more than the shop's threshold is one bank's problem, hidden by the average. */
export function bankSplitCheck(ctx: AnalysisContext, grid: FuelTrimGrid): DatalogCheck | null {
  const split = grid.cells.filter((c) => c.bankSplitPct !== undefined);
  if (split.length === 0) return null;
  const limit = ctx.settings.bankSplitPct;
  const over = split.filter((c) => Math.abs(c.bankSplitPct as number) > limit);
  const id = 'bank_split';
  if (over.length === 0)
    return {
      id,
      status: 'pass',
      message: `Bank 1 and bank 2 trims agree within ${limit} % in every cell.`,
    };
  const worst = over.reduce((a, b) =>
    Math.abs(b.bankSplitPct as number) > Math.abs(a.bankSplitPct as number) ? b : a,
  );
  const lean = (worst.bankSplitPct as number) > 0 ? 1 : 2;
  return {
    id,
    status: 'warn',
    message: `Bank 1 and bank 2 trims differ by more than ${limit} % in ${plural(over.length, 'cell')} (up to ${round(Math.abs(worst.bankSplitPct as number), 1)} %, bank ${lean} adding more fuel): look for a leak, an injector or a sensor on one bank before changing the fuel table for both.`,
  };
}

export function sensorSanityCheck(issues: SensorIssue[]): DatalogCheck {
  const id = 'sensor_sanity';
  if (issues.length === 0)
    return { id, status: 'pass', message: 'Every sensor read plausibly through the log.' };
  const serious = issues.filter((i) => i.issue !== 'dropout');
  const names = [...new Set(issues.map((i) => CHANNEL_INFO[i.channel].label))];
  return {
    id,
    status: serious.length > 0 ? 'fail' : 'warn',
    message: `${serious.length > 0 ? 'Some sensors look faulty' : 'Some readings dropped out'}: ${listWords(names)}. See the sensor list for details.`,
  };
}

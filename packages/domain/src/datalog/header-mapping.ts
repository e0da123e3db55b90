import { DomainError } from '../errors';
import {
  CANONICAL_CHANNELS,
  CHANNEL_ALIASES,
  CHANNEL_SYNONYMS,
  isCanonicalChannel,
  type CanonicalChannel,
} from './channels';
import { CHANNEL_INFO } from './channels';
import { isKnownUnitText, isUnitOf, lambdaUnitOf, UNIT_CHOICES, type LambdaUnit } from './units';

export interface MappedColumn {
  /** Zero-based column index in the log. */
  column: number;
  header: string;
  /** Unit text read from the header ("°F", "psi") or stated by the user, or null when neither names one. */
  unitText: string | null;
  /** The user stated the unit (CLI `--unit`, the mapping dialog), so the header's own unit word was overruled. */
  unitStated: boolean;
  /** Header says gauge pressure ("Boost …"): one atmosphere is added to make it absolute. */
  gauge: boolean;
  /** For lambda channels: the header says AFR or λ; null leaves it to the values. */
  lambdaUnit: LambdaUnit | null;
}

export interface HeaderMapping {
  channels: Partial<Record<CanonicalChannel, MappedColumn>>;
  /** Headers no channel took, for the UI to offer. */
  unmapped: string[];
  /** Stable id of the header list, so a shop can remember a confirmed mapping for this logger layout. */
  signature: string;
}

interface SplitHeader {
  header: string;
  /** Candidate names to match, best first: the name without a bracketed unit, then without a trailing unit word. */
  names: { name: string; unitText: string | null }[];
}

/** "stftB1Pct" → "stft B1 Pct": a capital after a lowercase letter, or a capitalised word after a digit, starts a word. */
const splitCamel = (text: string): string =>
  text.replace(/([a-z])([A-Z])/g, '$1 $2').replace(/(\d)([A-Z][a-z])/g, '$1 $2');

/** Lowercase words of a header name: punctuation to spaces, camelCase, letters and digits split ("stftB1" → "stft b 1"). */
export function normaliseHeaderName(name: string): string {
  return splitCamel(name)
    .toLowerCase()
    .replace(/λ/g, ' lambda ')
    .replace(/[^a-z0-9%]+/g, ' ')
    .replace(/%/g, ' ')
    .replace(/([a-z])(\d)/g, '$1 $2')
    .replace(/(\d)([a-z])/g, '$1 $2')
    .trim()
    .replace(/\s+/g, ' ');
}

function splitHeader(raw: string): SplitHeader {
  const header = raw
    .trim()
    .replace(/^"(.*)"$/s, '$1')
    .trim();
  const bracketed = /^(.*?)\s*[([]([^)\]]*)[)\]]\s*$/.exec(header);
  const base = bracketed?.[1] ?? header;
  const bracketUnit = bracketed?.[2]?.trim() || null;
  const names: SplitHeader['names'] = [];
  const percentSuffix = /%\s*$/.test(base) ? '%' : null;
  names.push({ name: normaliseHeaderName(base), unitText: bracketUnit ?? percentSuffix });
  const words = base.trim().split(/\s+/);
  const last = words.at(-1);
  // A spaced single letter ("…position F", "…sensor C") is a name's last word more often than a unit.
  if (words.length > 1 && last !== undefined && last.length > 1 && isKnownUnitText(last)) {
    names.push({
      name: normaliseHeaderName(words.slice(0, -1).join(' ')),
      unitText: bracketUnit ?? last,
    });
  }
  // A header that is only a unit word ("MPH", "AFR") names both the channel and its unit.
  if (words.length === 1 && last !== undefined && isKnownUnitText(last) && bracketUnit === null) {
    names[0] = { name: normaliseHeaderName(base), unitText: last };
  }
  const suffixed = bracketUnit === null ? unitSuffix(base) : null;
  if (suffixed !== null) names.push(suffixed);
  return { header, names };
}

/**
 * A unit written as the last part of a script-style name: snake_case (`coolant_c`, `airflow_lbmin`), camelCase
 * (`elapsedMs`) or dotted (`rpm.min`). Only these separators count, so a spaced "Pedal position F" keeps its F.
 */
function unitSuffix(base: string): SplitHeader['names'][number] | null {
  const text = base.trim();
  if (!/[_.]|[a-z][A-Z]/.test(text) || /\s/.test(text)) return null;
  const tokens = splitCamel(text)
    .split(/[\s_.]+/)
    .filter((t) => t !== '');
  for (const take of [2, 1]) {
    if (tokens.length <= take) continue;
    const tail = tokens.slice(-take);
    const candidates = take === 2 ? [tail.join(''), tail.join('/')] : [tail.join('')];
    const unitText = candidates.find(isKnownUnitText);
    if (unitText !== undefined) {
      return { name: normaliseHeaderName(tokens.slice(0, -take).join(' ')), unitText };
    }
  }
  return null;
}

function lambdaUnitFromHeader(name: string, unitText: string | null): LambdaUnit | null {
  const fromUnit = lambdaUnitOf(unitText);
  if (fromUnit !== null) return fromUnit;
  if (/\b(?:afr|air fuel ratio|a f ratio)\b/.test(name)) return 'afr';
  if (/\b(?:lambda|equivalence ratio|eq ratio)\b/.test(name)) return 'lambda';
  return null;
}

function toMapped(
  split: SplitHeader,
  column: number,
  which: number,
  forcedAfr: boolean,
): MappedColumn {
  const chosen = split.names[which] ?? split.names[0] ?? { name: '', unitText: null };
  const unitText = chosen.unitText;
  const gauge = /\bboost\b/.test(chosen.name) || /\bgauge\b/i.test(split.header);
  return {
    column,
    header: split.header,
    unitText,
    unitStated: false,
    gauge,
    lambdaUnit: forcedAfr ? 'afr' : lambdaUnitFromHeader(chosen.name, unitText),
  };
}

// FNV-1a 64-bit over UTF-16 code units: small, stable across runtimes, no I/O or crypto needed.
function fnv1a64(text: string): string {
  let hash = 0xcbf29ce484222325n;
  for (let i = 0; i < text.length; i++) {
    hash ^= BigInt(text.charCodeAt(i));
    hash = (hash * 0x100000001b3n) & 0xffffffffffffffffn;
  }
  return hash.toString(16).padStart(16, '0');
}

/** "hdr1-<16 hex>": same for the same columns in the same order, whatever the case, quoting or spacing. */
export function headerSignature(headers: readonly string[]): string {
  const normalised = headers.map((h) =>
    h
      .trim()
      .replace(/^"(.*)"$/s, '$1')
      .trim()
      .toLowerCase()
      .replace(/\s+/g, ' '),
  );
  return `hdr1-${fnv1a64(normalised.join('\u001f'))}`;
}

function resolveOverrideChannel(key: string): CanonicalChannel {
  const name = key.trim().toLowerCase();
  const channel = CHANNEL_ALIASES[name] ?? (isCanonicalChannel(name) ? name : undefined);
  if (channel === undefined) {
    throw new DomainError(
      'validation',
      `Unknown channel "${key}". Channels are: ${[...CANONICAL_CHANNELS, ...Object.keys(CHANNEL_ALIASES)].join(', ')}.`,
    );
  }
  return channel;
}

/** A unit the user stated for a channel's column replaces whatever the header said. */
function stateUnit(key: string, text: string, mapped: MappedColumn | undefined): MappedColumn {
  const channel = resolveOverrideChannel(key);
  const { quantity, label } = CHANNEL_INFO[channel];
  if (mapped === undefined) {
    throw new DomainError(
      'validation',
      `A unit was given for ${label}, but no column of this log feeds it. Map a column to ${channel} first.`,
    );
  }
  if (!isUnitOf(quantity, text)) {
    const known = UNIT_CHOICES[quantity].map((u) => u.value).join(', ');
    throw new DomainError(
      'validation',
      `"${text}" is not a unit of ${label}.${known === '' ? '' : ` Use one of: ${known}.`}`,
    );
  }
  const lambdaUnit = quantity === 'lambda' ? lambdaUnitOf(text) : mapped.lambdaUnit;
  return { ...mapped, unitText: text.trim(), unitStated: true, lambdaUnit };
}

/**
 * Proposes which column feeds each canonical channel, by header synonyms; `overrides` (channel → header text)
 * win, and an empty header text means "not logged" (a column the synonyms took wrongly). `units` (channel →
 * unit text such as "psia") states a column's unit. The UI shows the result for the tuner to confirm or fix.
 */
export function mapHeaders(
  headers: readonly string[],
  overrides: Readonly<Record<string, string>> = {},
  units: Readonly<Record<string, string>> = {},
): HeaderMapping {
  const splits = headers.map(splitHeader);
  const taken = new Set<number>();
  const channels: Partial<Record<CanonicalChannel, MappedColumn>> = {};
  const notLogged = new Set<CanonicalChannel>();

  for (const [key, wanted] of Object.entries(overrides)) {
    const channel = resolveOverrideChannel(key);
    const target = wanted.trim().toLowerCase();
    if (target === '') {
      notLogged.add(channel);
      continue;
    }
    const column = splits.findIndex((s) => s.header.toLowerCase() === target);
    const split = splits[column];
    if (split === undefined) {
      throw new DomainError(
        'validation',
        `This log has no column "${wanted}" for ${channel}. Its columns are: ${splits.map((s) => s.header).join(', ')}.`,
      );
    }
    // A column named by hand still has its unit read from the header, wherever the header writes it.
    const withUnit = Math.max(
      0,
      split.names.findIndex((n) => n.unitText !== null),
    );
    channels[channel] = toMapped(split, column, withUnit, key.trim().toLowerCase().startsWith('afr_'));
    taken.add(column);
  }

  for (const channel of CANONICAL_CHANNELS) {
    if (channels[channel] !== undefined || notLogged.has(channel)) continue;
    search: for (const pattern of CHANNEL_SYNONYMS[channel]) {
      for (let column = 0; column < splits.length; column++) {
        const split = splits[column];
        if (split === undefined || taken.has(column)) continue;
        const which = split.names.findIndex((n) => pattern.test(n.name));
        if (which >= 0) {
          channels[channel] = toMapped(split, column, which, false);
          taken.add(column);
          break search;
        }
      }
    }
  }

  for (const [key, text] of Object.entries(units)) {
    if (text.trim() === '') continue;
    const channel = resolveOverrideChannel(key);
    channels[channel] = stateUnit(key, text, channels[channel]);
  }

  return {
    channels,
    unmapped: splits.filter((_, i) => !taken.has(i)).map((s) => s.header),
    signature: headerSignature(headers),
  };
}

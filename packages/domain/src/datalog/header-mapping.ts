import { DomainError } from '../errors';
import {
  CANONICAL_CHANNELS,
  CHANNEL_ALIASES,
  CHANNEL_SYNONYMS,
  isCanonicalChannel,
  type CanonicalChannel,
} from './channels';
import { isKnownUnitText, lambdaUnitOf, type LambdaUnit } from './units';

export interface MappedColumn {
  /** Zero-based column index in the log. */
  column: number;
  header: string;
  /** Unit text read from the header ("°F", "psi"), or null when the header names none. */
  unitText: string | null;
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

/** Lowercase words of a header name: punctuation to spaces, letters and digits split ("STFT1" → "stft 1"). */
export function normaliseHeaderName(name: string): string {
  return name
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
  if (words.length > 1 && last !== undefined && isKnownUnitText(last)) {
    names.push({
      name: normaliseHeaderName(words.slice(0, -1).join(' ')),
      unitText: bracketUnit ?? last,
    });
  }
  // A header that is only a unit word ("MPH", "AFR") names both the channel and its unit.
  if (words.length === 1 && last !== undefined && isKnownUnitText(last) && bracketUnit === null) {
    names[0] = { name: normaliseHeaderName(base), unitText: last };
  }
  return { header, names };
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

/**
 * Proposes which column feeds each canonical channel, by header synonyms; `overrides` (channel → header text)
 * win, and an empty header text means "not logged" (a column the synonyms took wrongly). The UI shows the
 * result for the tuner to confirm or fix.
 */
export function mapHeaders(
  headers: readonly string[],
  overrides: Readonly<Record<string, string>> = {},
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
    channels[channel] = toMapped(split, column, 0, key.trim().toLowerCase().startsWith('afr_'));
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

  return {
    channels,
    unmapped: splits.filter((_, i) => !taken.has(i)).map((s) => s.header),
    signature: headerSignature(headers),
  };
}

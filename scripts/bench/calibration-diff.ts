// Times calibration parsing (each format) and diffImages on two 4 MiB images; exits 1 when the diff median
// passes its 1000 ms budget. Run: npx tsx scripts/bench/calibration-diff.ts
import { diffImages, generateCalibrationImage, parseCalibration, reviseImage, toIntelHex, toSrec } from '@revloop/domain/calibration';
import type { MemoryImage } from '@revloop/domain/calibration';

const SIZE = 4 * 1024 * 1024;
const BASE_ADDRESS = 0x8_0000;
const PARSE_RUNS = 5;
const DIFF_RUNS = 9;
const DIFF_BUDGET_MS = 1000;

/** Small deterministic generator so every run benchmarks the same bytes. */
function lcg(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 0x1_0000_0000;
  };
}

/** The revised image plus scattered single-byte changes and a few overwritten blocks. */
function scatterChanges(image: MemoryImage, seed: number, singles: number, blocks: number): MemoryImage {
  const next = lcg(seed);
  const revised = reviseImage(image, { seed, edits: 24 });
  const data = revised.segments[0]!.data;
  for (let i = 0; i < singles; i += 1) {
    const at = Math.floor(next() * data.length);
    data[at] = data[at]! ^ 0x01;
  }
  for (let i = 0; i < blocks; i += 1) {
    const at = Math.floor(next() * (data.length - 512));
    for (let j = 0; j < 512; j += 1) data[at + j] = Math.floor(next() * 256);
  }
  return revised;
}

function time(runs: number, action: () => unknown): { median: number; min: number; max: number } {
  const samples: number[] = [];
  for (let i = 0; i < runs; i += 1) {
    const started = performance.now();
    action();
    samples.push(performance.now() - started);
  }
  samples.sort((x, y) => x - y);
  return { median: samples[Math.floor(samples.length / 2)]!, min: samples[0]!, max: samples.at(-1)! };
}

const a = generateCalibrationImage({ seed: 20240601, size: SIZE, baseAddress: BASE_ADDRESS });
const b = scatterChanges(a, 77, 300, 6);
const encoder = new TextEncoder();
const inputs = [
  { label: 'parse raw', name: 'read.bin', bytes: a.segments[0]!.data },
  { label: 'parse Intel HEX', name: 'read.hex', bytes: encoder.encode(toIntelHex(a)) },
  { label: 'parse S-record', name: 'read.s19', bytes: encoder.encode(toSrec(a)) },
];

const rows: { operation: string; input: string; runs: number; median: number; min: number; max: number }[] = [];
for (const input of inputs) {
  rows.push({ operation: input.label, input: `${(input.bytes.length / 1024 / 1024).toFixed(1)} MiB file`, runs: PARSE_RUNS, ...time(PARSE_RUNS, () => parseCalibration(input.bytes, input.name)) });
}
const diff = diffImages(a, b);
const diffTiming = time(DIFF_RUNS, () => diffImages(a, b));
rows.push({ operation: 'diffImages', input: '2 × 4 MiB images', runs: DIFF_RUNS, ...diffTiming });

const pad = (text: string, width: number) => text.padEnd(width);
const ms = (value: number) => value.toFixed(1).padStart(9);
console.log(`${pad('operation', 18)}${pad('input', 20)}runs   median ms      min ms      max ms`);
for (const row of rows) console.log(`${pad(row.operation, 18)}${pad(row.input, 20)}${String(row.runs).padStart(4)}${ms(row.median)}   ${ms(row.min)}   ${ms(row.max)}`);
console.log(`\ndiff: ${diff.changedBytes} changed bytes of ${diff.comparedBytes} in ${diff.ranges.length} ranges (merge gap 16)`);

if (diffTiming.median > DIFF_BUDGET_MS) {
  console.error(`diffImages median ${diffTiming.median.toFixed(1)} ms exceeds the ${DIFF_BUDGET_MS} ms budget`);
  process.exit(1);
}

import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_VEHICLE, generateAwkwardLog, generateLog } from '@revloop/domain/datalog/testing';

const run = promisify(execFile);
const root = resolve(import.meta.dirname, '../../../..');
const cli = join(root, 'apps/api/src/cli/analyze.ts');
const dir = mkdtempSync(join(tmpdir(), 'analyze-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const file = (name: string, content: string | Uint8Array) => {
  const path = join(dir, name);
  writeFileSync(path, content);
  return path;
};

async function analyze(
  ...args: string[]
): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run(process.execPath, ['--import', 'tsx', cli, ...args], {
      cwd: root,
      maxBuffer: 1 << 26,
    });
    return { code: 0, stdout, stderr };
  } catch (error) {
    const e = error as { code: number; stdout: string; stderr: string };
    return { code: e.code, stdout: e.stdout, stderr: e.stderr };
  }
}

describe('analyze CLI', () => {
  const log = file('log.csv', generateLog({ units: 'imperial', pulls: [{ gears: [2, 3] }] }).text);

  it('prints the report JSON through `npm run -s analyze` with --fuel, --map and --vehicle', async () => {
    const vehicle = file('vehicle.json', JSON.stringify(DEMO_VEHICLE));
    const { stdout } = await run(
      'npm',
      [
        'run',
        '-s',
        'analyze',
        '--',
        log,
        '--fuel',
        'e10',
        '--vehicle',
        vehicle,
        '--map',
        'afr_meas=AFR',
      ],
      { cwd: root, maxBuffer: 1 << 26 },
    );
    const report = JSON.parse(stdout);
    expect(report.fuel.label).toBe('E10');
    expect(report.channels.lambda_meas).toBe('AFR');
    expect(report.wot.pulls[0].gears).toEqual([2, 3]);
    expect(report.checks.map((c: { id: string }) => c.id)).toEqual([
      'required_channels',
      'engine_warm',
      'full_throttle',
      'wot_gears',
      'sensor_sanity',
      // The log's AFR is petrol-scaled (λ × 14.7) but E10 was stated: 4 % off at cruise [CALC].
      'afr_scale',
    ]);
    expect(report.afrScale.correctionsWithheld).toBe(true);
  });

  it('takes --unit, --afr-scale and --trim-axis', async () => {
    const awkward = file('petrol-scaled.csv', generateAwkwardLog('e85_afr_petrol_scale').bytes);
    const { code, stdout } = await analyze(
      awkward,
      '--fuel',
      'e85',
      '--afr-scale',
      'gasoline',
      '--unit',
      'map=kPa abs',
      '--trim-axis',
      'maf',
    );
    expect(code).toBe(0);
    const report = JSON.parse(stdout);
    expect(report.afrScale).toMatchObject({ scale: 'gasoline', stated: true, correctionsWithheld: false });
    expect(report.units.map).toBe('kPa (stated)');
    expect(report.fuelTrim.axis).toBe('maf');
  });

  it.each([
    [['--afr-scale', 'petrol'], /--afr-scale is fuel or gasoline/],
    [['--trim-axis', 'tps'], /--trim-axis is map or maf/],
    [['--unit', 'map'], /--unit needs <channel>=<unit>/],
    [['--unit', 'map=°F'], /not a unit of manifold pressure/],
  ])('exits 2 for %j', async (args, message) => {
    const result = await analyze(log, ...args);
    expect(result).toMatchObject({ code: 2, stdout: '', stderr: expect.stringMatching(message) });
  });

  it.each([
    [
      'a binary file',
      () =>
        file(
          'image.png',
          new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]),
        ),
      /binary data/,
    ],
    ['an empty file', () => file('empty.csv', ''), /empty/],
    ['a header only', () => file('header.csv', 'Time (s),Engine RPM,MAP (kPa)\n'), /no data rows/],
    ['a missing file', () => join(dir, 'missing.csv'), /no such file/],
  ])('exits 2 with one line on stderr for %s', async (_, path, message) => {
    const result = await analyze(path());
    expect(result.code).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toMatch(message);
    expect(result.stderr.trimEnd().split('\n')).toHaveLength(1);
  });

  it('exits 2 for a bad option', async () => {
    const result = await analyze(log, '--map', 'nonsense');
    expect(result).toMatchObject({
      code: 2,
      stdout: '',
      stderr: expect.stringMatching(/--map needs <channel>=<header>/),
    });
  });
});

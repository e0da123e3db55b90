// The compiled CLI starts without zod (only `--vehicle` loads it, from its own file) and still checks a vehicle file.
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_VEHICLE, generateLog } from '@revloop/domain/datalog/testing';
// @ts-expect-error -- plain JavaScript build script, no type declarations
import { builtPath, ensureBuilt } from '../../scripts/build-node.mjs';

const run = promisify(execFile);
const dir = mkdtempSync(join(tmpdir(), 'analyze-start-up-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
beforeAll(() => ensureBuilt(), 120_000);

const file = (name: string, content: string) => {
  const path = join(dir, name);
  writeFileSync(path, content);
  return path;
};

async function analyzeBuilt(
  ...args: string[]
): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run(process.execPath, [builtPath('analyze'), ...args], {
      maxBuffer: 1 << 26,
    });
    return { code: 0, stdout, stderr };
  } catch (error) {
    const e = error as { code: number; stdout: string; stderr: string };
    return { code: e.code, stdout: e.stdout, stderr: e.stderr };
  }
}

describe('analyze CLI start-up', () => {
  const log = file('log.csv', generateLog({ pulls: [{ gears: [2, 3] }] }).text);

  it('bundles no zod into the CLI itself, only into the file loaded for --vehicle', () => {
    const cli = readFileSync(builtPath('analyze'), 'utf8');
    expect(cli).not.toContain('$ZodType');
    expect(cli).toContain('./analyze-vehicle.mjs');
    expect(readFileSync(builtPath('analyze-vehicle'), 'utf8')).toContain('$ZodType');
  });

  it('uses a valid vehicle file for gears', async () => {
    const { code, stdout } = await analyzeBuilt(
      log,
      '--vehicle',
      file('car.json', JSON.stringify(DEMO_VEHICLE)),
    );
    expect(code).toBe(0);
    const report = JSON.parse(stdout) as { wot: { pulls: { gears: number[] }[] } };
    expect(report.wot.pulls[0]?.gears).toEqual([2, 3]);
  });

  it('exits 2 with one line for a vehicle file that does not fit the schema', async () => {
    const { code, stdout, stderr } = await analyzeBuilt(
      log,
      '--vehicle',
      file('bad.json', '{"gearRatios":[]}'),
    );
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr).toMatch(/^analyze: vehicle file ".*bad\.json" needs \{ gearRatios/);
    expect(stderr.trim().split('\n')).toHaveLength(1);
  });
});

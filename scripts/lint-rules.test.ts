import fs from 'node:fs';
import path from 'node:path';
import { ESLint } from 'eslint';
import { afterAll, describe, expect, it } from 'vitest';

// Feeds forbidden imports to the repository's own eslint.config.js and expects the import rules to report them.
const root = path.resolve(import.meta.dirname, '..');
const eslint = new ESLint({ cwd: root, overrideConfigFile: path.join(root, 'eslint.config.js') });

async function rulesFor(code: string, file: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(root, file) });
  return result!.messages.map((m) => m.ruleId ?? m.message);
}

describe('import rules', { timeout: 180_000 }, () => {
  it.each([
    ['domain reaching db by a deep relative path', "import '../../../db/src/client';", 'packages/domain/src/jobs/probe.ts', 'import-x/no-restricted-paths'],
    ['domain doing file I/O', "import 'node:fs';", 'packages/domain/src/jobs/probe.ts', 'no-restricted-imports'],
    ['db importing the api', "import '../../../apps/api/src/env';", 'packages/db/src/probe.ts', 'import-x/no-restricted-paths'],
    ['web importing the db package', "import '@revloop/db';", 'apps/web/src/features/jobs/probe.ts', 'import-x/no-restricted-paths'],
    ['shared web code importing a feature', "import '../features/jobs/api/get-jobs';", 'apps/web/src/lib/probe.ts', 'import-x/no-restricted-paths'],
    ['a feature importing app routes', "import '../../app/router';", 'apps/web/src/features/jobs/probe.ts', 'import-x/no-restricted-paths'],
    ['the api importing the demo seeds', "import '../../../../../seeds/demo/people';", 'apps/api/src/features/jobs/probe.ts', 'import-x/no-restricted-paths'],
    ['seeds reaching into the api by a relative path', "import '../../apps/api/src/env';", 'seeds/demo/probe.ts', 'no-restricted-imports'],
    ['seeds reaching past a package\'s public exports', "import '@revloop/api/src/env';", 'seeds/demo/probe.ts', 'no-restricted-imports'],
    ['a feature importing another feature outside the shared modules', "import '../../jobs/components/job-filters';", 'apps/web/src/features/files/components/probe.tsx', 'import-x/no-restricted-paths'],
  ])('reports %s', async (_name, code, file, rule) => {
    expect(await rulesFor(code, file)).toContain(rule);
  });

  it.each([
    ['domain importing itself', "import '../auth/ability';", 'packages/domain/src/jobs/probe.ts'],
    ['seeds importing the public exports of api, db and domain', "import '@revloop/api';\nimport '@revloop/db';\nimport '@revloop/domain/jobs';", 'seeds/demo/probe.ts'],
    ['api importing db and domain', "import '@revloop/db';\nimport '@revloop/domain';", 'apps/api/src/probe.ts'],
    ['a feature importing a named shared module of another', "import '../../jobs/api/get-jobs';", 'apps/web/src/features/files/components/probe.tsx'],
    ['a feature importing shared web code', "import '../../../lib/format';", 'apps/web/src/features/files/components/probe.tsx'],
  ])('permits %s', async (_name, code, file) => {
    // A relative import that resolves to nothing would pass vacuously, so each one must name a real module.
    for (const [, spec] of code.matchAll(/'(\.[^']*)'/g)) {
      const target = path.resolve(root, path.dirname(file), spec!);
      expect(['.ts', '.tsx'].some((ext) => fs.existsSync(target + ext)), spec).toBe(true);
    }
    expect(await rulesFor(code, file)).toEqual([]);
  });

  const probeDir = fs.mkdtempSync(path.join(root, 'packages/domain/src/lint-probe-'));
  afterAll(() => fs.rmSync(probeDir, { recursive: true, force: true }));

  it('reports a cycle between two files', async () => {
    fs.writeFileSync(path.join(probeDir, 'a.ts'), "import { b } from './b';\n\nexport const a = (): number => b() + 1;\n");
    fs.writeFileSync(path.join(probeDir, 'b.ts'), "import { a } from './a';\n\nexport const b = (): number => a.length;\n");
    const results = await eslint.lintFiles([path.join(probeDir, '*.ts')]);
    expect(results).toHaveLength(2);
    for (const result of results) expect(result.messages.map((m) => m.ruleId)).toContain('import-x/no-cycle');
  });
});

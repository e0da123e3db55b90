// The Node entry points that must start fast — the analyze CLI and the datalog worker threads — compiled to plain
// JavaScript with esbuild into apps/api/dist/node, so nothing compiles TypeScript at run time. Rebuilds only when a
// source file (or the lock file) is newer than the last build; concurrent builds are safe (files are renamed in).
//
//   node apps/api/scripts/build-node.mjs                 build when stale (npm test, demo and the e2e server call this)
//   node apps/api/scripts/build-node.mjs run NAME ARGS   build when stale, then run the entry NAME with ARGS (npm run analyze)
// Messages go to stderr only: `npm run -s analyze` prints nothing but the report on stdout.
import {
  mkdirSync,
  mkdtempSync,
  readFileSync,
  renameSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '../../..');
export const BUILD_DIR = join(root, 'apps/api/dist/node');
const ENTRIES = {
  analyze: 'apps/api/src/cli/analyze.ts',
  // Loaded by the CLI only for --vehicle (see LAZY), so the CLI starts without zod.
  'analyze-vehicle': 'apps/api/src/cli/vehicle-file.ts',
  'analyze-file.job': 'apps/api/src/workers/datalog/analyze-file.job.ts',
  'datalog-series.job': 'apps/api/src/features/datalogs/datalog-series.job.ts',
};
const MANIFEST = join(BUILD_DIR, 'inputs.json');
/** Dynamic imports kept out of a bundle: source specifier → the built entry it loads at run time. */
const LAZY = { './vehicle-file': './analyze-vehicle.mjs' };
const DOMAIN_SRC = join(root, 'packages/domain/src/');
const SKIP = Symbol('resolved by esbuild');

/**
 * The domain has no module-level side effects (no I/O, only declarations), so a module none of whose exports is
 * used is left out: importing a barrel such as '@revloop/domain' no longer brings in zod schemas and CASL rules.
 */
const startUpTrim = {
  name: 'start-up-trim',
  setup(build) {
    build.onResolve({ filter: /.*/ }, async (args) => {
      if (args.pluginData === SKIP) return undefined;
      if (args.kind === 'dynamic-import' && args.path in LAZY)
        return { path: LAZY[args.path], external: true };
      const resolved = await build.resolve(args.path, {
        kind: args.kind,
        importer: args.importer,
        resolveDir: args.resolveDir,
        pluginData: SKIP,
      });
      if (resolved.errors.length > 0 || !resolved.path.startsWith(DOMAIN_SRC)) return resolved;
      return { ...resolved, sideEffects: false };
    });
  },
};

/** Path of a built entry (a key of ENTRIES). */
export const builtPath = (name) => join(BUILD_DIR, `${name}.mjs`);

function isFresh() {
  try {
    const manifest = JSON.parse(readFileSync(MANIFEST, 'utf8'));
    const sources = [
      ...manifest.inputs,
      relative(root, fileURLToPath(import.meta.url)),
      'package-lock.json',
    ];
    // statSync throws for a missing output or source: then it is built again.
    for (const name of Object.keys(ENTRIES)) statSync(builtPath(name));
    return sources.every((file) => statSync(join(root, file)).mtimeMs <= manifest.startedAt);
  } catch {
    return false;
  }
}

async function build() {
  const startedAt = Date.now();
  const { build: esbuild } = await import('esbuild');
  mkdirSync(BUILD_DIR, { recursive: true });
  const staging = mkdtempSync(join(BUILD_DIR, '.staging-'));
  try {
    const result = await esbuild({
      absWorkingDir: root,
      entryPoints: ENTRIES,
      outdir: staging,
      outExtension: { '.js': '.mjs' },
      bundle: true,
      platform: 'node',
      format: 'esm',
      target: 'node20',
      // Less to parse at start-up; names are kept so a stack trace still reads.
      minifyWhitespace: true,
      minifySyntax: true,
      metafile: true,
      plugins: [startUpTrim],
      logLevel: 'warning',
    });
    for (const name of Object.keys(ENTRIES))
      renameSync(join(staging, `${name}.mjs`), builtPath(name));
    // Dependencies in node_modules change only with the lock file, which is watched on its own.
    const inputs = Object.keys(result.metafile.inputs).filter(
      (file) => !file.includes('node_modules/'),
    );
    const manifest = join(staging, 'inputs.json');
    writeFileSync(manifest, JSON.stringify({ startedAt, inputs }));
    renameSync(manifest, MANIFEST);
  } finally {
    rmSync(staging, { recursive: true, force: true });
  }
}

/** Builds when a source is newer than the build; returns the build folder. */
export async function ensureBuilt() {
  if (!isFresh()) await build();
  return BUILD_DIR;
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const [command, name, ...args] = process.argv.slice(2);
  await ensureBuilt();
  if (command === 'run') {
    if (!(name in ENTRIES)) {
      process.stderr.write(`build-node: no entry "${name}" (${Object.keys(ENTRIES).join(', ')})\n`);
      process.exit(2);
    }
    // The entry reads its arguments from process.argv as if it had been started directly.
    process.argv = [process.argv[0], builtPath(name), ...args];
    await import(pathToFileURL(builtPath(name)).href);
  } else if (command !== undefined) {
    process.stderr.write('usage: node apps/api/scripts/build-node.mjs [run NAME ARGS...]\n');
    process.exit(2);
  }
}

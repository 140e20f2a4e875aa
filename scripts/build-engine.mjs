// Compiles the measurement engine's command line, the worker and the analysis thread to plain
// JavaScript in var/build/, so they start without transpiling TypeScript each time.
// `node scripts/build-engine.mjs` builds; with `--if-stale` it builds only when a source is newer
// than the last build. npm packages stay outside the bundles and load from node_modules.
import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');
export const BUILD_DIR = path.join(root, 'var', 'build');
const ENTRIES = {
  cli: 'dsp/cli.ts',
  worker: 'scripts/worker.ts',
  // Found by dsp/parallel/WorkerAnalyzers.ts beside the bundle that starts it.
  analysisWorkerEntry: 'dsp/parallel/analysisWorker.ts',
  analyzeTask: 'dsp/batch/analyzeTask.ts',
};
const SOURCES = ['dsp', 'lib', 'models', 'scripts/worker.ts', 'package-lock.json', 'tsconfig.json'];

function newestMtime(target) {
  const info = statSync(target, { throwIfNoEntry: false });
  if (!info) return 0;
  if (!info.isDirectory()) return info.mtimeMs;
  let newest = info.mtimeMs;
  for (const name of readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, name)));
  return newest;
}

export function isStale() {
  const built = statSync(path.join(BUILD_DIR, 'cli.mjs'), { throwIfNoEntry: false })?.mtimeMs ?? 0;
  return SOURCES.some((source) => newestMtime(path.join(root, source)) > built);
}

export async function buildEngine() {
  const { build } = await import('esbuild');
  await build({
    absWorkingDir: root,
    entryPoints: ENTRIES,
    outdir: BUILD_DIR,
    outExtension: { '.js': '.mjs' },
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    sourcemap: true,
    logLevel: 'warning',
  });
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  if (!process.argv.includes('--if-stale') || isStale()) await buildEngine();
}

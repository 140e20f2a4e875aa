// `npm run analyze`: the measurement engine's command line, compiled (rebuilt first when a source changed).
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { BUILD_DIR, buildEngine, isStale } from './build-engine.mjs';

if (isStale()) await buildEngine();
await import(pathToFileURL(path.join(BUILD_DIR, 'cli.mjs')).href);

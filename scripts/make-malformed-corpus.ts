// Writes the corpus of damaged WAV files used by the tests into a folder, for trying them by hand:
//   npx tsx scripts/make-malformed-corpus.ts var/malformed && npm run -s analyze -- var/malformed/no-fmt.wav
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { malformedCorpus } from '../tests/support/malformedWavs';

const outDir = process.argv[2] ?? 'var/malformed';
mkdirSync(outDir, { recursive: true });
const corpus = malformedCorpus();
for (const { name, bytes } of corpus) writeFileSync(path.join(outDir, `${name}.wav`), bytes);
console.log(`Wrote ${corpus.length} damaged WAV files to ${outDir}`);

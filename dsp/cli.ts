import { readFile } from 'node:fs/promises';
import { CONVERTER_USAGE, runConverterCommand } from './converter/command';
import { reasonOf, verdictOf } from './findings';
import { refusal } from './batch/refusal';
import { runBatch } from './batch/runBatch';
import { analyzeFile } from './pipeline';
import { DEFAULT_SPEC, deliverySpecSchema, type DeliverySpec } from './spec';
import type { AnalysisReport } from './types';

const USAGE = `Usage: npm run -s analyze -- <file.wav> [more.wav …] [--json] [--spec <spec.json>]\n  Several files are analysed together on every core; with --json, one report per line in the order named.\n${CONVERTER_USAGE}`;
/** Exit code for a file or spec the tool refuses (the user's input, not a crash). */
const EXIT_REFUSED = 2;

class UsageError extends Error {}

interface CliArguments {
  files: string[];
  json: boolean;
  specPath: string | null;
}

function parseArguments(argv: string[]): CliArguments {
  const files: string[] = [];
  let json = false;
  let specPath: string | null = null;
  for (let i = 0; i < argv.length; i++) {
    const argument = argv[i];
    if (argument === '--json') json = true;
    else if (argument === '--spec') {
      specPath = argv[++i] ?? null;
      if (!specPath) throw new UsageError('--spec needs a file name.');
    } else if (argument.startsWith('--')) throw new UsageError(`Unknown option ${argument}.`);
    else files.push(argument);
  }
  if (!files.length) throw new UsageError('Name a WAV file to analyse.');
  return { files, json, specPath };
}

async function loadSpec(specPath: string | null): Promise<DeliverySpec> {
  if (!specPath) return DEFAULT_SPEC;
  let text: string;
  try {
    text = await readFile(specPath, 'utf8');
  } catch (error) {
    throw new UsageError(`Cannot read the spec file ${specPath}: ${(error as NodeJS.ErrnoException).code ?? String(error)}.`);
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new UsageError(`The spec file ${specPath} is not valid JSON.`);
  }
  const parsed = deliverySpecSchema.safeParse(raw);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.') || 'spec'}: ${issue.message}`).join('; ');
    throw new UsageError(`The spec file ${specPath} is not a valid delivery spec (${problems}).`);
  }
  return parsed.data;
}

const show = (value: number | null, unit: string, decimals = 1) => (value === null ? '-' : `${value.toFixed(decimals)} ${unit}`);

function summary(report: AnalysisReport, file: string, spec: DeliverySpec): string {
  const { file: format, loudness, peak } = report;
  const lines = [
    `${file}`,
    `  ${format.container} ${format.encoding === 'float' ? 'float' : 'PCM'}, ${format.bitsPerSample}-bit, ${format.sampleRate} Hz, ${format.channels} ch${format.layout ? ` (${format.layout})` : ''}, ${format.durationSec.toFixed(2)} s`,
    `  Integrated ${show(loudness.integratedLufs, 'LUFS')}   range ${show(loudness.rangeLu, 'LU')}   max momentary ${show(loudness.momentaryMaxLufs, 'LUFS')}   max short-term ${show(loudness.shortTermMaxLufs, 'LUFS')}`,
    `  Sample peak ${show(peak.samplePeakDbfs, 'dBFS', 2)}   true peak ${show(peak.truePeakDbtp, 'dBTP', 2)}   effective bits ${report.resolution.effectiveBits}   noise floor ${show(report.noise.floorDbfs, 'dBFS')}`,
    ...report.channels.map((channel, index) =>
      `  ch ${index + 1}${channel.name ? ` ${channel.name}` : ''}: ${channel.integratedLufs != null ? `${show(channel.integratedLufs, 'LUFS')}, ` : ''}peak ${show(channel.samplePeakDbfs, 'dBFS', 2)}, true peak ${show(channel.truePeakDbtp, 'dBTP', 2)}, RMS ${show(channel.rmsDbfs, 'dBFS', 2)}, DC ${channel.dcOffset.toExponential(2)}${channel.silent ? ', silent' : ''}`),
    `  Judged against: ${spec.name}`,
    `  Verdict: ${verdictOf(report.findings).toUpperCase()}${reasonOf(report.findings) ? ` (${reasonOf(report.findings)})` : ''}`,
    ...report.findings.map((finding) => `   [${finding.severity}] ${finding.check}: ${finding.message}`),
  ];
  return lines.join('\n');
}

async function main(): Promise<number> {
  const converterExit = await runConverterCommand(process.argv.slice(2));
  if (converterExit !== null) return converterExit;
  let args: CliArguments;
  let spec: DeliverySpec;
  try {
    args = parseArguments(process.argv.slice(2));
    spec = await loadSpec(args.specPath);
  } catch (error) {
    if (error instanceof UsageError) {
      process.stderr.write(`${error.message}\n${USAGE}\n`);
      return EXIT_REFUSED;
    }
    throw error;
  }
  const [file] = args.files;
  if (args.files.length > 1) return batch(args.files, args.json, spec);
  try {
    const report = await analyzeFile(file, { spec });
    process.stdout.write(args.json ? `${JSON.stringify(report)}\n` : `${summary(report, file, spec)}\n`);
    return 0;
  } catch (error) {
    const refused = refusal(error, file);
    if (refused === null) throw error;
    process.stderr.write(`${refused}\n`);
    return EXIT_REFUSED;
  }
}

/** Several files on every core. A refused file gets a JSON line `{"file", "refused"}` (and its message on stderr), the exit code 2. */
async function batch(files: string[], json: boolean, spec: DeliverySpec): Promise<number> {
  let exit = 0;
  await runBatch(files, spec, (file, result) => {
    if ('refused' in result) {
      exit = EXIT_REFUSED;
      process.stderr.write(`${result.refused}\n`);
      if (json) process.stdout.write(`${JSON.stringify({ file, refused: result.refused })}\n`);
    } else {
      process.stdout.write(json ? `${JSON.stringify(result.report)}\n` : `${summary(result.report, file, spec)}\n`);
    }
  });
  return exit;
}

main().then(
  (code) => {
    process.exitCode = code;
  },
  (error) => {
    process.stderr.write(`Internal error while analysing: ${error instanceof Error ? error.message : String(error)}\n`);
    process.exitCode = 1;
  },
);

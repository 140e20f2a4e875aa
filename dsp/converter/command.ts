import { readFile } from 'node:fs/promises';
import { formatKhz } from '../format';
import { UnreadableWavError } from '../reader/UnreadableWavError';
import { analyzeConverterCheckFile } from './analyzeCheck';
import { ConverterCheckError } from './ConverterCheckError';
import type { ConverterReport } from './report';
import { writeCheckSignalFile, type CheckSignalFormat } from './signalWriter';
import { converterThresholdsSchema, DEFAULT_CONVERTER_THRESHOLDS, type ConverterThresholds } from './thresholds';

/** Command-line forms of the converter check, for the analyze command's usage text. */
export const CONVERTER_USAGE = [
  '       npm run -s analyze -- --make-converter-signal <out.wav> [--rate 48000] [--bits 24] [--channels 2]',
  '       npm run -s analyze -- --converter-check <recording.wav> [--json] [--thresholds <file.json>] [--baseline <report.json>]',
].join('\n');

const EXIT_REFUSED = 2;

class ConverterUsageError extends Error {}

interface Parsed {
  values: Map<string, string>;
  json: boolean;
}

const VALUE_OPTIONS = ['--make-converter-signal', '--converter-check', '--rate', '--bits', '--channels', '--thresholds', '--baseline'];

function parse(argv: string[]): Parsed {
  const values = new Map<string, string>();
  let json = false;
  for (let i = 0; i < argv.length; i++) {
    const option = argv[i];
    if (option === '--json') json = true;
    else if (VALUE_OPTIONS.includes(option)) {
      const value = argv[++i];
      if (value === undefined || value.startsWith('--')) throw new ConverterUsageError(`${option} needs a value.`);
      values.set(option, value);
    } else throw new ConverterUsageError(`${option} is not an option of the converter check.`);
  }
  return { values, json };
}

function integerOption(values: Map<string, string>, option: string, fallback: number): number {
  const text = values.get(option);
  if (text === undefined) return fallback;
  const value = Number(text);
  if (!Number.isInteger(value)) throw new ConverterUsageError(`${option} must be a whole number (got ${text}).`);
  return value;
}

async function readJson(path: string, what: string): Promise<unknown> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (error) {
    throw new ConverterUsageError(`Cannot read the ${what} file ${path}: ${(error as NodeJS.ErrnoException).code ?? String(error)}.`);
  }
  try {
    return JSON.parse(text);
  } catch {
    throw new ConverterUsageError(`The ${what} file ${path} is not valid JSON.`);
  }
}

async function loadThresholds(path: string | undefined): Promise<ConverterThresholds> {
  if (!path) return DEFAULT_CONVERTER_THRESHOLDS;
  const parsed = converterThresholdsSchema.partial().safeParse(await readJson(path, 'thresholds'));
  if (!parsed.success) {
    throw new ConverterUsageError(`The thresholds file ${path} is not valid (${parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`).join('; ')}).`);
  }
  return { ...DEFAULT_CONVERTER_THRESHOLDS, ...parsed.data };
}

async function loadBaseline(path: string | undefined): Promise<ConverterReport | null> {
  if (!path) return null;
  const baseline = (await readJson(path, 'baseline')) as Partial<ConverterReport>;
  if (baseline?.kind !== 'converter-check' || !Array.isArray(baseline.channels)) {
    throw new ConverterUsageError(`The baseline file ${path} is not a converter check report.`);
  }
  return baseline as ConverterReport;
}

const show = (value: number | null, unit: string, decimals = 1) => (value === null ? '—' : `${value.toFixed(decimals)}${unit ? ` ${unit}` : ''}`);

function summary(report: ConverterReport, file: string): string {
  const lines = [
    file,
    `  Check signal found at ${report.signal.startSec.toFixed(2)}–${report.signal.endSec.toFixed(2)} s (${formatKhz(report.file.sampleRate)}, ${report.file.bitsPerSample}-bit${report.file.encoding === 'float' ? ' float' : ''}, ${report.file.channels} ch); levels in dB FS, full-scale sine = 0 dB FS (AES17)`,
    `  Clock error ${show(report.clockErrorPpm, 'ppm', 2)}   crosstalk ${show(report.crosstalkDb, 'dB')}   gain mismatch ${show(report.channelGainMismatchDb, 'dB', 2)}   delay ch 2 vs ch 1 ${show(report.interChannelDelaySamples, 'samples', 0)}`,
    ...report.channels.map((channel, c) =>
      channel.dead
        ? `  ch ${c + 1}: no signal`
        : `  ch ${c + 1}: gain ${show(channel.gainDb, 'dB', 2)}${channel.polarityInverted ? ' (inverted)' : ''}, THD+N ${show(channel.thdnDb.minus1, 'dB')} / ${show(channel.thdnDb.minus20, 'dB')} at −1 / −20 dB FS, ENOB ${show(channel.enobBits, 'bits', 2)}, dynamic range ${show(channel.dynamicRangeDb, 'dB')} (${show(channel.dynamicRangeDbA, 'dB A')}), idle noise ${show(channel.noiseFloorDbfs, 'dB FS')}, passband ±${show(channel.passbandDeviationDb, 'dB', 2)}, −3 dB at ${channel.bandEdgeHz === null ? 'the top of the band' : formatKhz(channel.bandEdgeHz)}`,
    ),
    ...report.findings.map((finding) => `   [${finding.severity}] ${finding.check}: ${finding.message}`),
  ];
  return lines.join('\n');
}

/**
 * Runs `--make-converter-signal` or `--converter-check` when the arguments name one of them.
 * @returns the exit code, or null when the arguments are not a converter command
 */
export async function runConverterCommand(argv: string[]): Promise<number | null> {
  if (!argv.includes('--make-converter-signal') && !argv.includes('--converter-check')) return null;
  let parsed: Parsed;
  try {
    parsed = parse(argv);
    if (parsed.values.has('--make-converter-signal') && parsed.values.has('--converter-check')) {
      throw new ConverterUsageError('Write a check signal or analyse a recording, not both at once.');
    }
  } catch (error) {
    if (error instanceof ConverterUsageError) return refuse(error.message, true);
    throw error;
  }
  const { values } = parsed;
  const output = values.get('--make-converter-signal');
  try {
    if (output !== undefined) {
      const format: CheckSignalFormat = {
        sampleRate: integerOption(values, '--rate', 48000),
        bitsPerSample: integerOption(values, '--bits', 24) as CheckSignalFormat['bitsPerSample'],
        channels: integerOption(values, '--channels', 2),
      };
      await writeCheckSignalFile(output, format);
      process.stderr.write(`Wrote ${output}: converter check signal, ${formatKhz(format.sampleRate)}, ${format.bitsPerSample}-bit, ${format.channels} ch. It gets loud after the rising beeps: play it into line inputs, not into monitors or headphones at level.\n`);
      return 0;
    }
    const input = values.get('--converter-check')!;
    const thresholds = await loadThresholds(values.get('--thresholds'));
    const baseline = await loadBaseline(values.get('--baseline'));
    const report = await analyzeConverterCheckFile(input, { thresholds, baseline });
    process.stdout.write(parsed.json ? `${JSON.stringify(report)}\n` : `${summary(report, input)}\n`);
    return 0;
  } catch (error) {
    if (error instanceof ConverterUsageError) return refuse(error.message, true);
    if (error instanceof RangeError) return refuse(error.message, false);
    if (error instanceof ConverterCheckError || error instanceof UnreadableWavError) return refuse(`Cannot analyse ${values.get('--converter-check')}: ${error.message}`, false);
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT' || code === 'EACCES' || code === 'EISDIR') {
      const path = output ?? values.get('--converter-check');
      return refuse(`Cannot ${output ? 'write' : 'open'} ${path} (${code === 'ENOENT' ? 'no such file or folder' : code === 'EISDIR' ? 'it is a directory' : 'permission denied'}).`, false);
    }
    throw error;
  }
}

function refuse(message: string, withUsage: boolean): number {
  process.stderr.write(`${message}\n${withUsage ? `Usage:\n${CONVERTER_USAGE}\n` : ''}`);
  return EXIT_REFUSED;
}

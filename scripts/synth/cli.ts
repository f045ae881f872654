import { parseArgs } from 'node:util';
import sharp from 'sharp';
import type { BenchScenario, FrameFormat } from './bench-scenario';
import { generateBenchMeasurement } from './generate-bench-measurement';
import { parseBadFrames } from './parse-bad-frames';
import { benchPresetNames, benchPresets, type BenchPresetName } from './presets';

const USAGE_LINE =
  'usage: node --import tsx scripts/synth/cli.ts --preset <name> --out <folder> [--seed N] [--width PX --height PX] ' +
  '[--format jpeg|png8|png16|tiff16] [--quality 1-100] [--frames N-per-focus] [--bad [sweep/]frame:kind,...]';

const USAGE = Symbol('usage error');

/** A mistake on the command line: reported with the usage line and exit code 2. */
function usageError(message: string): Error {
  return Object.assign(new Error(message), { [USAGE]: true });
}

const isUsageError = (error: unknown): boolean => error instanceof Error && USAGE in error;

function parseBadFramesOrExplain(text: string) {
  try {
    return parseBadFrames(text);
  } catch (error) {
    throw usageError((error as Error).message);
  }
}

function integerOption(value: string | undefined, name: string): number | undefined {
  if (value === undefined) return undefined;
  if (!/^-?\d+$/.test(value)) throw usageError(`--${name} must be a whole number, got "${value}".`);
  return Number(value);
}

async function main(): Promise<void> {
  const options = {
    preset: { type: 'string' },
    out: { type: 'string' },
    seed: { type: 'string' },
    width: { type: 'string' },
    height: { type: 'string' },
    format: { type: 'string' },
    quality: { type: 'string' },
    frames: { type: 'string' },
    bad: { type: 'string' },
    help: { type: 'boolean' },
  } as const;
  let parsed: ReturnType<typeof parseArgs<{ options: typeof options; strict: true }>>;
  try {
    parsed = parseArgs({ options, strict: true });
  } catch (error) {
    throw usageError((error as Error).message);
  }
  const { values } = parsed;
  if (values.help) {
    process.stderr.write(`${USAGE_LINE}\npresets: ${benchPresetNames.join(', ')}\n`);
    return;
  }
  if (!values.preset) throw usageError(`--preset is required (one of ${benchPresetNames.join(', ')}).`);
  if (!benchPresetNames.includes(values.preset as BenchPresetName)) {
    throw usageError(`--preset must be one of ${benchPresetNames.join(', ')}, got "${values.preset}".`);
  }
  if (!values.out) throw usageError('--out is required: the measurement folder to write.');
  const preset = benchPresets[values.preset as BenchPresetName];
  const width = integerOption(values.width, 'width');
  const height = integerOption(values.height, 'height');
  const quality = integerOption(values.quality, 'quality');
  const frames = integerOption(values.frames, 'frames');
  const scenario: BenchScenario = {
    ...preset,
    seed: integerOption(values.seed, 'seed') ?? preset.seed,
    camera: {
      ...preset.camera,
      ...(width !== undefined ? { widthPx: width } : {}),
      ...(height !== undefined ? { heightPx: height } : {}),
      ...(values.format ? { format: values.format as FrameFormat } : {}),
      ...(quality !== undefined ? { jpegQuality: quality } : {}),
    },
    sweeps: frames === undefined ? preset.sweeps : preset.sweeps.map((sweep) => ({ ...sweep, framesPerFocus: frames })),
    badFrames: values.bad ? parseBadFramesOrExplain(values.bad) : preset.badFrames,
  };
  sharp.concurrency(2);
  const started = Date.now();
  const { folder, truth } = await generateBenchMeasurement({
    ...scenario,
    outputFolder: values.out,
    onProgress: (message) => process.stderr.write(`${message}\n`),
  });
  const frameCount = truth.sweeps.reduce((n, s) => n + s.frames.length, 0);
  process.stderr.write(`wrote ${frameCount} frames to ${folder} in ${((Date.now() - started) / 1000).toFixed(1)} s\n`);
}

main().catch((error: unknown) => {
  const message = error instanceof Error ? error.message : String(error);
  // Scenario and file-system problems arrive as plain Errors with a sentence; anything else is a bug.
  const isUserError = error instanceof Error && error.name === 'Error' && !message.startsWith('invariant');
  process.stderr.write(`${isUserError ? '' : 'internal error: '}${message}\n`);
  if (isUsageError(error)) process.stderr.write(`${USAGE_LINE}\n`);
  if (!isUserError && error instanceof Error && error.stack) process.stderr.write(`${error.stack}\n`);
  process.exitCode = isUsageError(error) ? 2 : 1;
});

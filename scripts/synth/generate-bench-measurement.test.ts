import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtemp, readFile, readdir, rm, stat } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import sharp from 'sharp';
import { afterAll, describe, expect, it } from 'vitest';
import type { BenchScenario } from './bench-scenario';
import { checkBenchScenarioOptions } from './check-bench-scenario-options';
import { generateBenchMeasurement } from './generate-bench-measurement';
import { parseBadFrames } from './parse-bad-frames';
import { planBenchMeasurement } from './plan-bench-measurement';
import { benchPresetNames, benchPresets } from './presets';
import { decodeGrey, traceImage } from './test-support';

const folders: string[] = [];
async function freshFolder(): Promise<string> {
  const folder = await mkdtemp(path.join(os.tmpdir(), 'paraxia-synth-'));
  folders.push(folder);
  return folder;
}
afterAll(async () => {
  for (const folder of folders) await rm(folder, { recursive: true, force: true });
});

/** A small, quick bench: f = 100 mm thin lens, object 300 mm in front, |m| = 0.5. */
function smallBench(overrides: Partial<BenchScenario> = {}, frames = 5): BenchScenario {
  return {
    method: 'finite-conjugate',
    seed: 21,
    lens: { focalLengthMm: 100, fNumber: 8 },
    camera: { pixelPitchUm: 3.45, widthPx: 640, heightPx: 480, format: 'png8', opticalAxisOffsetPx: { x: 11, y: -7 } },
    target: { pattern: 'dot-pair', sizeMm: 2, dotDiameterMm: 0.5, centreOffsetMm: { x: 0.1, y: 0.05 } },
    sweeps: [{ objectPositionMm: 0, lensPositionMm: 300, framesPerFocus: frames, stepMm: 0.25 }],
    ...overrides,
  };
}

const withFormat = (format: BenchScenario['camera']['format'], frames = 5) => smallBench({ camera: { ...smallBench().camera, format } }, frames);

async function fileHashes(folder: string): Promise<Record<string, string>> {
  const hashes: Record<string, string> = {};
  for (const entry of await readdir(folder, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile()) continue;
    const full = path.join(entry.parentPath, entry.name);
    hashes[path.relative(folder, full)] = createHash('sha256').update(await readFile(full)).digest('hex');
  }
  return hashes;
}

describe('generateBenchMeasurement', () => {
  it('writes measurement.json in the manifest contract, naming frames that decode at the declared size and bit depth', async () => {
    const folder = await freshFolder();
    const { manifest, truth } = await generateBenchMeasurement({ ...smallBench(), outputFolder: folder });
    const written = JSON.parse(await readFile(path.join(folder, 'measurement.json'), 'utf8'));
    expect(written).toEqual(manifest);
    expect(JSON.parse(await readFile(path.join(folder, 'truth.json'), 'utf8'))).toEqual(truth);
    // Field names and shapes from measurement-manifest.md.
    expect(Object.keys(written).sort()).toEqual(['camera', 'method', 'scale', 'sweeps', 'target']);
    expect(written.camera).toEqual({ pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.01 });
    expect(written.target).toEqual({ pattern: 'dot-pair', sizeMm: 2, sizeUncertaintyMm: 0.002, polarity: 'dark-on-light' });
    expect(written.scale).toEqual({ uncertaintyMm: 0.02 });
    const [sweep] = written.sweeps;
    expect(Object.keys(sweep).sort()).toEqual(['frames', 'lensPositionMm', 'moving', 'objectPositionMm']);
    expect(sweep.moving).toBe('sensor');
    expect(sweep.frames.map((f: { file: string }) => f.file)).toEqual(['s1/0001.png', 's1/0002.png', 's1/0003.png', 's1/0004.png', 's1/0005.png']);
    for (const frame of sweep.frames) {
      const meta = await sharp(path.join(folder, frame.file)).metadata();
      expect(meta).toMatchObject({ format: 'png', width: 640, height: 480, channels: 1, depth: 'uchar' });
      expect(meta.space).toBe('b-w');
    }
    // Readings: equal steps around the true focus, shifted off-centre by less than half a step.
    const positions: number[] = sweep.frames.map((f: { positionMm: number }) => f.positionMm);
    for (let k = 1; k < positions.length; k++) expect(positions[k] - positions[k - 1]).toBeCloseTo(0.25, 2);
    const centreShiftMm = (positions[0] + positions[4]) / 2 - truth.sweeps[0].bestFocusPositionMm!;
    expect(Math.abs(centreShiftMm)).toBeLessThanOrEqual(0.125 + 0.001);
    expect(Math.abs(centreShiftMm)).toBeGreaterThan(0.001);
  });

  it('records the true focus, magnification and image size that an independent ray-transfer-matrix trace gives', () => {
    const { truth } = planBenchMeasurement(
      smallBench({ lens: { focalLengthMm: 100, frontOffsetMm: 2.5, rearOffsetMm: -1.5, fNumber: 8, exitPupilOffsetMm: 4 } }),
    );
    const traced = traceImage({ objectMm: 0, frontPlaneMm: 302.5, rearPlaneMm: 298.5, focalLengthMm: 100 });
    const [focus] = truth.sweeps[0].focus;
    expect(truth.sweeps[0].bestFocusPositionMm).toBeCloseTo(traced.imagePlaneMm, 9);
    expect(focus.magnification).toBeCloseTo(-traced.signedMagnification, 12);
    expect(focus.imageSizeMm).toBeCloseTo(2 * -traced.signedMagnification, 12);
    expect(focus.exitPupilPositionMm).toBeCloseTo(298.5 + 4, 12);
    expect(truth).toMatchObject({ focalLengthMm: 100, frontOffsetMm: 2.5, rearOffsetMm: -1.5, imageInverted: true });
    expect(truth.opticalAxisPx).toEqual({ x: 319.5 + 11, y: 239.5 - 7 });
  });

  it('writes the same frame as 16-bit PNG and 16-bit TIFF with identical values, and as JPEG within a few DN of the 8-bit PNG', async () => {
    const decoded: Record<string, Awaited<ReturnType<typeof decodeGrey>>> = {};
    for (const format of ['png16', 'tiff16', 'png8', 'jpeg'] as const) {
      const folder = await freshFolder();
      const { manifest } = await generateBenchMeasurement({ ...withFormat(format, 1), outputFolder: folder });
      const file = (manifest as { sweeps: Array<{ frames: Array<{ file: string }> }> }).sweeps[0].frames[0].file;
      expect(path.extname(file)).toBe({ png16: '.png', tiff16: '.tif', png8: '.png', jpeg: '.jpg' }[format]);
      expect((await sharp(path.join(folder, file)).metadata()).channels).toBe(1);
      decoded[format] = await decodeGrey(path.join(folder, file));
    }
    expect(Array.from(decoded.tiff16.values)).toEqual(Array.from(decoded.png16.values));
    // sharp widens 8-bit files to 16 bits by ×257 (0xFF → 0xFFFF).
    let sumAbs = 0, multiplesOf257 = 0;
    for (let k = 0; k < decoded.png8.values.length; k++) {
      sumAbs += Math.abs(decoded.jpeg.values[k] - decoded.png8.values[k]) / 257;
      if (decoded.png16.values[k] % 257 === 0) multiplesOf257++;
    }
    expect(sumAbs / decoded.png8.values.length).toBeLessThan(2);
    // A true 16-bit file, not an 8-bit one widened: few values are multiples of 257.
    expect(multiplesOf257 / decoded.png16.values.length).toBeLessThan(0.05);
  });

  it('produces bad frames that are what they claim, and lists them in truth.json', async () => {
    const folder = await freshFolder();
    const { truth } = await generateBenchMeasurement({
      ...withFormat('png8', 6),
      badFrames: [
        { frameNumber: 1, kind: 'saturated' },
        { frameNumber: 2, kind: 'target-lost' },
        { frameNumber: 3, kind: 'pure-noise' },
        { frameNumber: 4, kind: 'truncated' },
        { frameNumber: 5, kind: 'undecodable' },
      ],
      outputFolder: folder,
    });
    expect(truth.badFrames).toEqual([
      { file: 's1/0001.png', kind: 'saturated' },
      { file: 's1/0002.png', kind: 'target-lost' },
      { file: 's1/0003.png', kind: 'pure-noise' },
      { file: 's1/0004.png', kind: 'truncated' },
      { file: 's1/0005.png', kind: 'undecodable' },
    ]);
    const read = (n: number) => decodeGrey(path.join(folder, `s1/000${n}.png`));
    const good = await read(6);
    const share = (image: typeof good, test: (v: number) => boolean) => image.values.filter(test).length / image.values.length;
    const top = 255 * 257;
    const backgroundLevel = [...good.values].sort((a, b) => a - b)[Math.floor(good.values.length / 2)];

    expect(share(await read(1), (v) => v === top)).toBeGreaterThan(0.5);
    expect(share(good, (v) => v === top)).toBeLessThan(0.001);

    const darkShare = (image: typeof good) => share(image, (v) => v < backgroundLevel / 2);
    expect(darkShare(good)).toBeGreaterThan(0.01);
    expect(darkShare(await read(2))).toBe(0);

    const noise = await read(3);
    let mean = 0;
    for (const v of noise.values) mean += v / noise.values.length;
    let variance = 0, lagged = 0;
    for (let k = 0; k < noise.values.length - 1; k++) {
      variance += (noise.values[k] - mean) ** 2;
      lagged += (noise.values[k] - mean) * (noise.values[k + 1] - mean);
    }
    // Uniform 0..255: standard deviation 255/√12 ≈ 73.6 DN; independent pixels: lag-1 correlation ≈ 0.
    expect(Math.sqrt(variance / noise.values.length) / 257).toBeGreaterThan(60);
    expect(Math.abs(lagged / variance)).toBeLessThan(0.02);

    const truncatedBytes = (await stat(path.join(folder, 's1/0004.png'))).size;
    const goodBytes = (await stat(path.join(folder, 's1/0006.png'))).size;
    expect(truncatedBytes / goodBytes).toBeGreaterThan(0.3);
    expect(truncatedBytes / goodBytes).toBeLessThan(0.7);
    await expect(sharp(path.join(folder, 's1/0004.png')).raw().toBuffer()).rejects.toThrow();
    await expect(sharp(path.join(folder, 's1/0005.png')).raw().toBuffer()).rejects.toThrow();
  });

  it('varies the exposure frame to frame by the recorded lamp flicker (within ±5 %)', async () => {
    const folder = await freshFolder();
    const { truth } = await generateBenchMeasurement({ ...withFormat('png16', 3), outputFolder: folder });
    const gains = truth.sweeps[0].frames.map((f) => f.exposureGain);
    for (const g of gains) expect(Math.abs(g - 1)).toBeLessThanOrEqual(0.05);
    expect(new Set(gains).size).toBe(3);
    const cornerMedian = async (file: string) => {
      const image = await decodeGrey(path.join(folder, file));
      const values: number[] = [];
      for (let y = 0; y < 60; y++) for (let x = 0; x < 60; x++) values.push(image.values[y * image.widthPx + x]);
      return values.sort((a, b) => a - b)[values.length / 2];
    };
    const levels = await Promise.all(truth.sweeps[0].frames.map((f) => cornerMedian(f.file)));
    // Only the sensor moved (0.25 mm): vignetting at the corner changes by far less than the tolerance.
    expect(Math.abs(levels[1] / levels[0] / (gains[1] / gains[0]) - 1)).toBeLessThan(0.003);
    expect(Math.abs(levels[2] / levels[0] / (gains[2] / gains[0]) - 1)).toBeLessThan(0.003);
  });

  it('gives byte-identical folders for the same seed and different frames for another seed', async () => {
    const scenario = withFormat('jpeg', 2);
    const [a, b, c] = [await freshFolder(), await freshFolder(), await freshFolder()];
    await generateBenchMeasurement({ ...scenario, badFrames: [{ frameNumber: 2, kind: 'undecodable' }], outputFolder: a });
    await generateBenchMeasurement({ ...scenario, badFrames: [{ frameNumber: 2, kind: 'undecodable' }], outputFolder: b });
    await generateBenchMeasurement({ ...scenario, seed: 22, badFrames: [{ frameNumber: 2, kind: 'undecodable' }], outputFolder: c });
    const [ha, hb, hc] = await Promise.all([fileHashes(a), fileHashes(b), fileHashes(c)]);
    expect(Object.keys(ha).sort()).toEqual(['measurement.json', 's1/0001.jpg', 's1/0002.jpg', 'truth.json']);
    expect(hb).toEqual(ha);
    expect(hc['s1/0001.jpg']).not.toBe(ha['s1/0001.jpg']);
    expect(hc['s1/0002.jpg']).not.toBe(ha['s1/0002.jpg']);
  });
});

describe('planBenchMeasurement per method', () => {
  it('every preset fits its target on the sensor in every frame, with axis offset, noise, vignetting and flicker on', () => {
    for (const name of benchPresetNames) {
      const preset = benchPresets[name];
      const plan = planBenchMeasurement(preset);
      expect(plan.frames.length).toBeGreaterThanOrEqual(25);
      const camera = plan.scenario.camera;
      expect(camera.noise).toBe(true);
      expect(camera.exposureFlickerFraction).toBeGreaterThan(0);
      expect(camera.radialFalloffAtCorner).toBeGreaterThan(0);
      expect(camera.naturalCos4).toBe(true);
      expect(Math.hypot(camera.opticalAxisOffsetPx.x, camera.opticalAxisOffsetPx.y)).toBeGreaterThan(10);
      // Each focus lies inside its sweep, but not exactly on a frame.
      for (const sweep of plan.truth.sweeps) {
        for (const focus of sweep.focus) {
          const readings = sweep.frames.map((f) => f.positionMm);
          expect(readings.some((p) => p < focus.positionMm)).toBe(true);
          expect(readings.some((p) => p > focus.positionMm)).toBe(true);
          expect(Math.min(...readings.map((p) => Math.abs(p - focus.positionMm)))).toBeGreaterThan(0.0005);
        }
      }
    }
    expect(benchPresets.large.camera).toMatchObject({ widthPx: 4000, heightPx: 3000, format: 'jpeg' });
  });

  it('collimator: no objectPositionMm, the collimator in the manifest, back focal distance = h′ + f', () => {
    const { manifest, truth } = planBenchMeasurement(benchPresets.collimator);
    const m = manifest as { collimator: unknown; sweeps: Array<Record<string, unknown>> };
    expect(m.collimator).toEqual({ focalLengthMm: 500, focalLengthUncertaintyMm: 0.5 });
    expect('objectPositionMm' in m.sweeps[0]).toBe(false);
    expect(m.sweeps[0].lensPositionMm).toBe(600);
    expect(truth.backFocalDistanceMm).toBeCloseTo(-1.5 + 99.8, 12);
    expect(truth.sweeps[0].bestFocusPositionMm).toBeCloseTo(600 - 1.5 + 99.8, 12);
    expect(truth.sweeps[0].focus[0].magnification).toBeCloseTo(99.8 / 500, 12);
  });

  it('displacement: the lens moves, frames gather round both sharp lens positions, which satisfy Bessel\'s f = (D² − d²)/(4D)', () => {
    const { manifest, truth } = planBenchMeasurement(benchPresets.displacement);
    const sweep = (manifest as { sweeps: Array<Record<string, unknown> & { frames: Array<{ positionMm: number }> }> }).sweeps[0];
    expect(sweep.moving).toBe('lens');
    expect(sweep.sensorPositionMm).toBe(450);
    expect('lensPositionMm' in sweep).toBe(false);
    const [p1, p2] = truth.sweeps[0].sharpLensPositionsMm!;
    const d = p2 - p1;
    expect((450 * 450 - d * d) / (4 * 450)).toBeCloseTo(99.6, 9); // methods.md §6, thin lens (h = h′ = 0)
    const near = (p: number) => sweep.frames.filter((f) => Math.abs(f.positionMm - p) < 5).length;
    expect(near(p1)).toBe(25);
    expect(near(p2)).toBe(25);
  });

  it('auxiliary-lens: the manifest carries the auxiliary lens; truth carries the unknown f and the pair 1/f = 1/f_x + 1/f_aux', () => {
    const { manifest, truth } = planBenchMeasurement(benchPresets['auxiliary-lens']);
    expect((manifest as { auxiliaryLens: unknown }).auxiliaryLens).toEqual({ focalLengthMm: 75, focalLengthUncertaintyMm: 0.1 });
    expect(truth.focalLengthMm).toBe(-148.7);
    expect(truth.auxiliaryFocalLengthMm).toBe(75);
    // Thin lenses in contact: powers add (paraxial optics, from memory).
    expect(1 / truth.combinedFocalLengthMm!).toBeCloseTo(1 / -148.7 + 1 / 75, 14);
    const traced = traceImage({ objectMm: 0, frontPlaneMm: 450, rearPlaneMm: 450, focalLengthMm: truth.combinedFocalLengthMm! });
    expect(truth.sweeps[0].bestFocusPositionMm).toBeCloseTo(traced.imagePlaneMm, 9);
  });

  it('multi-conjugate: sweeps at different object distances with the thick lens\'s principal-plane offsets in truth', () => {
    const { manifest, truth } = planBenchMeasurement(benchPresets['multi-conjugate']);
    const objects = (manifest as { sweeps: Array<{ objectPositionMm: number }> }).sweeps.map((s) => s.objectPositionMm);
    expect(new Set(objects).size).toBe(objects.length);
    expect(objects.length).toBeGreaterThanOrEqual(2);
    expect(truth.frontOffsetMm).not.toBe(truth.rearOffsetMm);
    truth.sweeps.forEach((sweep, i) => {
      const traced = traceImage({ objectMm: objects[i], frontPlaneMm: 502.5, rearPlaneMm: 498.5, focalLengthMm: 99.2 });
      expect(sweep.bestFocusPositionMm).toBeCloseTo(traced.imagePlaneMm, 9);
      expect(sweep.focus[0].magnification).toBeCloseTo(-traced.signedMagnification, 12);
    });
  });
});

describe('scenario errors', () => {
  it('names the bad option in a sentence', () => {
    const base = smallBench();
    expect(() => checkBenchScenarioOptions({ ...base, camera: { ...base.camera, pixelPitchUm: -3.45 } })).toThrow(
      'camera.pixelPitchUm must be greater than 0, got -3.45.',
    );
    expect(() => checkBenchScenarioOptions({ ...base, camera: { ...base.camera, format: 'gif' as never } })).toThrow(
      'camera.format must be one of png8, png16, jpeg, tiff16, got gif.',
    );
    expect(() => checkBenchScenarioOptions({ ...base, lens: { focalLengthMm: -50 } })).toThrow(
      'lens.focalLengthMm must be positive for finite-conjugate (a diverging lens forms no real image; use auxiliary-lens), got -50.',
    );
    expect(() => checkBenchScenarioOptions({ ...base, method: 'collimator' })).toThrow('collimator is required for the collimator method.');
    expect(() => checkBenchScenarioOptions({ ...base, badFrames: [{ frameNumber: 2, kind: 'blurry' as never }] })).toThrow(
      'badFrames[0].kind must be one of saturated, target-lost, pure-noise, truncated, undecodable, got blurry.',
    );
  });

  it('refuses geometry that forms no usable image, naming the sweep', () => {
    expect(() => planBenchMeasurement(smallBench({ sweeps: [{ objectPositionMm: 230, lensPositionMm: 300 }] }))).toThrow(
      'sweeps[0].objectPositionMm puts the target 70.000 mm from the front principal plane, not beyond the focal length 100.000 mm: no real image forms.',
    );
    expect(() =>
      planBenchMeasurement(smallBench({ method: 'displacement', sweeps: [{ objectPositionMm: 0, sensorPositionMm: 390 }] })),
    ).toThrow('sweeps[0]: the object–sensor distance 390.000 mm must exceed 4f = 400.000 mm (plus the principal-plane separation) for two sharp lens positions.');
    expect(() => planBenchMeasurement(smallBench({ target: { pattern: 'dot-pair', sizeMm: 5 } }))).toThrow(/leaves the 640×480 px frame/);
    expect(() => planBenchMeasurement({ ...smallBench(), badFrames: [{ frameNumber: 9, kind: 'saturated' }] })).toThrow(
      'A bad frame was asked for at frame 9 of sweep 1, which has only 5 frames.',
    );
  });
});

describe('command line', () => {
  it('parseBadFrames reads [sweep/]frame:kind lists', () => {
    expect(parseBadFrames('3:saturated, 2/7:truncated')).toEqual([
      { frameNumber: 3, kind: 'saturated' },
      { sweepNumber: 2, frameNumber: 7, kind: 'truncated' },
    ]);
    expect(() => parseBadFrames('3-saturated')).toThrow('--bad: "3-saturated" is not [sweep/]frame:kind (e.g. 3:saturated or 2/7:truncated).');
  });

  it('writes a preset measurement with progress on stderr only, and fails a bad option with one line', async () => {
    const run = promisify(execFile);
    const folder = await freshFolder();
    const cli = path.join(import.meta.dirname, 'cli.ts');
    const args = ['--import', 'tsx', cli, '--preset', 'collimator', '--out', folder, '--frames', '2', '--width', '800', '--height', '600'];
    const { stdout, stderr } = await run(process.execPath, [...args, '--bad', '2:undecodable', '--seed', '9'], { cwd: path.resolve(import.meta.dirname, '../..') });
    expect(stdout).toBe('');
    expect(stderr).toMatch(/frame 2\/2 s1\/0002\.jpg at [\d.]+ mm \(undecodable\)/);
    const truth = JSON.parse(await readFile(path.join(folder, 'truth.json'), 'utf8'));
    expect(truth).toMatchObject({ method: 'collimator', seed: 9, badFrames: [{ file: 's1/0002.jpg', kind: 'undecodable' }] });
    expect((await sharp(path.join(folder, 's1/0001.jpg')).metadata()).width).toBe(800);

    const failed = await run(process.execPath, [...args, '--format', 'webp'], { cwd: path.resolve(import.meta.dirname, '../..') }).catch((e) => e);
    expect(failed.code).toBe(1);
    expect(failed.stderr).toBe('camera.format must be one of png8, png16, jpeg, tiff16, got webp.\n');
  });
});

/**
 * The command line's contract for bad input (see the README's command-line
 * section): a user error gives one clear line on stderr, nothing on stdout
 * and a non-zero exit; a frame that cannot be used is left out and listed
 * with its reason, and the measurement still succeeds.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, symlinkSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { cachedBenchMeasurement as benchFixture } from '../../../scripts/synth/cached-bench-measurement';

const root = path.resolve(import.meta.dirname, '../../..');

function runMeasure(folder: string | null): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const args = ['--import', 'tsx', 'server/cli/measure.ts', ...(folder ? [folder] : [])];
    const child = spawn(process.execPath, args, { cwd: root, env: { ...process.env, PARAXIA_DEBUG: '' } });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code: code ?? -1, stdout, stderr }));
  });
}

/** A copy of a fixture's manifest, changed, beside links to its frame folders. */
function withChangedManifest(fixture: { folder: string; manifest: Record<string, any> }, change: (m: any) => void): string {
  const folder = mkdtempSync(path.join(os.tmpdir(), 'paraxia-bad-'));
  for (const sweep of ['s1', 's2', 's3']) {
    try {
      symlinkSync(path.join(fixture.folder, sweep), path.join(folder, sweep));
    } catch {
      /* fewer sweeps */
    }
  }
  const manifest = structuredClone(fixture.manifest);
  change(manifest);
  writeFileSync(path.join(folder, 'measurement.json'), JSON.stringify(manifest));
  return folder;
}

const lastLine = (text: string) => text.trim().split('\n').at(-1) ?? '';

// Generating and analysing full sweeps takes tens of seconds on a busy machine.
describe('npm run measure on bad input', { timeout: 400_000 }, () => {
  it('prints usage and exits 2 without a folder', async () => {
    const run = await runMeasure(null);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/^usage: npm run measure -- <folder>/);
  });

  it('names the bad manifest field, exits 1, prints nothing on stdout and no stack trace', async () => {
    const fixture = await benchFixture('finite-conjugate');
    const folder = withChangedManifest(fixture, (m) => (m.camera.pixelPitchUm = -3.45));
    const run = await runMeasure(folder);
    expect(run.code).toBe(1);
    expect(run.stdout).toBe('');
    expect(lastLine(run.stderr)).toBe('measure: invalid manifest: camera.pixelPitchUm: pixelPitchUm must be greater than zero');
    expect(run.stderr).not.toMatch(/\n\s+at /);
  });

  it('names a frame file that does not exist', async () => {
    const fixture = await benchFixture('finite-conjugate');
    const folder = withChangedManifest(fixture, (m) => (m.sweeps[0].frames[4].file = 's1/9999.png'));
    const run = await runMeasure(folder);
    expect(run.code).toBe(1);
    expect(run.stdout).toBe('');
    expect(lastLine(run.stderr)).toBe('measure: frame file not found: s1/9999.png');
  });

  it('says measurement.json is not JSON', async () => {
    const folder = mkdtempSync(path.join(os.tmpdir(), 'paraxia-bad-'));
    writeFileSync(path.join(folder, 'measurement.json'), '{ "method": ');
    const run = await runMeasure(folder);
    expect(run.code).toBe(1);
    expect(lastLine(run.stderr)).toMatch(/^measure: invalid manifest: measurement\.json is not valid JSON/);
  });

  it('leaves out a truncated JPEG, an undecodable file, a pure-noise and a saturated frame with their reasons, and still measures', async () => {
    const fixture = await benchFixture('collimator', (s) => ({
      ...s,
      badFrames: [
        { frameNumber: 2, kind: 'truncated' },
        { frameNumber: 4, kind: 'undecodable' },
        { frameNumber: 21, kind: 'pure-noise' },
        { frameNumber: 23, kind: 'saturated' },
      ],
    }));
    const run = await runMeasure(fixture.folder);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.stdout); // stdout is one JSON document and nothing else
    const rejected = Object.fromEntries(result.sweeps[0].framesRejected.map((r: any) => [r.file, r.reason]));
    expect(rejected).toEqual({
      's1/0002.jpg': 'undecodable',
      's1/0004.jpg': 'undecodable',
      's1/0021.jpg': 'target-lost',
      's1/0023.jpg': 'saturated',
    });
    expect(result.sweeps[0].framesUsed).toBe(21);
    expect(Math.abs(result.focalLengthMm - fixture.truth.focalLengthMm) / fixture.truth.focalLengthMm).toBeLessThan(0.003);
  });

  it('fails with "target not found" when no frame shows the target', async () => {
    const fixture = await benchFixture('finite-conjugate', (s) => ({
      ...s,
      camera: { ...s.camera, widthPx: 800, heightPx: 600 },
      target: { ...s.target, sizeMm: 2.4, dotDiameterMm: 0.5 },
      sweeps: [{ ...s.sweeps[0], framesPerFocus: 9 }],
      badFrames: Array.from({ length: 9 }, (_, i) => ({ frameNumber: i + 1, kind: 'target-lost' as const })),
    }));
    const run = await runMeasure(fixture.folder);
    expect(run.code).toBe(1);
    expect(run.stdout).toBe('');
    expect(lastLine(run.stderr)).toBe('measure: target not found: no frame of the sweep shows a dot-pair target');
  });

  it('finds no focus peak on a displacement bench whose object–sensor distance is under 4f', async () => {
    const fixture = await benchFixture('displacement', (s) => ({
      ...s,
      lens: { ...s.lens, fNumber: 32 },
      sweeps: [{ objectPositionMm: 0, sensorPositionMm: 380, positionsMm: Array.from({ length: 30 }, (_, i) => 160 + i * 2) }],
    }));
    expect(fixture.truth.sweeps[0].sharpLensPositionsMm).toBeNull();
    const run = await runMeasure(fixture.folder);
    expect(run.code).toBe(1);
    expect(run.stdout).toBe('');
    expect(lastLine(run.stderr)).toMatch(/^measure: no focus peak in sweep 1: .*object-to-sensor distance must exceed four focal lengths\)$/);
  });
});

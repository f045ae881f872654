/**
 * End to end on generated sweeps: the synthetic bench (scripts/synth) renders
 * frames from a paraxial thick-lens model with known truth; the engine must
 * recover it. Limits from the engine's requirements: focal length within
 * 0.3 % of truth and within the stated expanded uncertainty, magnification
 * within 0.2 %, principal-plane offsets within 0.5 mm.
 */
import { describe, expect, it } from 'vitest';
import { measureFolder } from '../../../server/measure/measure-folder';
import { cachedBenchMeasurement as benchFixture } from '../../../scripts/synth/cached-bench-measurement';
import type { BenchPresetName } from '../../../scripts/synth/presets';

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

const measured = new Map<BenchPresetName, ReturnType<typeof measureOnce>>();
async function measureOnce(preset: BenchPresetName) {
  const fixture = await benchFixture(preset);
  const result = await measureFolder(fixture.folder, { monteCarloDraws: 20_000 });
  return { fixture, result };
}
/** Each preset is generated and measured once per file, however many checks read it. */
function measurePreset(preset: BenchPresetName) {
  if (!measured.has(preset)) measured.set(preset, measureOnce(preset));
  return measured.get(preset)!;
}

// Generating and analysing full sweeps takes tens of seconds on a busy machine.
describe('the engine recovers the generated truth for every method', { timeout: 400_000 }, () => {
  for (const preset of ['finite-conjugate', 'square-target', 'light-on-dark', 'collimator', 'auxiliary-lens'] as const) {
    it(`${preset}: focal length within 0.3 % and within U, magnification within 0.2 %`, async () => {
      const { fixture, result } = await measurePreset(preset);
      const truth = fixture.truth;
      expect(relative(result.focalLengthMm, truth.focalLengthMm)).toBeLessThan(0.003);
      expect(Math.abs(result.focalLengthMm - truth.focalLengthMm)).toBeLessThanOrEqual(result.expandedUncertaintyMm);
      const sweep = result.sweeps[0];
      expect(sweep.framesUsed).toBe(fixture.manifest.sweeps[0].frames.length);
      if (preset === 'collimator') {
        expect(sweep.magnification).toBeNull();
        expect(Math.abs((result.backFocalDistanceMm as number) - (truth.backFocalDistanceMm as number))).toBeLessThan(0.05);
      } else {
        expect(relative(sweep.magnification as number, truth.sweeps[0].focus[0].magnification)).toBeLessThan(0.002);
      }
      expect(Math.abs((sweep.bestFocusPositionMm as number) - (truth.sweeps[0].bestFocusPositionMm as number))).toBeLessThan(0.05);
      // The budget is a real budget: contributions add in quadrature to the combined uncertainty (no correlated inputs here).
      const quadrature = Math.sqrt(result.uncertaintyBudget.reduce((s, row) => s + row.contributionMm ** 2, 0));
      expect(quadrature).toBeCloseTo(result.standardUncertaintyMm, 6);
      expect(result.opticalPowerDioptres).toBeCloseTo(1000 / result.focalLengthMm, 9);
    });
  }

  it('auxiliary-lens: a diverging lens comes out negative', async () => {
    const { result } = await measurePreset('auxiliary-lens');
    expect(result.focalLengthMm).toBeLessThan(0);
    expect(result.opticalPowerDioptres).toBeLessThan(0);
  });

  it('multi-conjugate: f within 0.3 % and U, both principal-plane offsets within 0.5 mm', async () => {
    const { fixture, result } = await measurePreset('multi-conjugate');
    const truth = fixture.truth;
    expect(relative(result.focalLengthMm, truth.focalLengthMm)).toBeLessThan(0.003);
    expect(Math.abs(result.focalLengthMm - truth.focalLengthMm)).toBeLessThanOrEqual(result.expandedUncertaintyMm);
    expect(result.principalPlanes).toBeDefined();
    expect(Math.abs(result.principalPlanes!.frontOffsetMm - truth.frontOffsetMm)).toBeLessThan(0.5);
    expect(Math.abs(result.principalPlanes!.rearOffsetMm - truth.rearOffsetMm)).toBeLessThan(0.5);
    result.sweeps.forEach((sweep, i) => {
      expect(relative(sweep.magnification as number, truth.sweeps[i].focus[0].magnification)).toBeLessThan(0.002);
    });
  });

  it('displacement: two sharp lens positions found and f within 0.3 % and U', async () => {
    const { fixture, result } = await measurePreset('displacement');
    const truth = fixture.truth;
    expect(relative(result.focalLengthMm, truth.focalLengthMm)).toBeLessThan(0.003);
    expect(Math.abs(result.focalLengthMm - truth.focalLengthMm)).toBeLessThanOrEqual(result.expandedUncertaintyMm);
    const [p1, p2] = result.sweeps[0].bestFocusPositionsMm as [number, number];
    const [t1, t2] = truth.sweeps[0].sharpLensPositionsMm as [number, number];
    expect(Math.abs(p1 - t1)).toBeLessThan(0.1);
    expect(Math.abs(p2 - t2)).toBeLessThan(0.1);
  });
});

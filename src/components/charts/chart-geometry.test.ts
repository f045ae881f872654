import { scaleLinear } from 'd3-scale';
import { describe, expect, it } from 'vitest';
import { convertedAxisTicks, linearAxisTicks } from '@/components/charts/axis-ticks';
import { formatFixed, formatSignificant } from '@/components/charts/chart-format';
import { plotArea } from '@/components/charts/plot-area';
import { interpolateCurve, positionToPx, sweepPositionAxis } from '@/components/charts/sweep-plot-data';
import { sampleDisplacementResult, sampleResult } from '@/features/measurement-result/fixtures/sample-result';

describe('plotArea', () => {
  it('plotArea leaves the margins around an inner rectangle', () => {
    const area = plotArea({ widthPx: 400, heightPx: 300, marginsPx: { top: 10, right: 20, bottom: 30, left: 40 } });
    expect(area).toMatchObject({ leftPx: 40, rightPx: 380, topPx: 10, bottomPx: 270, innerWidthPx: 340, innerHeightPx: 260 });
  });

  it('plotArea names margins that leave no room', () => {
    expect(() => plotArea({ widthPx: 50, heightPx: 300, marginsPx: { top: 10, right: 20, bottom: 30, left: 40 } })).toThrow(
      'plotArea: options "marginsPx" leave no room for the plot in 50 × 300 px.',
    );
  });
});

describe('axis ticks', () => {
  it('linearAxisTicks places each tick at the scale of its value and prints a true minus sign', () => {
    const scale = scaleLinear().domain([-1, 1]).range([0, 200]);
    const ticks = linearAxisTicks(scale, 4);
    expect(ticks.map((t) => t.label)).toEqual(['\u22121.0', '\u22120.5', '0.0', '0.5', '1.0']);
    expect(ticks.map((t) => t.positionPx)).toEqual([0, 50, 100, 150, 200]);
  });

  it('convertedAxisTicks puts a second unit at the pixel of the equivalent first-unit value', () => {
    const px = scaleLinear().domain([800, 1000]).range([300, 0]);
    const pitchMm = 0.00345;
    for (const tick of convertedAxisTicks(px, (v) => v * pitchMm, 5)) {
      expect(tick.positionPx).toBeCloseTo(px(Number(tick.label) / pitchMm), 9);
    }
  });
});

describe('sweepPositionAxis', () => {
  it('sweepPositionAxis keeps a single-peak sweep on one axis covering every frame', () => {
    const sweep = sampleResult.sweeps[0];
    const segments = sweepPositionAxis({ sweep, leftPx: 0, rightPx: 500 });
    expect(segments).toHaveLength(1);
    const positions = sweep.frames!.map((f) => f.positionMm);
    expect(segments[0].domainMm[0]).toBeLessThan(Math.min(...positions));
    expect(segments[0].domainMm[1]).toBeGreaterThan(Math.max(...positions));
  });

  it('sweepPositionAxis breaks a displacement sweep into two equal panels, one per group of frames', () => {
    const sweep = sampleDisplacementResult.sweeps[0];
    const segments = sweepPositionAxis({ sweep, leftPx: 0, rightPx: 522, gapPx: 22 });
    expect(segments).toHaveLength(2);
    expect(segments[0].rightPx - segments[0].leftPx).toBeCloseTo(segments[1].rightPx - segments[1].leftPx, 9);
    const [z1, z2] = sweep.bestFocusPositionsMm!;
    expect(positionToPx(segments, z1)).toBeLessThan(segments[0].rightPx);
    expect(positionToPx(segments, z2)).toBeGreaterThan(segments[1].leftPx);
  });

  it('interpolateCurve reads a sampled curve linearly and returns null outside it', () => {
    const curve = [
      { positionMm: 1, value: 10 },
      { positionMm: 3, value: 30 },
    ];
    expect(interpolateCurve(curve, 2.5)).toBe(25);
    expect(interpolateCurve(curve, 3.5)).toBeNull();
  });
});

describe('chart number formats', () => {
  it('formatFixed and formatSignificant print a true minus sign and never "−0"', () => {
    expect(formatFixed(-1.234, 2)).toBe('\u22121.23');
    expect(formatFixed(-0.0004, 2)).toBe('0.00');
    expect(formatSignificant(-0.4462, 3)).toBe('\u22120.446');
    expect(formatSignificant(0.00001234, 2)).toBe('1.2×10⁻⁵');
  });
});

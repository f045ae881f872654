import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { Mtf50ThroughFocusPlot } from '@/components/charts/mtf50-through-focus-plot';
import { SizeThroughFocusPlot, sizeThroughFocusLayout } from '@/components/charts/size-through-focus-plot';
import {
  SAMPLE_PIXEL_PITCH_UM,
  sampleDisplacementResult,
  sampleResult,
} from '@/features/measurement-result/fixtures/sample-result';

function tags(html: string, tag: string): Record<string, string>[] {
  return [...html.matchAll(new RegExp(`<${tag}\\b([^>]*)>`, 'g'))].map((m) =>
    Object.fromEntries([...m[1].matchAll(/([\w:-]+)="([^"]*)"/g)].map((a) => [a[1], a[2]])),
  );
}

/** Tick labels of one axis group (`data-axis="…"`) with their pixel positions from the translate(). */
function axisTicks(html: string, axis: string): { positionPx: number; value: number }[] {
  const start = html.indexOf(`data-axis="${axis}"`);
  const next = html.indexOf('data-axis=', start + 10);
  const end = next === -1 ? html.length : next;
  const section = html.slice(start, end);
  return [...section.matchAll(/translate\(([^,]+),([^)]+)\)"><line[^>]*><\/line><text[^>]*>([^<]+)<\/text>/g)].map((m) => ({
    positionPx: axis.startsWith('y') ? Number(m[2]) : Number(m[1]),
    value: Number(m[3].replace('\u2212', '-').replace(/,/g, '')),
  }));
}

const sweep = sampleResult.sweeps[0];
const WIDTH_PX = 600;

describe('SizeThroughFocusPlot', () => {
  const html = renderToStaticMarkup(
    <SizeThroughFocusPlot sweep={sweep} sweepLabel="sweep 1" pixelPitchUm={SAMPLE_PIXEL_PITCH_UM} widthPx={WIDTH_PX} />,
  );

  it('SizeThroughFocusPlot marks the size at best focus on the drawn fitted line', () => {
    const fit = sweep.sizeFits![0];
    const layout = sizeThroughFocusLayout({ sweep, peakIndex: 0, widthPx: WIDTH_PX, pixelPitchUm: SAMPLE_PIXEL_PITCH_UM });
    const marker = tags(html, 'circle').find((c) => c['data-role'] === 'size-at-best-focus')!;
    expect(Number(marker.cx)).toBeCloseTo(layout.xScale(sweep.bestFocusPositionMm!), 9);
    expect(Number(marker.cy)).toBeCloseTo(layout.yScale(fit.sizeAtBestFocusPx), 9);
    const line = tags(html, 'line').find((l) => l['data-role'] === 'fitted-line')!;
    const t = (Number(marker.cx) - Number(line.x1)) / (Number(line.x2) - Number(line.x1));
    expect(Number(marker.cy)).toBeCloseTo(Number(line.y1) + t * (Number(line.y2) - Number(line.y1)), 6);
  });

  it('SizeThroughFocusPlot puts its mm axis where size in px × pixel pitch falls on the px axis', () => {
    const px = axisTicks(html, 'y');
    const mm = axisTicks(html, 'y2');
    expect(px.length).toBeGreaterThan(2);
    expect(mm.length).toBeGreaterThan(1);
    // Linear map px value → pixel position, read from two ticks of the px axis.
    const [a, b] = [px[0], px[px.length - 1]];
    const pixelOf = (valuePx: number) => a.positionPx + ((valuePx - a.value) / (b.value - a.value)) * (b.positionPx - a.positionPx);
    for (const tick of mm) expect(tick.positionPx).toBeCloseTo(pixelOf(tick.value / (SAMPLE_PIXEL_PITCH_UM / 1000)), 4);
  });

  it('SizeThroughFocusPlot labels both size axes with their units', () => {
    expect(html).toMatch(/Image size y′<tspan[^>]*data-unit="true"> \/ px<\/tspan>/);
    expect(html).toMatch(/y′<tspan[^>]*data-unit="true"> \/ mm<\/tspan>/);
    expect(html).toMatch(/Rail position z<tspan[^>]*data-unit="true"> \/ mm<\/tspan>/);
  });

  it('SizeThroughFocusPlot shows each displacement peak on its own stretch of rail', () => {
    const displacement = sampleDisplacementResult.sweeps[0];
    const near = sizeThroughFocusLayout({ sweep: displacement, peakIndex: 1, widthPx: WIDTH_PX });
    const [low, high] = near.xScale.domain();
    expect(low).toBeLessThan(displacement.bestFocusPositionsMm![1]);
    expect(high).toBeGreaterThan(displacement.bestFocusPositionsMm![1]);
    expect(low).toBeGreaterThan(displacement.bestFocusPositionsMm![0]);
    expect(near.frames.every((f) => f.positionMm >= low && f.positionMm <= high)).toBe(true);
  });

  it('sizeThroughFocusLayout names a peak index the sweep does not have', () => {
    expect(() => sizeThroughFocusLayout({ sweep, peakIndex: 1, widthPx: WIDTH_PX })).toThrow(
      'sizeThroughFocusLayout: option "peakIndex" must index one of the sweep\'s 1 size fits; got 1.',
    );
  });
});

describe('Mtf50ThroughFocusPlot', () => {
  it('Mtf50ThroughFocusPlot renders nothing when no frame has an MTF50 value', () => {
    expect(renderToStaticMarkup(<Mtf50ThroughFocusPlot sweep={sampleDisplacementResult.sweeps[0]} sweepLabel="sweep 1" />)).toBe('');
  });

  it('Mtf50ThroughFocusPlot converts cycles per pixel to line pairs per mm through the pixel pitch', () => {
    const html = renderToStaticMarkup(
      <Mtf50ThroughFocusPlot sweep={sweep} sweepLabel="sweep 1" pixelPitchUm={SAMPLE_PIXEL_PITCH_UM} widthPx={WIDTH_PX} />,
    );
    const cyclesPerPixel = axisTicks(html, 'y');
    const linePairsPerMm = axisTicks(html, 'y2');
    const [a, b] = [cyclesPerPixel[0], cyclesPerPixel[cyclesPerPixel.length - 1]];
    const pixelOf = (value: number) => a.positionPx + ((value - a.value) / (b.value - a.value)) * (b.positionPx - a.positionPx);
    // lp/mm = (cycles/pixel) / (pixel pitch in mm): 0.1 cy/px at 3.45 µm is 28.99 lp/mm (arithmetic).
    for (const tick of linePairsPerMm) expect(tick.positionPx).toBeCloseTo(pixelOf(tick.value * (SAMPLE_PIXEL_PITCH_UM / 1000)), 4);
    expect(html).toMatch(/MTF50<tspan[^>]*data-unit="true"> \/ cy\/px<\/tspan>/);
    expect(html).toMatch(/MTF50<tspan[^>]*data-unit="true"> \/ lp\/mm<\/tspan>/);
    const drawn = tags(html, 'circle').filter((c) => c['data-mark'] === 'used').length + tags(html, 'path').filter((p) => p['data-mark'] === 'rejected').length;
    expect(drawn).toBe(sweep.frames!.filter((f) => f.mtf50CyclesPerPixel !== null).length);
  });
});

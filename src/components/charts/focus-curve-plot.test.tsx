import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { FocusCurvePlot } from '@/components/charts/focus-curve-plot';
import { focusCurveLayout } from '@/components/charts/focus-curve-layout';
import { sampleDisplacementResult, sampleResult } from '@/features/measurement-result/fixtures/sample-result';

/** Attributes of every opening tag `<tag …>` in static markup, in document order. */
function tags(html: string, tag: string): Record<string, string>[] {
  return [...html.matchAll(new RegExp(`<${tag}\\b([^>]*)>`, 'g'))].map((m) =>
    Object.fromEntries([...m[1].matchAll(/([\w:-]+)="([^"]*)"/g)].map((a) => [a[1], a[2]])),
  );
}

const sweep = sampleResult.sweeps[0];
const k = sampleResult.coverageFactor;
const WIDTH_PX = 800;

describe('FocusCurvePlot', () => {
  const html = renderToStaticMarkup(<FocusCurvePlot sweep={sweep} sweepLabel="sweep 1" coverageFactor={k} widthPx={WIDTH_PX} />);
  const usedPoints = tags(html, 'circle').filter((c) => c['data-mark'] === 'used');

  it('FocusCurvePlot draws the best-focus marker at the x scale of bestFocusPositionMm', () => {
    const bestFocusMm = sweep.focusFits![0].bestFocusPositionMm;
    const marker = tags(html, 'g').find((g) => g['data-role'] === 'best-focus-marker')!;
    const layout = focusCurveLayout({ sweep, widthPx: WIDTH_PX, coverageFactor: k });
    expect(Number(marker['data-x-px'])).toBeCloseTo(layout.xPx(bestFocusMm), 9);

    // Independent of the layout code: interpolate between the two drawn frames that bracket best focus.
    const points = usedPoints.map((p) => ({ mm: Number(p['data-position-mm']), x: Number(p.cx) })).sort((a, b) => a.mm - b.mm);
    const after = points.findIndex((p) => p.mm > bestFocusMm);
    const [a, b] = [points[after - 1], points[after]];
    const expectedX = a.x + ((bestFocusMm - a.mm) / (b.mm - a.mm)) * (b.x - a.x);
    expect(Number(marker['data-x-px'])).toBeCloseTo(expectedX, 6);
    const verticalLine = html.match(/data-role="best-focus-marker"[^>]*><line x1="([^"]+)"/)!;
    expect(Number(verticalLine[1])).toBeCloseTo(expectedX, 6);
  });

  it('FocusCurvePlot shades a band exactly ± k·u wide around best focus', () => {
    const u = sweep.focusFits![0].standardUncertaintyMm;
    const points = usedPoints.map((p) => ({ mm: Number(p['data-position-mm']), x: Number(p.cx) })).sort((a, b) => a.mm - b.mm);
    const pxPerMm = (points[points.length - 1].x - points[0].x) / (points[points.length - 1].mm - points[0].mm);
    const band = html.match(/data-role="best-focus-band"[^>]*><rect x="([^"]+)" width="([^"]+)"/)!;
    expect(Number(band[2])).toBeCloseTo(2 * k * u * pxPerMm, 6);
  });

  it('FocusCurvePlot draws rejected frames as hollow diamonds whose tooltip gives the reason', () => {
    const rejectedMarks = [...html.matchAll(/<path([^>]*data-mark="rejected"[^>]*)><title>([^<]*)<\/title>/g)];
    const withValue = sweep.frames!.filter((f) => f.status === 'rejected' && f.focusValue !== null);
    expect(rejectedMarks).toHaveLength(withValue.length);
    for (const [, attributes, title] of rejectedMarks) {
      expect(attributes).toContain('fill="var(--color-sheet)"');
      expect(attributes).toMatch(/d="M[^"]+Z"/);
    }
    const saturated = rejectedMarks.find(([, attributes]) => attributes.includes('data-file="s1/0004.png"'))!;
    expect(saturated[2]).toContain('rejected: saturated (clipped highlights)');
    expect(saturated[2]).toContain('3.4 % of the region at full scale');
    expect(html).toContain('Not drawn (no focus value): s1/0023.png');
  });

  it('FocusCurvePlot puts each residual on the same x as its frame and draws a zero line', () => {
    const residualGroups = [...html.matchAll(/data-role="residual" data-file="([^"]+)"><line x1="([^"]+)"/g)];
    expect(residualGroups.length).toBe(sweep.frames!.filter((f) => f.focusResidual !== null).length);
    for (const [, file, x] of residualGroups) {
      const point = usedPoints.find((p) => p['data-file'] === file)!;
      expect(Number(x)).toBeCloseTo(Number(point.cx), 9);
    }
    const zero = tags(html, 'line').find((l) => l['data-role'] === 'residual-zero-line')!;
    expect(zero.y1).toBe(zero.y2);
  });

  it('FocusCurvePlot labels its axes with their units', () => {
    expect(html).toMatch(/data-axis-title="true">Rail position z<tspan[^>]*data-unit="true"> \/ mm<\/tspan>/);
    expect(html).toMatch(/data-axis-title="true">Focus measure<tspan[^>]*data-unit="true"> \/ rel\.<\/tspan>/);
  });

  it('FocusCurvePlot rings the selected frame in the signal colour', () => {
    const selected = renderToStaticMarkup(
      <FocusCurvePlot sweep={sweep} sweepLabel="sweep 1" coverageFactor={k} widthPx={WIDTH_PX} selectedFile="s1/0012.png" />,
    );
    const ring = tags(selected, 'circle').find((c) => c['data-role'] === 'selected-frame')!;
    const point = usedPoints.find((p) => p['data-file'] === 's1/0012.png')!;
    expect(ring.stroke).toBe('var(--color-focus)');
    expect([ring.cx, ring.cy]).toEqual([point.cx, point.cy]);
  });

  it('FocusCurvePlot draws two markers on a broken axis for a displacement sweep, each inside its own panel', () => {
    const displacement = sampleDisplacementResult.sweeps[0];
    const markup = renderToStaticMarkup(<FocusCurvePlot sweep={displacement} sweepLabel="sweep 1" coverageFactor={2} widthPx={WIDTH_PX} />);
    const markers = tags(markup, 'g').filter((g) => g['data-role'] === 'best-focus-marker');
    expect(markers.map((m) => Number(m['data-position-mm']))).toEqual(displacement.bestFocusPositionsMm);
    const layout = focusCurveLayout({ sweep: displacement, widthPx: WIDTH_PX, coverageFactor: 2 });
    expect(layout.panels).toHaveLength(2);
    markers.forEach((marker, index) => {
      const x = Number(marker['data-x-px']);
      expect(x).toBeGreaterThan(layout.panels[index].segment.leftPx);
      expect(x).toBeLessThan(layout.panels[index].segment.rightPx);
    });
    expect(markup).toContain('data-role="axis-break"');
    expect(markup).toContain('z₁ = 129.');
    expect(markup).toContain('z₂ = 470.');
  });

  it('focusCurveLayout names the bad option in its error', () => {
    expect(() => focusCurveLayout({ sweep, widthPx: WIDTH_PX, coverageFactor: 0 })).toThrow(
      'focusCurveLayout: option "coverageFactor" must be a positive number; got 0.',
    );
  });
});

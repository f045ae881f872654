import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { ToleranceSpreadPlot, toleranceSpreadLayout, type ToleranceSpreadLens } from '@/components/charts/tolerance-spread-plot';

const LIMITS = { nominalFocalLengthMm: 50, lowerLimitMm: 49.5, upperLimitMm: 50.5 };
const LENSES: ToleranceSpreadLens[] = [
  { identifier: 'QA-01', focalLengthMm: 50.1, expandedUncertaintyMm: 0.05 },
  { identifier: 'QA-02', focalLengthMm: 50.72, expandedUncertaintyMm: 0.05 }, // outside the band
  { identifier: 'QA-03', focalLengthMm: 49.47, expandedUncertaintyMm: 0.05 }, // just below the lower limit
  { identifier: 'QA-04', focalLengthMm: 50.48, expandedUncertaintyMm: 0.05 }, // inside, but within U of the upper limit
];
const SUMMARY = { meanMm: 50.19, standardDeviationMm: 0.55, cp: 0.3, cpk: 0.19 };

function lensGroup(html: string, identifier: string): string {
  const match = html.match(new RegExp(`<g data-lens="${identifier}"[\\s\\S]*?</g></g>`));
  if (!match) throw new Error(`no mark for ${identifier}`);
  return match[0];
}

describe('ToleranceSpreadPlot', () => {
  const render = (rule: 'simple' | 'guarded', lenses = LENSES) =>
    renderToStaticMarkup(<ToleranceSpreadPlot partNumber="QA-50" lenses={lenses} {...LIMITS} decisionRule={rule} summary={SUMMARY} widthPx={720} />);

  it('ToleranceSpreadPlot marks a value outside the tolerance band as not conforming, by word and by square-cross symbol', () => {
    const html = render('simple');
    const outside = lensGroup(html, 'QA-02');
    expect(outside).toContain('data-decision="does-not-conform"');
    expect(outside).toContain('data-symbol="square-cross"');
    expect(outside).toContain('Does not conform');
    expect(lensGroup(html, 'QA-03')).toContain('data-decision="does-not-conform"');
    const inside = lensGroup(html, 'QA-01');
    expect(inside).toContain('data-decision="conforms"');
    expect(inside).toContain('data-symbol="circle-tick"');
  });

  it('ToleranceSpreadPlot under guarded acceptance calls a value within U of a limit undecided (ILAC-G8:09/2019)', () => {
    const guarded = lensGroup(render('guarded'), 'QA-04');
    expect(guarded).toContain('data-decision="undecided"');
    expect(guarded).toContain('data-symbol="diamond-question"');
    expect(lensGroup(render('simple'), 'QA-04')).toContain('data-decision="conforms"');
  });

  it('ToleranceSpreadPlot keeps a recorded decision rather than deciding again', () => {
    const recorded = lensGroup(render('simple', [{ ...LENSES[0], decision: 'undecided' }]), 'QA-01');
    expect(recorded).toContain('data-decision="undecided"');
  });

  it('toleranceSpreadLayout puts the band between the limits and each error bar at f ± U', () => {
    const layout = toleranceSpreadLayout({ lenses: LENSES, ...LIMITS, decisionRule: 'simple', widthPx: 720 });
    const html = render('simple');
    const band = html.match(/<rect x="[^"]+" width="[^"]+" y="([^"]+)" height="([^"]+)"[^>]*data-role="tolerance-band"/)!;
    expect(Number(band[1])).toBeCloseTo(layout.yScale(LIMITS.upperLimitMm), 9);
    expect(Number(band[1]) + Number(band[2])).toBeCloseTo(layout.yScale(LIMITS.lowerLimitMm), 9);
    const mark = layout.marks[1];
    expect(mark.errorBarTopPx).toBeCloseTo(layout.yScale(50.77), 9);
    expect(mark.errorBarBottomPx).toBeCloseTo(layout.yScale(50.67), 9);
    // A higher focal length is drawn higher up (smaller y).
    expect(layout.marks[1].yPx).toBeLessThan(layout.marks[0].yPx);
  });

  it('ToleranceSpreadPlot prints the batch statistics with units and its axis title with mm', () => {
    const html = render('simple');
    expect(html).toMatch(/Focal length f′<tspan[^>]*data-unit="true"> \/ mm<\/tspan>/);
    expect(html).toContain('>50.190<');
    expect(html).toContain('>0.19<');
  });

  it('toleranceSpreadLayout names a lens listed twice', () => {
    expect(() =>
      toleranceSpreadLayout({ lenses: [LENSES[0], LENSES[0]], ...LIMITS, decisionRule: 'simple', widthPx: 720 }),
    ).toThrow('toleranceSpreadLayout: option "lenses" lists "QA-01" twice.');
  });
});

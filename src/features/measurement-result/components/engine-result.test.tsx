import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import type { MeasurementResult } from '@shared/schemas/measurement-result';
import { focusCurveLayout } from '@/components/charts/focus-curve-layout';
import { MeasurementResultView } from '@/features/measurement-result/components/measurement-result-view';
// Output of Paraxia's own engine 1.0.0 on a synthetic bench: `node --import tsx scripts/synth/cli.ts --preset square-target
// --seed 3 --bad 5:saturated --out <dir>` then `npm run measure -- <dir>` (2026-12-02). Infinite ν arrive as null (JSON).
import engineJson from '@/features/measurement-result/fixtures/engine-result-square-target.json';

const engineResult = engineJson as unknown as MeasurementResult;

describe('MeasurementResultView with a real engine result', () => {
  const html = renderToStaticMarkup(
    <MeasurementResultView
      result={engineResult}
      analysisVersion={1}
      frameWidthPx={1600}
      frameHeightPx={1200}
      thumbnailScale={0.1}
      thumbnailUrl={(file) => `/t/${file}`}
      frameUrl={(file) => `/f/${file}`}
    />,
  );

  it('MeasurementResultView draws every plot of an engine result and marks its best focus at the scale of the fitted position', () => {
    for (const plot of ['focus-curve', 'size-through-focus', 'mtf50-through-focus']) expect(html).toContain(`data-plot="${plot}"`);
    const sweep = engineResult.sweeps[0];
    const marker = html.match(/data-role="best-focus-marker" data-position-mm="([^"]+)" data-x-px="([^"]+)"/)!;
    expect(Number(marker[1])).toBe(sweep.focusFits![0].bestFocusPositionMm);
    // The view measures its width in a browser; on the server it draws at the 760 px fallback.
    const layout = focusCurveLayout({ sweep, widthPx: 760, coverageFactor: engineResult.coverageFactor });
    expect(Number(marker[2])).toBeCloseTo(layout.xPx(sweep.focusFits![0].bestFocusPositionMm), 9);
  });

  it('MeasurementResultView lists the engine\'s rejected frame with its reason and prints ∞ for its Type B inputs', () => {
    expect(html).toContain('Saturated (clipped highlights)');
    expect(html).toContain('>∞<');
    const shares = [...html.matchAll(/data-share="([^"]+)"/g)].map((m) => Number(m[1]));
    expect(shares).toHaveLength(engineResult.uncertaintyBudget.length);
    expect(shares.reduce((s, v) => s + v, 0)).toBeCloseTo(1, 12);
  });
});

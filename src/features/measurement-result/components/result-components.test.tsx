import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import type { MeasurementResult } from '@shared/schemas/measurement-result';
import { MeasurementResultView, pixelPitchFromSweep } from '@/features/measurement-result/components/measurement-result-view';
import { RejectedFramesList, rejectedFrameRows } from '@/features/measurement-result/components/rejected-frames-list';
import { ResultHeadline } from '@/features/measurement-result/components/result-headline';
import { WarningsList } from '@/features/measurement-result/components/warnings-list';
import { SAMPLE_PIXEL_PITCH_UM, sampleDisplacementResult, sampleResult } from '@/features/measurement-result/fixtures/sample-result';

describe('ResultHeadline', () => {
  const html = renderToStaticMarkup(<ResultHeadline result={sampleResult} analysisVersion={4} />);

  it('ResultHeadline gives f′ ± U with U to two significant digits, k, coverage and the analysis version', () => {
    // GUM (JCGM 100:2008, 7.2.6): U to at most two significant digits, value to the same decimal place.
    const decimals = 1 - Math.floor(Math.log10(sampleResult.expandedUncertaintyMm));
    expect(html).toContain(`>${sampleResult.focalLengthMm.toFixed(decimals)}<`);
    expect(html).toContain(`>± ${sampleResult.expandedUncertaintyMm.toFixed(decimals)}<`);
    expect(html).toContain(`k = <span class="numerals">${sampleResult.coverageFactor.toFixed(2)}</span>`);
    expect(html).toContain('coverage probability ≈ 95 %');
    expect(html).toContain('analysis version 4');
  });

  it('ResultHeadline shows optical power in dioptres and conformity by word with its decision rule', () => {
    expect(html).toContain('>D</span>');
    expect(html).toContain('data-decision="conforms"');
    expect(html).toContain('>Conforms<');
    expect(html).toContain('Guarded acceptance with guard band w = U');
  });

  it('ResultHeadline shows back focal distance and principal planes only when the method gives them', () => {
    expect(html).not.toContain('Back focal distance');
    expect(html).not.toContain('principal plane');
    const thick: MeasurementResult = {
      ...sampleResult,
      method: 'multi-conjugate',
      principalPlanes: { frontOffsetMm: 6.02, rearOffsetMm: -4.11, frontOffsetStandardUncertaintyMm: 0.05, rearOffsetStandardUncertaintyMm: 0.06 },
      backFocalDistanceMm: 97.05,
    };
    const markup = renderToStaticMarkup(<ResultHeadline result={thick} analysisVersion={1} />);
    expect(markup).toContain('Front principal plane H');
    expect(markup).toContain('>\u22124.110<');
    expect(markup).toContain('Back focal distance');
  });

  it('ResultHeadline says when no tolerance was given', () => {
    expect(renderToStaticMarkup(<ResultHeadline result={sampleDisplacementResult} analysisVersion={1} />)).toContain(
      'No tolerance was given for this lens',
    );
  });
});

describe('WarningsList and RejectedFramesList', () => {
  it('WarningsList lists each warning and says so when there are none', () => {
    const html = renderToStaticMarkup(<WarningsList warnings={['First.', 'Second.']} />);
    expect(html.match(/<li /g)).toHaveLength(2);
    expect(renderToStaticMarkup(<WarningsList warnings={[]} />)).toContain('The analysis raised no warnings.');
  });

  it('RejectedFramesList lists every rejected frame in rail order with its position and reason', () => {
    const rows = rejectedFrameRows(sampleResult.sweeps);
    expect(rows.map((r) => r.file)).toEqual(['s1/0004.png', 's1/0010.png', 's1/0018.png', 's1/0023.png']);
    expect(rows.map((r) => r.positionMm)).toEqual([450.791, 452.291, 454.291, 455.541]);
    const html = renderToStaticMarkup(<RejectedFramesList sweeps={sampleResult.sweeps} />);
    expect(html).toContain('Rejected frames (4 of 25)');
    expect(html).toContain('Excluded by the technician');
    expect(html).toContain('Could not be decoded');
  });
});

describe('MeasurementResultView', () => {
  const props = {
    analysisVersion: 2,
    frameWidthPx: 1600,
    frameHeightPx: 1200,
    thumbnailScale: 0.1,
    thumbnailUrl: (file: string) => `/t/${file}`,
    frameUrl: (file: string) => `/f/${file}`,
  };

  it('MeasurementResultView composes the result, plots, frames, budget, warnings and rejected frames', () => {
    const html = renderToStaticMarkup(<MeasurementResultView result={sampleResult} pixelPitchUm={SAMPLE_PIXEL_PITCH_UM} {...props} />);
    for (const part of ['result-headline', 'frame-strip', 'uncertainty-budget', 'warnings', 'monte-carlo']) {
      expect(html).toContain(`data-role="${part}"`);
    }
    for (const plot of ['focus-curve', 'size-through-focus', 'mtf50-through-focus']) expect(html).toContain(`data-plot="${plot}"`);
  });

  it('MeasurementResultView leaves out the MTF50 plot for a dot-pair target and draws one size plot per displacement peak', () => {
    const html = renderToStaticMarkup(<MeasurementResultView result={sampleDisplacementResult} {...props} />);
    expect(html).not.toContain('data-plot="mtf50-through-focus"');
    expect(html.match(/data-plot="size-through-focus"/g)).toHaveLength(2);
  });

  it('pixelPitchFromSweep reads the pitch back from the image size in mm and in px', () => {
    expect(pixelPitchFromSweep(sampleResult.sweeps[0])).toBeCloseTo(SAMPLE_PIXEL_PITCH_UM, 9);
    expect(pixelPitchFromSweep(sampleDisplacementResult.sweeps[0])).toBeUndefined();
  });
});

import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { CalibrationStateMark } from '@/features/equipment/components/calibration-state-mark';

describe('CalibrationStateMark', () => {
  it('CalibrationStateMark tells the three states apart by word and by glyph shape, not colour alone', () => {
    const html = [
      renderToStaticMarkup(<CalibrationStateMark due={{ state: 'current', daysLeft: 90, text: 'Current' }} />),
      renderToStaticMarkup(<CalibrationStateMark due={{ state: 'due-soon', daysLeft: 12, text: 'Due in 12 days' }} />),
      renderToStaticMarkup(<CalibrationStateMark due={{ state: 'overdue', daysLeft: -28, text: 'Overdue since 2026-11-03' }} />),
    ];
    expect(html.map((markup) => /data-glyph="([^"]+)"/.exec(markup)?.[1])).toEqual(['calibration-current', 'calibration-due-soon', 'calibration-overdue']);
    expect(html[1]).toContain('>Due in 12 days<');
    expect(html[2]).toContain('>Overdue since 2026-11-03<');
    expect(html[2]).toContain('title="28 days past its calibration due date"');
  });
});

import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { workOrderStatuses } from '@shared/schemas/work-orders';
import { DueDateText } from '@/features/work-orders/components/due-date-text';
import { WorkOrderStatusMark } from '@/features/work-orders/components/work-order-status-mark';

describe('WorkOrderStatusMark', () => {
  it('WorkOrderStatusMark gives every status its own word and its own glyph', () => {
    const html = workOrderStatuses.map((status) => renderToStaticMarkup(<WorkOrderStatusMark status={status} />));
    const glyphs = html.map((markup) => /data-glyph="([^"]+)"/.exec(markup)?.[1]);
    expect(new Set(glyphs).size).toBe(workOrderStatuses.length);
    expect(html.map((markup) => />([A-Z][a-z ]+)<\/span>/.exec(markup)?.[1])).toEqual(['Requested', 'Open', 'In progress', 'Completed', 'Cancelled']);
  });
});

describe('DueDateText', () => {
  it('DueDateText marks an open order past its date as late, by glyph and words', () => {
    const html = renderToStaticMarkup(<DueDateText dueDate="2026-11-28" status="open" todayIsoDate="2026-12-01" />);
    expect(html).toContain('data-due="overdue"');
    expect(html).toContain('data-glyph="late"');
    expect(html).toContain('3 days late');
  });

  it('DueDateText does not mark a completed order late', () => {
    const html = renderToStaticMarkup(<DueDateText dueDate="2026-11-28" status="completed" todayIsoDate="2026-12-01" />);
    expect(html).toContain('data-due="closed"');
    expect(html).not.toContain('late');
  });
});

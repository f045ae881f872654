import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { ConformityMark, type ConformityDecision } from '@/components/ui/conformity-mark';
import { Quantity } from '@/components/ui/quantity';

describe('ConformityMark', () => {
  it('ConformityMark shows each decision by word and by a glyph of a different shape, not colour alone', () => {
    const decisions: ConformityDecision[] = ['conforms', 'does-not-conform', 'undecided'];
    const rendered = decisions.map((decision) => renderToStaticMarkup(<ConformityMark decision={decision} />));
    expect(rendered[0]).toContain('>Conforms<');
    expect(rendered[1]).toContain('>Does not conform<');
    expect(rendered[2]).toContain('>Undecided<');
    const glyphs = rendered.map((html) => /data-glyph="([^"]+)"/.exec(html)?.[1]);
    expect(glyphs).toEqual(['circle-tick', 'square-cross', 'diamond-question']);
    expect(new Set(glyphs).size).toBe(3);
  });
});

describe('Quantity', () => {
  it('Quantity prints the unit in its own lighter span and a spoken form for screen readers', () => {
    const html = renderToStaticMarkup(<Quantity value={99.93} unit="mm" uncertainty={0.12} digits={2} />);
    expect(html).toContain('>99.93<');
    expect(html).toContain('>± 0.12<');
    expect(html).toMatch(/<span[^>]*class="[^"]*font-light[^"]*"[^>]*data-unit="true">mm<\/span>/);
    expect(html).toContain('<span class="sr-only">99.93 plus or minus 0.12 millimetres</span>');
  });

  it('Quantity omits the ± part when no uncertainty is given', () => {
    const html = renderToStaticMarkup(<Quantity value={12} unit="ms" digits={0} />);
    expect(html).not.toContain('±');
    expect(html).toContain('>12<');
  });
});

import { renderToStaticMarkup } from 'react-dom/server';
import { MemoryRouter } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import type { LensSummary } from '@shared/schemas/lenses';
import { LensesTable } from '@/features/lenses/components/lenses-table';

const LENSES: LensSummary[] = [
  {
    id: '0f5a7c3e-1b2d-4e6f-8a9b-0c1d2e3f4a5b',
    identifier: 'PCX-100-017',
    description: 'plano-convex',
    partNumber: 'PCX-100',
    nominalFocalLengthMm: 100,
    nominalPowerDioptres: 10,
    tolerancePercent: 1,
    toleranceMm: null,
    kind: 'converging',
    latestMeasurement: {
      id: '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d',
      number: 'M-2026-0031',
      status: 'analysed',
      method: 'finite-conjugate',
      focalLengthMm: 100.42,
      expandedUncertaintyMm: 0.31,
      decision: 'conforms',
    },
  },
  {
    id: '1a2b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d',
    identifier: 'BCV-250-002',
    description: '',
    partNumber: null,
    nominalFocalLengthMm: -250,
    nominalPowerDioptres: -4,
    tolerancePercent: null,
    toleranceMm: 2.5,
    kind: 'diverging',
    latestMeasurement: null,
  },
];

function render(canStartMeasurement: boolean, canOpenMeasurements = true): string {
  return renderToStaticMarkup(
    <MemoryRouter>
      <LensesTable lenses={LENSES} canStartMeasurement={canStartMeasurement} canOpenMeasurements={canOpenMeasurements} />
    </MemoryRouter>,
  );
}

describe('LensesTable', () => {
  it('LensesTable links each lens to its page and offers "New measurement" with the lens id to technicians', () => {
    const html = render(true);
    expect(html).toContain(`href="/lenses/${LENSES[0].id}"`);
    expect(html).toContain(`href="/measurements/new?lensId=${LENSES[1].id}"`);
    expect(html.match(/New measurement/g)).toHaveLength(2);
  });

  it('LensesTable offers no "New measurement" to people who cannot start one', () => {
    expect(render(false)).not.toContain('New measurement');
  });

  it('LensesTable links the latest measurement for lab staff and only names it for a client', () => {
    expect(render(false, true)).toContain('href="/measurements/9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d"');
    const forClient = render(false, false);
    expect(forClient).not.toContain('href="/measurements/');
    expect(forClient).toContain('M-2026-0031');
  });

  it('LensesTable shows the kind by word and by a differently shaped glyph', () => {
    const html = render(false);
    expect(html).toContain('data-glyph="lens-converging"');
    expect(html).toContain('data-glyph="lens-diverging"');
    expect(html).toContain('>Converging<');
    expect(html).toContain('>Diverging<');
  });

  it('LensesTable prints the latest result as f′ ± U with its conformity mark, and says when a lens is not measured yet', () => {
    const html = render(false);
    expect(html).toContain('100.42 plus or minus 0.31 millimetres');
    expect(html).toContain('data-decision="conforms"');
    expect(html).toContain('not measured yet');
    // ± 2.5 mm around −250 mm; the band prints with a true minus sign.
    expect(html).toContain('\u2212252.50 … \u2212247.50');
  });
});

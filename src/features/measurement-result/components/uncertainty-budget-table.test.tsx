import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import type { BudgetRow } from '@shared/measure/types';
import { budgetTableRows } from '@/features/measurement-result/components/budget-table-rows';
import { UncertaintyBudgetTable } from '@/features/measurement-result/components/uncertainty-budget-table';
import { sampleResult } from '@/features/measurement-result/fixtures/sample-result';

const row = (source: string, contributionMm: number, degreesOfFreedom = Infinity): BudgetRow => ({
  source,
  value: 1,
  unit: 'mm',
  standardUncertainty: contributionMm,
  degreesOfFreedom,
  sensitivity: 1,
  contributionMm,
  varianceShare: Number.NaN,
});

describe('budgetTableRows', () => {
  it('budgetTableRows sorts by contribution, largest first, and the shares of variance sum to 1', () => {
    const rows = budgetTableRows([row('a', 0.01), row('b', 0.03), row('c', 0.02), row('d', 0)]);
    expect(rows.map((r) => r.source)).toEqual(['b', 'c', 'a', 'd']);
    // 0.03² / (0.03² + 0.02² + 0.01²) = 9/14 (arithmetic).
    expect(rows[0].shareOfVariance).toBeCloseTo(9 / 14, 12);
    expect(rows.reduce((sum, r) => sum + r.shareOfVariance, 0)).toBeCloseTo(1, 12);
    expect(rows.map((r) => r.isDominant)).toEqual([true, false, false, false]);
  });

  it('budgetTableRows keeps the given order for equal contributions and names no dominant row when all are zero', () => {
    expect(budgetTableRows([row('x', 0.02), row('y', 0.02)]).map((r) => r.source)).toEqual(['x', 'y']);
    const zeros = budgetTableRows([row('x', 0), row('y', 0)]);
    expect(zeros.every((r) => !r.isDominant && r.shareOfVariance === 0)).toBe(true);
  });
});

describe('UncertaintyBudgetTable', () => {
  const html = renderToStaticMarkup(<UncertaintyBudgetTable result={sampleResult} />);

  it('UncertaintyBudgetTable lists the rows by contribution with the dominant one emphasised', () => {
    const sources = [...html.matchAll(/<tr[^>]*data-source="([^"]+)"/g)].map((m) => m[1]);
    const expected = [...sampleResult.uncertaintyBudget].sort((a, b) => b.contributionMm - a.contributionMm).map((r) => r.source);
    expect(sources).toEqual(expected);
    expect(html).toMatch(new RegExp(`data-source="${expected[0]}" data-dominant="true"`));
    const shares = [...html.matchAll(/data-share="([^"]+)"/g)].map((m) => Number(m[1]));
    expect(shares.reduce((s, v) => s + v, 0)).toBeCloseTo(1, 12);
  });

  it('UncertaintyBudgetTable prints ∞ for degrees of freedom lost to JSON (null) and gives k, U and the Monte Carlo check', () => {
    const roundTripped = JSON.parse(JSON.stringify(sampleResult));
    expect(roundTripped.uncertaintyBudget[0].degreesOfFreedom).toBeNull();
    const markup = renderToStaticMarkup(<UncertaintyBudgetTable result={roundTripped} />);
    expect(markup).toContain('>∞<');
    expect(markup).toContain(`>${sampleResult.coverageFactor.toFixed(2)}<`);
    expect(markup).toContain(`>${sampleResult.expandedUncertaintyMm.toFixed(3)}<`);
    expect(markup).toContain('agrees with the GUM interval');
    expect(markup).toContain('JCGM 101:2008');
  });

  it('UncertaintyBudgetTable prints each value with its unit and each sensitivity in mm per input unit', () => {
    expect(html).toMatch(/3\.450<span[^>]*>µm<\/span>/);
    expect(html).toMatch(/>mm\/µm<\/span>/);
    expect(html).toMatch(/>mm\/px<\/span>/);
  });
});

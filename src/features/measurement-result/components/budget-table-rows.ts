import type { BudgetRow } from '@shared/measure/types';

export interface BudgetTableRow extends BudgetRow {
  /** c²·u² / Σ c²·u²: each input's share of the combined variance (uncorrelated inputs), 0..1. */
  shareOfVariance: number;
  isDominant: boolean;
}

/**
 * Budget rows sorted by contribution, largest first (ties keep their order),
 * with each row's share of the variance recomputed from the contributions so
 * the column always sums to 1; the largest non-zero row is the dominant one.
 */
export function budgetTableRows(rows: readonly BudgetRow[]): BudgetTableRow[] {
  const variance = rows.reduce((sum, row) => sum + row.contributionMm * row.contributionMm, 0);
  return rows
    .map((row, index) => ({ row, index }))
    .sort((a, b) => b.row.contributionMm - a.row.contributionMm || a.index - b.index)
    .map(({ row }, position) => ({
      ...row,
      shareOfVariance: variance > 0 ? (row.contributionMm * row.contributionMm) / variance : 0,
      isDominant: position === 0 && row.contributionMm > 0,
    }));
}

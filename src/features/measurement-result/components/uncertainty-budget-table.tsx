import type { ReactNode } from 'react';
import type { MeasurementResult } from '@shared/schemas/measurement-result';
import { formatFixed, formatSignificant } from '@/components/charts/chart-format';
import { CircleTickGlyph, SquareCrossGlyph } from '@/components/ui/mark-glyphs';
import { digitsForUncertainty } from '@/lib/format-quantity';
import { budgetTableRows } from '@/features/measurement-result/components/budget-table-rows';

export interface UncertaintyBudgetTableProps {
  result: Pick<
    MeasurementResult,
    | 'uncertaintyBudget'
    | 'standardUncertaintyMm'
    | 'expandedUncertaintyMm'
    | 'coverageFactor'
    | 'coverageProbability'
    | 'effectiveDegreesOfFreedom'
    | 'monteCarlo'
    | 'focalLengthMm'
  >;
}

/** Infinite degrees of freedom arrive as null after a JSON round trip. */
function degreesOfFreedomText(nu: number | null | undefined): string {
  if (nu === null || nu === undefined || !Number.isFinite(nu)) return '∞';
  return String(Math.round(nu));
}

function Unit({ children }: { children: string }) {
  if (!children) return null;
  return <span className="ml-1 font-sans font-light text-ink-faint">{children}</span>;
}

function sensitivityUnit(inputUnit: string): string {
  if (!inputUnit || inputUnit === '1') return 'mm';
  return `mm/${inputUnit}`;
}

const headerClass = 'border-b border-rule-strong px-3 py-1.5 text-caption font-semibold uppercase tracking-wider text-ink-soft';

/**
 * The GUM budget of the focal length: one row per input, largest
 * contribution first, the dominant one emphasised, each row's share of the
 * variance drawn as a bar; combined, effective degrees of freedom, k and U
 * below, then the Monte Carlo cross-check.
 */
export function UncertaintyBudgetTable({ result }: UncertaintyBudgetTableProps) {
  const rows = budgetTableRows(result.uncertaintyBudget);
  const contributionDigits = Math.min(6, digitsForUncertainty(result.standardUncertaintyMm) + 1);
  const probabilityPercent = Math.round((result.coverageProbability ?? 0.95) * 100);
  const mc = result.monteCarlo;
  const expandedDigits = digitsForUncertainty(result.expandedUncertaintyMm);

  return (
    <div className="space-y-2">
      <div className="overflow-x-auto rounded-sheet border border-rule bg-sheet">
        <table className="w-full border-collapse text-left text-small" data-role="uncertainty-budget">
          <caption className="border-b border-rule px-3 py-2 text-left font-serif text-title-sm font-semibold">
            Uncertainty budget of f′ <span className="font-sans text-small font-normal text-ink-faint">(GUM, JCGM 100:2008; sorted by contribution)</span>
          </caption>
          <thead>
            <tr className="bg-shade">
              <th scope="col" className={headerClass}>Source</th>
              <th scope="col" className={`${headerClass} text-right`}>Value xᵢ</th>
              <th scope="col" className={`${headerClass} text-right`}>u(xᵢ)</th>
              <th scope="col" className={`${headerClass} text-right`}>νᵢ</th>
              <th scope="col" className={`${headerClass} text-right`}>Sensitivity cᵢ</th>
              <th scope="col" className={`${headerClass} text-right`}>|cᵢ|·u(xᵢ)</th>
              <th scope="col" className={`${headerClass} w-44`}>Share of variance</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr
                key={row.source}
                className={`border-b border-rule/70 ${row.isDominant ? 'bg-shade/60' : 'even:bg-paper/60'}`}
                data-source={row.source}
                data-dominant={row.isDominant || undefined}
              >
                <th scope="row" className={`px-3 py-1.5 text-left align-baseline ${row.isDominant ? 'font-semibold text-ink' : 'font-normal text-ink'}`}>
                  {row.isDominant ? (
                    <span className="mr-1.5 inline-block rounded-hair border border-ink/30 px-1 text-caption font-semibold uppercase tracking-wider text-ink-soft">
                      dominant
                    </span>
                  ) : null}
                  {row.source}
                </th>
                <td className="numerals px-3 py-1.5 text-right align-baseline">
                  {formatFixed(row.value, digitsForUncertainty(row.standardUncertainty))}
                  <Unit>{row.unit}</Unit>
                </td>
                <td className="numerals px-3 py-1.5 text-right align-baseline">
                  {formatSignificant(row.standardUncertainty, 2)}
                  <Unit>{row.unit}</Unit>
                </td>
                <td className="numerals px-3 py-1.5 text-right align-baseline">{degreesOfFreedomText(row.degreesOfFreedom)}</td>
                <td className="numerals px-3 py-1.5 text-right align-baseline">
                  {formatSignificant(row.sensitivity, 3)}
                  <Unit>{sensitivityUnit(row.unit)}</Unit>
                </td>
                <td className={`numerals px-3 py-1.5 text-right align-baseline ${row.isDominant ? 'font-semibold' : ''}`} data-column="contribution">
                  {formatFixed(row.contributionMm, contributionDigits)}
                  <Unit>mm</Unit>
                </td>
                <td className="px-3 py-1.5 align-middle" data-column="share" data-share={row.shareOfVariance}>
                  <span className="flex items-center gap-2">
                    <span className="relative h-2 flex-1 overflow-hidden rounded-hair bg-shade" aria-hidden="true">
                      <span
                        className={`absolute inset-y-0 left-0 ${row.isDominant ? 'bg-ink' : 'bg-ink-faint'}`}
                        style={{ width: `${(row.shareOfVariance * 100).toFixed(2)}%` }}
                      />
                    </span>
                    <span className="numerals w-12 text-right text-ink-soft">{(row.shareOfVariance * 100).toFixed(1)} %</span>
                  </span>
                </td>
              </tr>
            ))}
          </tbody>
          <tfoot className="border-t border-rule-strong">
            <FooterRow label="Combined standard uncertainty u(f′)">
              {formatFixed(result.standardUncertaintyMm, contributionDigits)}
              <Unit>mm</Unit>
            </FooterRow>
            <FooterRow label="Effective degrees of freedom νeff (Welch–Satterthwaite)">{degreesOfFreedomText(result.effectiveDegreesOfFreedom)}</FooterRow>
            <FooterRow label={`Coverage factor k (Student's t, ${probabilityPercent} %)`}>{result.coverageFactor.toFixed(2)}</FooterRow>
            <FooterRow label="Expanded uncertainty U = k·u" strong>
              {formatFixed(result.expandedUncertaintyMm, expandedDigits)}
              <Unit>mm</Unit>
            </FooterRow>
          </tfoot>
        </table>
      </div>
      {mc ? (
        <p className="flex items-start gap-2 text-small text-ink-soft" data-role="monte-carlo">
          {mc.agreesWithGum ? (
            <CircleTickGlyph className="mt-0.5 size-4 shrink-0 text-conforms" />
          ) : (
            <SquareCrossGlyph className="mt-0.5 size-4 shrink-0 text-nonconform" />
          )}
          <span>
            Monte Carlo cross-check (JCGM 101:2008), <span className="numerals">{mc.draws.toLocaleString('en-GB').replace(/,/g, '\u2009')}</span> draws: f′ ={' '}
            <span className="numerals text-ink">{formatFixed(mc.focalLengthMm, contributionDigits)}</span> <Unit>mm</Unit>, u ={' '}
            <span className="numerals text-ink">{formatFixed(mc.standardUncertaintyMm, contributionDigits)}</span> <Unit>mm</Unit>, {probabilityPercent} % interval{' '}
            <span className="numerals text-ink">
              {formatFixed(mc.intervalLowMm, contributionDigits)} … {formatFixed(mc.intervalHighMm, contributionDigits)}
            </span>{' '}
            <Unit>mm</Unit> —{' '}
            <strong className={mc.agreesWithGum ? 'font-semibold text-conforms' : 'font-semibold text-nonconform'}>
              {mc.agreesWithGum ? 'agrees with the GUM interval' : 'differs from the GUM interval'}
            </strong>
            {Number.isFinite(mc.numericalToleranceMm) ? (
              <>
                {' '}
                (numerical tolerance δ = <span className="numerals">{formatSignificant(mc.numericalToleranceMm, 1)}</span> <Unit>mm</Unit>, JCGM 101:2008 §8)
              </>
            ) : null}
            .
          </span>
        </p>
      ) : (
        <p className="text-small text-ink-faint">No Monte Carlo cross-check was run for this analysis.</p>
      )}
    </div>
  );
}

function FooterRow({ label, children, strong = false }: { label: string; children: ReactNode; strong?: boolean }) {
  return (
    <tr className="border-b border-rule/70 last:border-b-0">
      <th scope="row" colSpan={5} className={`px-3 py-1.5 text-right align-baseline ${strong ? 'font-semibold text-ink' : 'font-normal text-ink-soft'}`}>
        {label}
      </th>
      <td className={`numerals px-3 py-1.5 text-right align-baseline ${strong ? 'font-semibold text-ink' : ''}`}>{children}</td>
      <td />
    </tr>
  );
}

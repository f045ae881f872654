import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { ToleranceSpreadPlot } from '@/components/charts/tolerance-spread-plot';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import type { DecisionRule } from '@shared/schemas/work-orders';
import { usePartNumberSpread } from '@/features/lenses/api/get-part-number-spread';
import { uniqueIdentifiers } from '@/features/lenses/lib/unique-identifiers';

export interface PartNumberSpreadPanelProps {
  partNumber: string;
  decisionRule: DecisionRule;
  /** The lens whose page this is, named under the plot. */
  currentLensId: string;
}

function Note({ children }: { children: ReactNode }) {
  return <p className="rounded-sheet border border-dashed border-rule-strong bg-sheet/70 px-4 py-3 text-small text-ink-soft">{children}</p>;
}

/**
 * The measured focal lengths of every lens sharing this part number against
 * the tolerance band. Cp and Cpk need a spread, so without two differing
 * results the server's sentence stands in for the plot.
 */
export function PartNumberSpreadPanel({ partNumber, decisionRule, currentLensId }: PartNumberSpreadPanelProps) {
  const spread = usePartNumberSpread(partNumber);
  if (spread.isPending) return <LoadingNote what={`the batch of part ${partNumber}`} />;
  if (spread.isError) {
    return (
      <ProblemNote
        title={`The spread of part ${partNumber} could not be loaded`}
        message={spread.error.message}
        action={
          <Button variant="secondary" size="sm" onClick={() => spread.refetch()} isBusy={spread.isFetching}>
            Load again
          </Button>
        }
      />
    );
  }
  const { points, stats, lensCount } = spread.data;
  const measuredText = `${points.length} of the ${lensCount} ${lensCount === 1 ? 'lens' : 'lenses'} with this part number ${points.length === 1 ? 'has' : 'have'} an analysed result.`;
  if (stats === null || stats.cp === null || stats.cpk === null || points.length < 2) {
    return (
      <Note>
        {measuredText} {spread.data.statsNote ?? 'The spread, with mean, standard deviation, Cp and Cpk, appears once two or more lenses of this part have different results.'}
      </Note>
    );
  }
  const labels = uniqueIdentifiers(points.map((point) => point.identifier));
  const here = points.findIndex((point) => point.lensId === currentLensId);
  return (
    <div className="space-y-2">
      {spread.data.specificationsDiffer ? (
        <ProblemNote
          title="These lenses do not all share one specification"
          message="Lenses with this part number carry different nominal values or tolerances; the band drawn is that of the newest lens. Compare them with care."
        />
      ) : null}
      <ToleranceSpreadPlot
        partNumber={spread.data.partNumber}
        lenses={points.map((point, index) => ({
          identifier: labels[index],
          focalLengthMm: point.focalLengthMm,
          expandedUncertaintyMm: point.expandedUncertaintyMm,
          decision: point.decision ?? undefined,
        }))}
        nominalFocalLengthMm={spread.data.nominalFocalLengthMm}
        lowerLimitMm={spread.data.lowerLimitMm}
        upperLimitMm={spread.data.upperLimitMm}
        decisionRule={decisionRule}
        summary={{ meanMm: stats.meanMm, standardDeviationMm: stats.standardDeviationMm, cp: stats.cp, cpk: stats.cpk }}
      />
      <p className="text-caption text-ink-faint">
        {measuredText}{' '}
        {here >= 0 ? (
          <>
            This lens is <span className="numerals text-ink-soft">{labels[here]}</span>, from{' '}
            <Link to={`/measurements/${points[here].measurementId}`} className="numerals underline underline-offset-4">
              {points[here].measurementNumber}
            </Link>
            .
          </>
        ) : (
          'This lens has no analysed result in the batch yet.'
        )}
      </p>
    </div>
  );
}

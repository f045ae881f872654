import type { MeasurementResult } from '@shared/schemas/measurement-result';
import { ConformityMark } from '@/components/ui/conformity-mark';
import { Quantity } from '@/components/ui/quantity';
import { formatFixed } from '@/components/charts/chart-format';
import { digitsForUncertainty } from '@/lib/format-quantity';
import { DECISION_RULE_WORDS, METHOD_WORDS } from '@/features/measurement-result/components/result-words';

export interface ResultHeadlineProps {
  result: MeasurementResult;
  /** The analysis run this result came from (every run is kept). */
  analysisVersion: number;
}

function CoverageWords({ result }: { result: MeasurementResult }) {
  const probability = result.coverageProbability ?? 0.95;
  const nu = result.effectiveDegreesOfFreedom;
  return (
    <>
      U = k·u with k = <span className="numerals">{result.coverageFactor.toFixed(2)}</span>, coverage probability ≈ {Math.round(probability * 100)} %
      {nu === undefined ? null : (
        <>
          , ν<sub>eff</sub> = <span className="numerals">{nu === null || !Number.isFinite(nu) ? '∞' : Math.round(nu)}</span>
        </>
      )}
    </>
  );
}

/**
 * The result at a glance: focal length ± expanded uncertainty in large
 * numerals, optical power, conformity by word and symbol with its decision
 * rule, and the back focal distance or principal planes when the method gives them.
 */
export function ResultHeadline({ result, analysisVersion }: ResultHeadlineProps) {
  const { conformity, principalPlanes } = result;
  return (
    <section aria-label="Measured focal length" className="rounded-sheet border border-rule bg-sheet p-5 shadow-sheet" data-role="result-headline">
      <div className="flex flex-wrap items-baseline justify-between gap-x-6 gap-y-1">
        <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">Focal length · {METHOD_WORDS[result.method]}</p>
        <p className="text-caption text-ink-faint">
          <span data-role="analysis-version">analysis version {analysisVersion}</span>
          {result.engineVersion ? <> · engine {result.engineVersion}</> : null}
        </p>
      </div>

      <div className="mt-3 grid gap-x-10 gap-y-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,22rem)]">
        <div>
          <p className="flex flex-wrap items-baseline gap-x-3">
            <span className="font-serif text-title italic text-ink-soft" aria-hidden="true">
              f′ =
            </span>
            <Quantity value={result.focalLengthMm} uncertainty={result.expandedUncertaintyMm} unit="mm" size="result" />
          </p>
          <p className="mt-2 text-small text-ink-soft" data-role="coverage">
            <CoverageWords result={result} />; standard uncertainty u ={' '}
            <Quantity value={result.standardUncertaintyMm} unit="mm" digits={Math.max(3, digitsForUncertainty(result.standardUncertaintyMm))} />.
          </p>

          <dl className="mt-4 grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-body">
            {result.opticalPowerDioptres !== undefined ? (
              <>
                <dt className="text-ink-soft">Optical power P</dt>
                <dd>
                  <Quantity
                    value={result.opticalPowerDioptres}
                    uncertainty={result.opticalPowerExpandedUncertaintyDioptres}
                    unit="D"
                    size="lead"
                  />
                </dd>
              </>
            ) : null}
            {result.backFocalDistanceMm !== undefined ? (
              <>
                <dt className="text-ink-soft">Back focal distance</dt>
                <dd>
                  <Quantity value={result.backFocalDistanceMm} unit="mm" size="lead" digits={3} />
                  {result.backFocalDistanceStandardUncertaintyMm !== undefined ? (
                    <span className="ml-2 text-small text-ink-faint">
                      u = <span className="numerals">{formatFixed(result.backFocalDistanceStandardUncertaintyMm, 3)}</span> mm
                    </span>
                  ) : null}
                </dd>
              </>
            ) : null}
            {principalPlanes ? (
              <>
                <dt className="text-ink-soft">Front principal plane H</dt>
                <dd>
                  <Quantity value={principalPlanes.frontOffsetMm} unit="mm" size="lead" digits={3} />
                  <span className="ml-2 text-small text-ink-faint">
                    from the lens mark
                    {principalPlanes.frontOffsetStandardUncertaintyMm !== undefined ? (
                      <>
                        , u = <span className="numerals">{formatFixed(principalPlanes.frontOffsetStandardUncertaintyMm, 3)}</span> mm
                      </>
                    ) : null}
                  </span>
                </dd>
                <dt className="text-ink-soft">Rear principal plane H′</dt>
                <dd>
                  <Quantity value={principalPlanes.rearOffsetMm} unit="mm" size="lead" digits={3} />
                  <span className="ml-2 text-small text-ink-faint">
                    from the lens mark
                    {principalPlanes.rearOffsetStandardUncertaintyMm !== undefined ? (
                      <>
                        , u = <span className="numerals">{formatFixed(principalPlanes.rearOffsetStandardUncertaintyMm, 3)}</span> mm
                      </>
                    ) : null}
                  </span>
                </dd>
              </>
            ) : null}
          </dl>
        </div>

        <div className="border-t border-rule pt-4 lg:border-l lg:border-t-0 lg:pl-6 lg:pt-0" data-role="conformity">
          <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">Conformity</p>
          {conformity ? (
            <>
              <div className="mt-2">
                <ConformityMark
                  decision={conformity.decision}
                  size="lg"
                  detail={`${formatFixed(conformity.lowerLimitMm, 2)} … ${formatFixed(conformity.upperLimitMm, 2)} mm`}
                />
              </div>
              <p className="mt-3 text-small text-ink">{DECISION_RULE_WORDS[conformity.rule]}</p>
              <p className="mt-2 text-small text-ink-soft">{conformity.statement}</p>
            </>
          ) : (
            <p className="mt-2 text-small text-ink-soft">No tolerance was given for this lens, so no conformity statement is made.</p>
          )}
        </div>
      </div>
    </section>
  );
}


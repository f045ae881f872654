import { useId } from 'react';
import { scaleLinear, scalePoint } from 'd3-scale';
import { decideConformity, type DecisionRule } from '@shared/measure/conformity/decide-conformity';
import { linearAxisTicks } from '@/components/charts/axis-ticks';
import { ChartAxis } from '@/components/charts/chart-axis';
import { formatFixed } from '@/components/charts/chart-format';
import { svgSafeId } from '@/components/charts/clip-id';
import { MeasurementGrid } from '@/components/charts/measurement-grid';
import { plotArea } from '@/components/charts/plot-area';
import { PlotFrame } from '@/components/charts/plot-frame';
import { LegendItem, LegendSwatch, PlotLegend } from '@/components/charts/plot-marks';
import { useMeasuredWidth } from '@/components/charts/use-measured-width';
import { CONFORMITY_WORDS, type ConformityDecision } from '@/components/ui/conformity-mark';

export interface ToleranceSpreadLens {
  /** Serial or identifier, printed under the mark. */
  identifier: string;
  focalLengthMm: number;
  expandedUncertaintyMm: number;
  /** The recorded decision; when absent it is decided here under `decisionRule`. */
  decision?: ConformityDecision;
}

/** Batch statistics computed elsewhere (the server), shown beside the plot. */
export interface ToleranceSpreadSummary {
  meanMm: number;
  standardDeviationMm: number;
  cp: number;
  cpk: number;
}

export interface ToleranceSpreadPlotProps {
  partNumber: string;
  lenses: ToleranceSpreadLens[];
  nominalFocalLengthMm: number;
  lowerLimitMm: number;
  upperLimitMm: number;
  decisionRule: DecisionRule;
  summary: ToleranceSpreadSummary;
  widthPx?: number;
}

export interface ToleranceSpreadLayoutOptions {
  lenses: ToleranceSpreadLens[];
  nominalFocalLengthMm: number;
  lowerLimitMm: number;
  upperLimitMm: number;
  decisionRule: DecisionRule;
  widthPx: number;
}

const HEIGHT_PX = 320;

export function checkToleranceSpreadLayoutOptions(options: ToleranceSpreadLayoutOptions): ToleranceSpreadLayoutOptions {
  const { lenses, lowerLimitMm, upperLimitMm, nominalFocalLengthMm, widthPx } = options;
  if (!Array.isArray(lenses)) throw new TypeError('toleranceSpreadLayout: option "lenses" must be an array.');
  if (!(Number.isFinite(lowerLimitMm) && Number.isFinite(upperLimitMm) && lowerLimitMm < upperLimitMm)) {
    throw new RangeError(`toleranceSpreadLayout: option "lowerLimitMm" (${lowerLimitMm}) must be below "upperLimitMm" (${upperLimitMm}).`);
  }
  if (!Number.isFinite(nominalFocalLengthMm)) {
    throw new RangeError(`toleranceSpreadLayout: option "nominalFocalLengthMm" must be a finite number; got ${nominalFocalLengthMm}.`);
  }
  const duplicate = lenses.find((lens, i) => lenses.findIndex((other) => other.identifier === lens.identifier) !== i);
  if (duplicate) throw new RangeError(`toleranceSpreadLayout: option "lenses" lists "${duplicate.identifier}" twice.`);
  if (!(widthPx >= 200)) throw new RangeError(`toleranceSpreadLayout: option "widthPx" must be at least 200; got ${widthPx}.`);
  return options;
}

/** Scales and marks of the tolerance-spread plot; each lens carries its decision (recorded, or decided here). */
export function toleranceSpreadLayout(options: ToleranceSpreadLayoutOptions) {
  const { lenses, nominalFocalLengthMm, lowerLimitMm, upperLimitMm, decisionRule, widthPx } = checkToleranceSpreadLayoutOptions(options);
  const crowded = lenses.length > 0 && (widthPx - 100) / lenses.length < 64;
  const area = plotArea({ widthPx, heightPx: HEIGHT_PX, marginsPx: { top: 16, right: 96, bottom: crowded ? 76 : 54, left: 72 } });
  const xScale = scalePoint<string>()
    .domain(lenses.map((l) => l.identifier))
    .range([area.leftPx, area.rightPx])
    .padding(0.6);
  const extent = [
    lowerLimitMm,
    upperLimitMm,
    nominalFocalLengthMm,
    ...lenses.flatMap((l) => [l.focalLengthMm - l.expandedUncertaintyMm, l.focalLengthMm + l.expandedUncertaintyMm]),
  ];
  const low = Math.min(...extent);
  const high = Math.max(...extent);
  const pad = 0.12 * (high - low);
  const yScale = scaleLinear()
    .domain([low - pad, high + pad])
    .nice(6)
    .range([area.bottomPx, area.topPx]);
  const marks = lenses.map((lens) => ({
    ...lens,
    decision:
      lens.decision ??
      decideConformity({
        measuredValue: lens.focalLengthMm,
        expandedUncertainty: lens.expandedUncertaintyMm,
        lowerLimit: lowerLimitMm,
        upperLimit: upperLimitMm,
        rule: decisionRule,
      }).decision,
    xPx: xScale(lens.identifier) as number,
    yPx: yScale(lens.focalLengthMm),
    errorBarTopPx: yScale(lens.focalLengthMm + lens.expandedUncertaintyMm),
    errorBarBottomPx: yScale(lens.focalLengthMm - lens.expandedUncertaintyMm),
  }));
  // Rotated labels need about 16 px each; print every n-th one when the lenses are closer than that.
  const labelEvery = crowded ? Math.max(1, Math.ceil(16 / Math.max(xScale.step(), 1))) : 1;
  return { area, xScale, yScale, marks, crowded, labelEvery, heightPx: HEIGHT_PX };
}

const DECISION_CLASS: Record<ConformityDecision, string> = {
  conforms: 'text-conforms',
  'does-not-conform': 'text-nonconform',
  undecided: 'text-undecided',
};

/** Filled shapes with an inner sign, matching ConformityMark's circle/square/diamond. */
export function DecisionSymbol({ decision, x, y }: { decision: ConformityDecision; x: number; y: number }) {
  if (decision === 'conforms') {
    return (
      <g className={DECISION_CLASS[decision]} data-symbol="circle-tick">
        <circle cx={x} cy={y} r={4.8} fill="currentColor" />
        <path d={`M${x - 2.3} ${y + 0.2}L${x - 0.6} ${y + 1.9}L${x + 2.5} ${y - 1.8}`} fill="none" stroke="var(--color-sheet)" strokeWidth={1.5} strokeLinecap="round" strokeLinejoin="round" />
      </g>
    );
  }
  if (decision === 'does-not-conform') {
    return (
      <g className={DECISION_CLASS[decision]} data-symbol="square-cross">
        <rect x={x - 4.6} y={y - 4.6} width={9.2} height={9.2} rx={1} fill="currentColor" />
        <path d={`M${x - 2.1} ${y - 2.1}L${x + 2.1} ${y + 2.1}M${x + 2.1} ${y - 2.1}L${x - 2.1} ${y + 2.1}`} stroke="var(--color-sheet)" strokeWidth={1.5} strokeLinecap="round" />
      </g>
    );
  }
  return (
    <g className={DECISION_CLASS[decision]} data-symbol="diamond-question">
      <path d={`M${x} ${y - 6.2}L${x + 6.2} ${y}L${x} ${y + 6.2}L${x - 6.2} ${y}Z`} fill="currentColor" />
      <text x={x} y={y + 3} textAnchor="middle" fontSize={8} fontWeight={700} fill="var(--color-sheet)">
        ?
      </text>
    </g>
  );
}

/**
 * Measured focal lengths of a batch of one part number, each with its ± U
 * bar, against the tolerance band and the nominal value; pass and fail are
 * told apart by symbol as well as colour. Batch statistics sit beside it.
 */
export function ToleranceSpreadPlot({
  partNumber,
  lenses,
  nominalFocalLengthMm,
  lowerLimitMm,
  upperLimitMm,
  decisionRule,
  summary,
  widthPx,
}: ToleranceSpreadPlotProps) {
  const { ref, widthPx: drawingWidthPx } = useMeasuredWidth<HTMLDivElement>({ fixedWidthPx: widthPx, fallbackWidthPx: 720 });
  const titleId = svgSafeId(useId(), 'title');
  const layout = toleranceSpreadLayout({ lenses, nominalFocalLengthMm, lowerLimitMm, upperLimitMm, decisionRule, widthPx: drawingWidthPx });
  const { area, yScale, marks } = layout;
  const yTicks = linearAxisTicks(yScale, 6);
  const counts = {
    conforms: marks.filter((m) => m.decision === 'conforms').length,
    'does-not-conform': marks.filter((m) => m.decision === 'does-not-conform').length,
    undecided: marks.filter((m) => m.decision === 'undecided').length,
  };
  const limitLabel = (y: number, text: string, value: number) => (
    <text x={area.rightPx + 6} y={y} dy="0.34em" fontSize={11} fill="var(--color-ink-soft)">
      <tspan>{text} </tspan>
      <tspan style={{ fontFamily: 'var(--font-mono)' }}>{value.toFixed(2)}</tspan>
    </text>
  );

  return (
    <PlotFrame
      title={`Focal length spread, part ${partNumber}`}
      surface="plain"
      heightClass=""
      footer={
        <PlotLegend>
          {(['conforms', 'undecided', 'does-not-conform'] as const).map((decision) => (
            <LegendItem
              key={decision}
              swatch={
                <LegendSwatch widthPx={16}>
                  <DecisionSymbol decision={decision} x={8} y={6} />
                </LegendSwatch>
              }
            >
              {CONFORMITY_WORDS[decision]} ({counts[decision]})
            </LegendItem>
          ))}
          <LegendItem swatch={<LegendSwatch><rect x={1} y={1} width={16} height={10} className="fill-conforms-tint" stroke="var(--color-ink-faint)" strokeDasharray="3 2" /></LegendSwatch>}>
            tolerance band
          </LegendItem>
          <LegendItem swatch={<LegendSwatch><path d="M9 1V11M6 1H12M6 11H12" stroke="var(--color-ink)" strokeWidth={1.2} /></LegendSwatch>}>
            ± U of each measurement
          </LegendItem>
          <li>Decision rule: {decisionRule === 'guarded' ? 'guarded acceptance, guard band w = U' : 'simple acceptance'}</li>
        </PlotLegend>
      }
    >
      <div className="@container">
       <div className="flex flex-col gap-4 @3xl:flex-row">
        <div ref={ref} className="min-w-0 flex-1">
          <svg
            width={drawingWidthPx}
            height={layout.heightPx}
            viewBox={`0 0 ${drawingWidthPx} ${layout.heightPx}`}
            role="img"
            aria-labelledby={titleId}
            className="block max-w-full select-none"
            data-plot="tolerance-spread"
          >
            <title id={titleId}>
              {`Measured focal lengths of ${lenses.length} lenses of part ${partNumber} against the tolerance ${lowerLimitMm} to ${upperLimitMm} mm: ${counts.conforms} conform, ${counts.undecided} undecided, ${counts['does-not-conform']} do not conform.`}
            </title>
            <MeasurementGrid area={area} xTickPositionsPx={marks.map((m) => m.xPx)} yTickPositionsPx={yTicks.map((t) => t.positionPx)} />
            <rect
              x={area.leftPx}
              width={area.innerWidthPx}
              y={yScale(upperLimitMm)}
              height={yScale(lowerLimitMm) - yScale(upperLimitMm)}
              className="fill-conforms-tint"
              opacity={0.7}
              data-role="tolerance-band"
            />
            {[lowerLimitMm, upperLimitMm].map((limit) => (
              <line key={limit} x1={area.leftPx} x2={area.rightPx} y1={yScale(limit)} y2={yScale(limit)} stroke="var(--color-ink-soft)" strokeDasharray="5 3" data-role="tolerance-limit" />
            ))}
            <line
              x1={area.leftPx}
              x2={area.rightPx}
              y1={yScale(nominalFocalLengthMm)}
              y2={yScale(nominalFocalLengthMm)}
              stroke="var(--color-ink-soft)"
              strokeWidth={1.2}
              data-role="nominal-line"
            />
            <line
              x1={area.leftPx}
              x2={area.rightPx}
              y1={yScale(summary.meanMm)}
              y2={yScale(summary.meanMm)}
              stroke="var(--color-ink-faint)"
              strokeDasharray="1 3"
              strokeWidth={1.4}
              data-role="mean-line"
            />
            {limitLabel(yScale(upperLimitMm), 'upper', upperLimitMm)}
            {limitLabel(yScale(nominalFocalLengthMm), 'nominal', nominalFocalLengthMm)}
            {limitLabel(yScale(lowerLimitMm), 'lower', lowerLimitMm)}
            {Math.abs(yScale(summary.meanMm) - yScale(nominalFocalLengthMm)) > 12 &&
            Math.abs(yScale(summary.meanMm) - yScale(upperLimitMm)) > 12 &&
            Math.abs(yScale(summary.meanMm) - yScale(lowerLimitMm)) > 12
              ? limitLabel(yScale(summary.meanMm), 'mean', summary.meanMm)
              : null}
            {marks.map((mark) => (
              <g key={mark.identifier} data-lens={mark.identifier} data-decision={mark.decision}>
                <title>{`${mark.identifier}: ${mark.focalLengthMm.toFixed(3)} ± ${mark.expandedUncertaintyMm.toFixed(3)} mm — ${CONFORMITY_WORDS[mark.decision]}`}</title>
                <path
                  d={`M${mark.xPx} ${mark.errorBarTopPx}V${mark.errorBarBottomPx}M${mark.xPx - 4} ${mark.errorBarTopPx}H${mark.xPx + 4}M${mark.xPx - 4} ${mark.errorBarBottomPx}H${mark.xPx + 4}`}
                  stroke="var(--color-ink)"
                  strokeWidth={1.2}
                  fill="none"
                />
                <DecisionSymbol decision={mark.decision} x={mark.xPx} y={mark.yPx} />
              </g>
            ))}
            <ChartAxis orientation="left" area={area} ticks={yTicks} title={{ quantity: 'Focal length f′', unit: 'mm' }} titleOffsetPx={56} />
            <g data-axis="lens">
              <line x1={area.leftPx} x2={area.rightPx} y1={area.bottomPx} y2={area.bottomPx} stroke="var(--color-ink-soft)" shapeRendering="crispEdges" />
              {marks.map((mark, index) => (
                <g key={mark.identifier} transform={`translate(${mark.xPx},${area.bottomPx})`}>
                  <line y2={5} stroke="var(--color-ink-soft)" />
                  {index % layout.labelEvery !== 0 ? null : <text
                    y={layout.crowded ? 10 : 17}
                    transform={layout.crowded ? 'rotate(-40)' : undefined}
                    textAnchor={layout.crowded ? 'end' : 'middle'}
                    fontSize={11}
                    fill="var(--color-ink-soft)"
                    style={{ fontFamily: 'var(--font-mono)' }}
                  >
                    {mark.identifier}
                  </text>}
                </g>
              ))}
              <text x={(area.leftPx + area.rightPx) / 2} y={layout.heightPx - 8} textAnchor="middle" fontSize={12} fill="var(--color-ink-soft)">
                Lens, by identifier
              </text>
            </g>
          </svg>
        </div>
        <aside className="w-full max-w-xs shrink-0 @3xl:w-56">
          <h3 className="text-caption font-semibold uppercase tracking-wider text-ink-faint">Batch of {lenses.length}</h3>
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1.5 text-small">
            <SummaryRow term="mean x̄" value={formatFixed(summary.meanMm, 3)} unit="mm" />
            <SummaryRow term="std. deviation s" value={formatFixed(summary.standardDeviationMm, 3)} unit="mm" />
            <SummaryRow term="nominal" value={formatFixed(nominalFocalLengthMm, 2)} unit="mm" />
            <SummaryRow term="upper limit" value={formatFixed(upperLimitMm, 2)} unit="mm" />
            <SummaryRow term="lower limit" value={formatFixed(lowerLimitMm, 2)} unit="mm" />
            <SummaryRow term="Cp" value={formatFixed(summary.cp, 2)} />
            <SummaryRow term="Cpk" value={formatFixed(summary.cpk, 2)} />
          </dl>
          <p className="mt-2 text-caption text-ink-faint">Cp = (upper − lower)/6s; Cpk = min(upper − x̄, x̄ − lower)/3s.</p>
        </aside>
       </div>
      </div>
    </PlotFrame>
  );
}

function SummaryRow({ term, value, unit }: { term: string; value: string; unit?: string }) {
  return (
    <>
      <dt className="text-ink-soft">{term}</dt>
      <dd className="text-right">
        <span className="numerals text-ink">{value}</span>
        {unit ? <span className="ml-1 font-light text-ink-faint">{unit}</span> : null}
      </dd>
    </>
  );
}

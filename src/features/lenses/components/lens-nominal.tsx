import { Quantity } from '@/components/ui/quantity';
import type { LensSummary } from '@shared/schemas/lenses';
import { powerFromFocalLengthDioptres, toleranceBand } from '@/features/lenses/lib/lens-optics';

type NominalFields = Pick<LensSummary, 'nominalFocalLengthMm' | 'nominalPowerDioptres'>;
type ToleranceFields = Pick<LensSummary, 'nominalFocalLengthMm' | 'tolerancePercent' | 'toleranceMm'>;

/** The nominal focal length, with the power it means faint under it. */
export function LensNominal({ lens }: { lens: NominalFields }) {
  const power = lens.nominalPowerDioptres ?? powerFromFocalLengthDioptres(lens.nominalFocalLengthMm);
  return (
    <span className="inline-flex flex-col items-end">
      <Quantity value={lens.nominalFocalLengthMm} unit="mm" digits={Math.abs(lens.nominalFocalLengthMm) < 10 ? 2 : 1} />
      <span className="text-caption opacity-80">
        <Quantity value={power} unit="D" digits={2} />
      </span>
    </span>
  );
}

/** "± 1 %" or "± 0.50 mm", and the band in millimetres it gives. */
export function LensTolerance({ lens, showBand = true }: { lens: ToleranceFields; showBand?: boolean }) {
  if (lens.tolerancePercent === null && lens.toleranceMm === null) return <span className="text-ink-faint">none</span>;
  const band = toleranceBand(lens);
  return (
    <span className="inline-flex flex-col items-end">
      <span className="inline-flex items-baseline gap-1.5">
        {lens.tolerancePercent !== null ? (
          <span className={band.from === 'percent' ? '' : 'opacity-60'}>
            <span className="numerals text-ink-soft">±</span> <Quantity value={lens.tolerancePercent} unit="%" digits={lens.tolerancePercent < 1 ? 2 : 1} />
          </span>
        ) : null}
        {lens.toleranceMm !== null ? (
          <span className={band.from === 'mm' ? '' : 'opacity-60'}>
            <span className="numerals text-ink-soft">±</span> <Quantity value={lens.toleranceMm} unit="mm" digits={lens.toleranceMm < 1 ? 3 : 2} />
          </span>
        ) : null}
      </span>
      {showBand ? (
        <span className="numerals whitespace-nowrap text-caption text-ink-faint">
          {band.lowerLimitMm.toFixed(2).replace('-', '\u2212')} … {band.upperLimitMm.toFixed(2).replace('-', '\u2212')}
          <span className="font-sans font-light"> mm</span>
        </span>
      ) : null}
    </span>
  );
}

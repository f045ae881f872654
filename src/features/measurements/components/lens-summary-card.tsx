import { Link } from 'react-router-dom';
import { toleranceBandOf, type LensDetail } from '@shared/schemas/lenses';
import { Quantity } from '@/components/ui/quantity';

function toleranceText(lens: Pick<LensDetail, 'tolerancePercent' | 'toleranceMm'>): string {
  const parts: string[] = [];
  if (lens.tolerancePercent !== null) parts.push(`± ${lens.tolerancePercent} %`);
  if (lens.toleranceMm !== null) parts.push(`± ${lens.toleranceMm} mm`);
  return parts.join(' and ');
}

/** The item under test at the top of the set-up: identifier, nominal, tolerance and band, and where it came from. */
export function LensSummaryCard({ lens }: { lens: LensDetail }) {
  const band = toleranceBandOf(lens);
  return (
    <section aria-label="Lens under test" className="rounded-sheet border border-rule bg-sheet px-5 py-4 shadow-sheet" data-role="lens-summary">
      <div className="flex flex-wrap items-baseline justify-between gap-x-6 gap-y-1">
        <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">Lens under test</p>
        <p className="text-small text-ink-soft">
          <Link to={`/work-orders/${lens.workOrder.id}`} className="numerals underline decoration-rule-strong underline-offset-4 hover:decoration-ink">
            {lens.workOrder.number}
          </Link>{' '}
          · {lens.workOrder.organisation.name} · {lens.workOrder.decisionRule === 'guarded' ? 'guarded acceptance' : 'simple acceptance'}
        </p>
      </div>
      <div className="mt-2 grid gap-x-8 gap-y-3 sm:grid-cols-[minmax(0,1.3fr)_repeat(3,minmax(0,1fr))]">
        <div>
          <p className="numerals text-title-sm font-semibold text-ink">
            <Link to={`/lenses/${lens.id}`} className="hover:underline">
              {lens.identifier}
            </Link>
          </p>
          <p className="text-small text-ink-soft">
            {lens.description || 'No description'}
            {lens.partNumber ? <span className="numerals text-ink-faint"> · part {lens.partNumber}</span> : null}
          </p>
        </div>
        <div>
          <p className="text-caption text-ink-faint">Nominal focal length</p>
          <Quantity value={lens.nominalFocalLengthMm} unit="mm" digits={Math.abs(lens.nominalFocalLengthMm) < 10 ? 2 : 1} size="lead" />
          <p className="text-caption text-ink-faint">
            <Quantity value={lens.nominalPowerDioptres} unit="D" digits={3} /> · {lens.kind}
          </p>
        </div>
        <div>
          <p className="text-caption text-ink-faint">Tolerance</p>
          <p className="numerals text-lead text-ink">{toleranceText(lens)}</p>
        </div>
        <div>
          <p className="text-caption text-ink-faint">Accepted band</p>
          <p className="text-body">
            <Quantity value={band.lowerLimitMm} digits={2} /> <span className="text-ink-faint">to</span>{' '}
            <Quantity value={band.upperLimitMm} unit="mm" digits={2} />
          </p>
        </div>
      </div>
    </section>
  );
}

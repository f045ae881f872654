import { Link } from 'react-router-dom';
import { ConformityMark } from '@/components/ui/conformity-mark';
import { Quantity } from '@/components/ui/quantity';
import type { LatestLensMeasurement } from '@shared/schemas/lenses';
import { measurementStatusWords } from '@/features/lenses/components/lens-words';

/** The newest measurement of a lens: its number and stage, and its result once there is one. */
export function LatestMeasurementCell({ measurement, linkToMeasurement = true }: { measurement: LatestLensMeasurement | null; linkToMeasurement?: boolean }) {
  if (measurement === null) return <span className="text-ink-faint">not measured yet</span>;
  const hasResult = measurement.focalLengthMm !== null && measurement.expandedUncertaintyMm !== null;
  return (
    <span className="flex flex-col gap-0.5">
      <span className="flex items-baseline gap-2">
        {linkToMeasurement ? (
          <Link to={`/measurements/${measurement.id}`} className="numerals text-ink underline decoration-rule-strong underline-offset-4 hover:decoration-ink">
            {measurement.number}
          </Link>
        ) : (
          <span className="numerals text-ink">{measurement.number}</span>
        )}
        <span className="text-caption text-ink-faint">{measurementStatusWords(measurement.status)}</span>
      </span>
      {hasResult ? (
        <span className="flex flex-wrap items-center gap-x-2 gap-y-0.5">
          <Quantity value={measurement.focalLengthMm!} uncertainty={measurement.expandedUncertaintyMm!} unit="mm" />
          {measurement.decision ? <ConformityMark decision={measurement.decision} size="sm" /> : null}
        </span>
      ) : null}
    </span>
  );
}

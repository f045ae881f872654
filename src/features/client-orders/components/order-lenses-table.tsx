import { ConformityMark } from '@/components/ui/conformity-mark';
import { Quantity } from '@/components/ui/quantity';
import type { PortalLens, PortalMeasurement } from '@shared/schemas/portal';
import { CertificateDownloads } from '@/features/client-orders/components/certificate-downloads';
import { METHOD_WORDS, STAGE_WORDS, toleranceText } from '@/features/client-orders/lib/client-words';

function StageText({ measurement }: { measurement: PortalMeasurement }) {
  const marker = measurement.stage === 'certified' ? '●' : measurement.stage === 'in-review' ? '◐' : '○';
  return (
    <span className="inline-flex items-center gap-1.5 text-small text-ink-soft" data-stage={measurement.stage}>
      <span aria-hidden="true" className="text-ink">{marker}</span>
      {STAGE_WORDS[measurement.stage]}
    </span>
  );
}

function ResultCell({ measurement }: { measurement: PortalMeasurement }) {
  if (!measurement.result) return <span className="text-small text-ink-faint">Results come with the certificate</span>;
  const { focalLengthMm, expandedUncertaintyMm, coverageFactor, decision } = measurement.result;
  return (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-1" data-result>
      <span className="text-small text-ink-faint">f =</span>
      <Quantity value={focalLengthMm} uncertainty={expandedUncertaintyMm} unit="mm" size="lead" />
      <span className="numerals text-caption text-ink-faint">k = {coverageFactor.toFixed(2)}</span>
      <ConformityMark decision={decision} size="sm" />
    </div>
  );
}

/** The lenses of one order: nominal value and tolerance, then each measurement's stage, result and certificates. */
export function OrderLensesTable({ lenses }: { lenses: PortalLens[] }) {
  if (lenses.length === 0) return <p className="px-4 py-3 text-small text-ink-faint">No lenses on this order yet.</p>;
  return (
    <table className="w-full border-collapse text-left">
      <thead>
        <tr className="bg-shade/70 text-caption font-semibold uppercase tracking-wider text-ink-faint">
          <th scope="col" className="px-4 py-1.5">Lens</th>
          <th scope="col" className="px-3 py-1.5">Nominal</th>
          <th scope="col" className="px-3 py-1.5">Measurement</th>
          <th scope="col" className="px-3 py-1.5">Result, f ± U</th>
          <th scope="col" className="px-4 py-1.5">Certificate</th>
        </tr>
      </thead>
      <tbody>
        {lenses.map((lens) => {
          const rows = lens.measurements.length > 0 ? lens.measurements : [null];
          return rows.map((measurement, index) => (
            <tr key={`${lens.id}-${measurement?.number ?? 'none'}`} className="border-t border-rule align-top" data-lens={lens.identifier}>
              {index === 0 ? (
                <>
                  <td className="px-4 py-2.5" rowSpan={rows.length}>
                    <p className="font-mono text-small text-ink">{lens.identifier}</p>
                    {lens.description ? <p className="text-caption text-ink-faint">{lens.description}</p> : null}
                    {lens.partNumber ? <p className="text-caption text-ink-faint">Part {lens.partNumber}</p> : null}
                  </td>
                  <td className="px-3 py-2.5" rowSpan={rows.length}>
                    <Quantity value={lens.nominalFocalLengthMm} unit="mm" />
                    <p className="numerals text-caption text-ink-faint">{toleranceText(lens)}</p>
                  </td>
                </>
              ) : null}
              {measurement ? (
                <>
                  <td className="px-3 py-2.5">
                    <StageText measurement={measurement} />
                    <p className="text-caption text-ink-faint">
                      <span className="numerals">{measurement.number}</span> · {METHOD_WORDS[measurement.method]}
                    </p>
                  </td>
                  <td className="px-3 py-2.5">
                    <ResultCell measurement={measurement} />
                  </td>
                  <td className="px-4 py-2.5">
                    <CertificateDownloads revisions={measurement.certificates} />
                  </td>
                </>
              ) : (
                <td className="px-3 py-2.5 text-small text-ink-faint" colSpan={3}>
                  Waiting for the bench
                </td>
              )}
            </tr>
          ));
        })}
      </tbody>
    </table>
  );
}

import type { MeasurementDetail } from '@shared/schemas/measurements';
import { DataTable } from '@/components/ui/data-table';
import { Quantity } from '@/components/ui/quantity';
import { CalibrationMark } from '@/features/measurements/components/calibration-mark';
import { equipmentValuesText } from '@/features/measurements/utils/equipment-values-text';
import { EQUIPMENT_ROLE_WORDS, methodRequirements } from '@/features/measurements/utils/method-requirements';

const FOCUS_OPERATOR_WORDS: Record<string, string> = {
  'gradient-energy': 'gradient energy (Tenengrad)',
  'laplacian-variance': 'variance of the Laplacian',
  brenner: 'Brenner gradient',
  'normalised-variance': 'normalised grey-level variance',
};

type EquipmentRow = MeasurementDetail['equipment'][number];

/** The set-up as recorded: method, who and when, conditions, and each piece of equipment with its calibration and any override. */
export function MeasurementSetupSummary({ measurement }: { measurement: MeasurementDetail }) {
  const requirements = methodRequirements(measurement.method);
  const overrideFor = (equipmentId: string) => measurement.overrides.find((o) => o.equipmentId === equipmentId);
  return (
    <div className="grid gap-5 xl:grid-cols-[minmax(0,18rem)_minmax(0,1fr)]" data-role="measurement-setup">
      <dl className="grid grid-cols-[auto_1fr] content-start gap-x-4 gap-y-1.5 rounded-sheet border border-rule bg-sheet px-4 py-3 text-small">
        <dt className="text-ink-faint">Method</dt>
        <dd className="font-medium text-ink">{requirements.name}</dd>
        <dt className="text-ink-faint">Performed by</dt>
        <dd className="text-ink">{measurement.performedBy?.name ?? '—'}</dd>
        <dt className="text-ink-faint">Measured on</dt>
        <dd className="numerals text-ink">{measurement.measuredOn ?? '—'}</dd>
        <dt className="text-ink-faint">Temperature</dt>
        <dd>{measurement.temperatureC !== null ? <Quantity value={measurement.temperatureC} unit="°C" digits={1} /> : '—'}</dd>
        <dt className="text-ink-faint">Humidity</dt>
        <dd>{measurement.relativeHumidityPercent !== null ? <Quantity value={measurement.relativeHumidityPercent} unit="%" digits={0} /> : '—'}</dd>
        <dt className="text-ink-faint">Focus measure</dt>
        <dd className="text-ink">{FOCUS_OPERATOR_WORDS[measurement.focusOperator] ?? measurement.focusOperator}</dd>
        {measurement.notes ? (
          <>
            <dt className="text-ink-faint">Notes</dt>
            <dd className="text-ink">{measurement.notes}</dd>
          </>
        ) : null}
      </dl>
      <DataTable<EquipmentRow>
        caption="Equipment used"
        captionHidden
        columns={[
          { key: 'role', header: 'Role', widthClass: 'w-28', cell: (row) => EQUIPMENT_ROLE_WORDS[row.role] },
          {
            key: 'item',
            header: 'Item and values',
            cell: (row) => (
              <span>
                <span className="numerals font-semibold text-ink">{row.identifier}</span>
                {row.description ? <span className="ml-1.5 text-ink-soft">{row.description}</span> : null}
                <span className="block text-caption tabular-nums text-ink-faint">{equipmentValuesText(row)}</span>
              </span>
            ),
          },
          {
            key: 'calibration',
            header: 'Calibration',
            cell: (row) => {
              const override = overrideFor(row.id);
              return (
                <span className="block space-y-0.5">
                  <span className="numerals block text-ink">{row.calibrationReference}</span>
                  <CalibrationMark item={row} />
                  {override ? (
                    <span className="block rounded-hair border border-nonconform/35 bg-nonconform-tint/40 px-2 py-1 text-caption text-ink" data-role="override">
                      <span className="font-semibold">Used past its due date:</span>{' '}
                      {override.reason}
                      {override.recordedBy ? <span className="text-ink-faint"> — {override.recordedBy.name}</span> : null}
                    </span>
                  ) : null}
                </span>
              );
            },
          },
        ]}
        rows={measurement.equipment}
        rowKey={(row) => `${row.role}-${row.id}`}
        emptyText="No equipment recorded."
      />
    </div>
  );
}

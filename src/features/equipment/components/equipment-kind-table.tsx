import type { ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { Quantity } from '@/components/ui/quantity';
import type { EquipmentItem, EquipmentKindName } from '@shared/schemas/equipment';
import { CalibrationStateMark } from '@/features/equipment/components/calibration-state-mark';
import { describeCalibrationDue } from '@/features/equipment/lib/calibration-due';
import { EQUIPMENT_KIND_WORDS, EQUIPMENT_VALUE_FIELDS } from '@/features/equipment/lib/equipment-value-fields';

const missing = <span className="text-ink-faint">—</span>;

function numberValue(item: EquipmentItem, key: string): number | null {
  const value = item.values[key];
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

function valueWithU(item: EquipmentItem, key: string, uKey: string, unit: string): ReactNode {
  const value = numberValue(item, key);
  const u = numberValue(item, uKey);
  if (value === null) return missing;
  return u === null ? <Quantity value={value} unit={unit} /> : <Quantity value={value} uncertainty={u} unit={unit} />;
}

function choiceLabel(kind: EquipmentKindName, key: string, value: unknown): string | null {
  const field = EQUIPMENT_VALUE_FIELDS[kind].find((candidate) => candidate.key === key);
  if (!field || field.type !== 'choice' || typeof value !== 'string') return null;
  return field.choices.find((choice) => choice.value === value)?.label.replace(/ \(.*\)$/, '') ?? value;
}

/** A heading whose quantity symbol keeps its case (u is a standard uncertainty, U an expanded one). */
function withSymbol(words: string, symbol: string): ReactNode {
  return (
    <span className="whitespace-nowrap">
      {words ? `${words} ` : null}
      <span className="font-serif normal-case italic tracking-normal">{symbol}</span>
    </span>
  );
}

/** The value columns each kind needs; uncertainties are standard (k = 1), as on the calibration certificates. */
function valueColumns(kind: EquipmentKindName): DataTableColumn<EquipmentItem>[] {
  switch (kind) {
    case 'camera':
      return [
        {
          key: 'pitch',
          header: withSymbol('Pixel pitch', '± u'),
          numeric: true,
          cell: (item) => {
            const width = numberValue(item, 'widthPx');
            const height = numberValue(item, 'heightPx');
            return (
              <span className="inline-flex flex-col items-end">
                {valueWithU(item, 'pixelPitchUm', 'pixelPitchUncertaintyUm', 'µm')}
                {width !== null && height !== null ? (
                  <span className="whitespace-nowrap text-caption text-ink-faint">
                    {width} × {height}
                    <span className="font-sans font-light"> px</span>
                  </span>
                ) : null}
              </span>
            );
          },
        },
      ];
    case 'target':
      return [
        {
          key: 'pattern',
          header: 'Pattern',
          cell: (item) => (
            <span>
              {choiceLabel('target', 'pattern', item.values.pattern) ?? missing}
              {item.values.polarity ? <span className="block text-caption text-ink-faint">{choiceLabel('target', 'polarity', item.values.polarity)}</span> : null}
            </span>
          ),
        },
        { key: 'size', header: withSymbol('Size', '± u'), numeric: true, cell: (item) => valueWithU(item, 'sizeMm', 'sizeUncertaintyMm', 'mm') },
      ];
    case 'rail-scale':
      return [
        {
          key: 'u',
          header: withSymbol('Reading', 'u'),
          numeric: true,
          cell: (item) => {
            const u = numberValue(item, 'uncertaintyMm');
            return u === null ? missing : <Quantity value={u} unit="mm" digits={u > 0 ? Math.min(6, Math.max(2, 1 - Math.floor(Math.log10(u)))) : 2} />;
          },
        },
        {
          key: 'length',
          header: 'Length',
          numeric: true,
          cell: (item) => {
            const length = numberValue(item, 'lengthMm');
            return length === null ? missing : <Quantity value={length} unit="mm" digits={0} />;
          },
        },
      ];
    case 'collimator':
    case 'auxiliary-lens':
      return [{ key: 'focal', header: withSymbol('', 'f′ ± u'), numeric: true, cell: (item) => valueWithU(item, 'focalLengthMm', 'focalLengthUncertaintyMm', 'mm') }];
  }
}

export interface EquipmentKindTableProps {
  kind: EquipmentKindName;
  items: readonly EquipmentItem[];
  todayIsoDate: string;
  /** Admin actions; absent for read-only viewers. */
  actions?: {
    onEdit: (item: EquipmentItem) => void;
    onRetire: (item: EquipmentItem) => void;
    onReturnToService: (item: EquipmentItem) => void;
    /** The item whose retirement waits for a second click, if any. */
    confirmingRetireId: string | null;
    onCancelRetire: () => void;
    busyId: string | null;
  };
}

export function EquipmentKindTable({ kind, items, todayIsoDate, actions }: EquipmentKindTableProps) {
  const columns: DataTableColumn<EquipmentItem>[] = [
    {
      key: 'identifier',
      header: 'Identifier',
      widthClass: 'min-w-44',
      cell: (item) => (
        <span className={`block ${item.active && item.calibrationState === 'overdue' ? '-ml-3 border-l-4 border-nonconform pl-2' : ''}`}>
          <span className="numerals whitespace-nowrap font-medium text-ink">{item.identifier}</span>
          {!item.active ? <span className="ml-2 rounded-hair border border-rule px-1 text-caption italic text-ink-faint">retired</span> : null}
          {item.description ? <span className="block max-w-[18rem] text-caption text-ink-faint">{item.description}</span> : null}
        </span>
      ),
    },
    {
      key: 'serial',
      header: 'Serial no.',
      cell: (item) => (item.serialNumber ? <span className="numerals whitespace-nowrap text-small">{item.serialNumber}</span> : missing),
    },
    ...valueColumns(kind),
    {
      key: 'calibration',
      header: 'Calibration',
      cell: (item) => (
        <span className="block">
          <span className="block whitespace-nowrap text-small">{item.calibrationReference}</span>
          <span className="text-caption text-ink-faint">
            due <span className="numerals text-ink-soft">{item.calibrationDueDate}</span>
          </span>
        </span>
      ),
    },
    {
      key: 'state',
      header: 'State',
      cell: (item) =>
        item.active ? (
          <CalibrationStateMark
            due={describeCalibrationDue({
              calibrationDueDate: item.calibrationDueDate,
              todayIsoDate,
              serverState: item.calibrationState,
              serverDaysLeft: item.daysUntilCalibrationDue,
            })}
          />
        ) : (
          <span className="text-small italic text-ink-faint">Out of service</span>
        ),
    },
  ];
  if (actions) {
    columns.push({
      key: 'actions',
      header: <span className="sr-only">Actions</span>,
      widthClass: 'w-px',
      cell: (item) => {
        const busy = actions.busyId === item.id;
        if (actions.confirmingRetireId === item.id) {
          return (
            <span className="flex justify-end gap-1 whitespace-nowrap">
              <Button size="sm" variant="primary" onClick={() => actions.onRetire(item)} isBusy={busy}>
                Retire it
              </Button>
              <Button size="sm" variant="quiet" onClick={actions.onCancelRetire} disabled={busy}>
                Keep
              </Button>
            </span>
          );
        }
        return (
          <span className="flex justify-end gap-1 whitespace-nowrap">
            <Button size="sm" variant="secondary" onClick={() => actions.onEdit(item)} aria-label={`Edit ${item.identifier}`}>
              Edit
            </Button>
            {item.active ? (
              <Button size="sm" variant="quiet" onClick={() => actions.onRetire(item)} aria-label={`Retire ${item.identifier}`}>
                Retire
              </Button>
            ) : (
              <Button size="sm" variant="quiet" onClick={() => actions.onReturnToService(item)} isBusy={busy} aria-label={`Return ${item.identifier} to service`}>
                Return to service
              </Button>
            )}
          </span>
        );
      },
    });
  }
  return (
    <DataTable
      caption={EQUIPMENT_KIND_WORDS[kind].many}
      captionHidden
      columns={columns}
      rows={items}
      rowKey={(item) => item.id}
      isRowMuted={(item) => !item.active}
      emptyText={`No ${EQUIPMENT_KIND_WORDS[kind].many.toLowerCase()} in the register.`}
    />
  );
}

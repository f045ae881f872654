import type { EquipmentItem } from '@shared/schemas/equipment';

function CalibrationGlyph({ state }: { state: EquipmentItem['calibrationState'] }) {
  const common = { fill: 'none', stroke: 'currentColor', strokeWidth: 1.4, strokeLinecap: 'round' as const, strokeLinejoin: 'round' as const };
  return (
    <svg viewBox="0 0 16 16" className="size-3.5 shrink-0" aria-hidden="true" focusable="false" data-glyph={`calibration-${state}`}>
      {state === 'due-soon' ? (
        <>
          <path d="M4 1.8h8M4 14.2h8M5 1.8c0 3.6 6 4.4 6 12.4M11 1.8c0 3.6-6 4.4-6 12.4" {...common} />
          <path d="M6.3 4.6h3.4L8 6.6Z" fill="currentColor" />
        </>
      ) : (
        <>
          <rect x="2" y="3" width="12" height="11" rx="1" {...common} />
          <path d="M2 6.2h12M5 1.6v2.6M11 1.6v2.6" {...common} />
          {state === 'current' ? (
            <path d="M5.4 10.2 7.2 11.9 10.6 8.4" {...common} />
          ) : (
            <path d="M5.2 8.2 10.8 13.2M10.8 8.2 5.2 13.2" {...common} strokeWidth={1.6} />
          )}
        </>
      )}
    </svg>
  );
}

const LOOK: Record<EquipmentItem['calibrationState'], string> = {
  current: 'text-ink-soft',
  'due-soon': 'border border-undecided/40 bg-undecided-tint text-undecided font-medium px-1.5',
  overdue: 'border border-nonconform/45 bg-nonconform-tint text-nonconform font-semibold px-1.5',
};

export function calibrationWords(item: Pick<EquipmentItem, 'calibrationState' | 'calibrationDueDate' | 'daysUntilCalibrationDue'>): string {
  const days = item.daysUntilCalibrationDue;
  switch (item.calibrationState) {
    case 'current':
      return `Calibrated, due ${item.calibrationDueDate}`;
    case 'due-soon':
      return days === 0 ? 'Calibration due today' : `Calibration due in ${days} ${days === 1 ? 'day' : 'days'}`;
    case 'overdue':
      return `Calibration overdue since ${item.calibrationDueDate}`;
  }
}

/** Calibration state by word and outline (calendar with a tick, hourglass, calendar struck through). */
export function CalibrationMark({ item }: { item: Pick<EquipmentItem, 'calibrationState' | 'calibrationDueDate' | 'daysUntilCalibrationDue'> }) {
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-hair py-px text-small ${LOOK[item.calibrationState]}`}
      data-calibration={item.calibrationState}
    >
      <CalibrationGlyph state={item.calibrationState} />
      {calibrationWords(item)}
    </span>
  );
}

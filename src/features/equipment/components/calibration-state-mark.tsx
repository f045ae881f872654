import type { CalibrationState } from '@shared/schemas/equipment';
import type { CalibrationDue } from '@/features/equipment/lib/calibration-due';

/** Three outlines that differ without colour: a calendar with a tick, an hourglass, a calendar struck through. */
function CalibrationGlyph({ state }: { state: CalibrationState }) {
  const common = { fill: 'none', stroke: 'currentColor', strokeWidth: 1.4, strokeLinecap: 'round' as const, strokeLinejoin: 'round' as const };
  return (
    <svg viewBox="0 0 16 16" className="size-3.5 shrink-0" aria-hidden="true" focusable="false" data-glyph={`calibration-${state}`}>
      {state === 'current' ? (
        <>
          <rect x="2" y="3" width="12" height="11" rx="1" {...common} />
          <path d="M2 6.2h12M5 1.6v2.6M11 1.6v2.6" {...common} />
          <path d="M5.4 10.2 7.2 11.9 10.6 8.4" {...common} />
        </>
      ) : null}
      {state === 'due-soon' ? (
        <>
          <path d="M4 1.8h8M4 14.2h8M5 1.8c0 3.6 6 4.4 6 12.4M11 1.8c0 3.6-6 4.4-6 12.4" {...common} />
          <path d="M6.3 4.6h3.4L8 6.6Z" fill="currentColor" />
        </>
      ) : null}
      {state === 'overdue' ? (
        <>
          <rect x="2" y="3" width="12" height="11" rx="1" {...common} />
          <path d="M2 6.2h12M5 1.6v2.6M11 1.6v2.6" {...common} />
          <path d="M5.2 8.2 10.8 13.2M10.8 8.2 5.2 13.2" {...common} strokeWidth={1.6} />
        </>
      ) : null}
    </svg>
  );
}

const LOOK: Record<CalibrationState, string> = {
  current: 'text-ink-soft',
  'due-soon': 'border border-undecided/40 bg-undecided-tint text-undecided font-medium px-1.5',
  overdue: 'border border-nonconform/45 bg-nonconform-tint text-nonconform font-semibold px-1.5',
};

/** The calibration state by word and outline; "due soon" and "overdue" also sit on a tinted chip. */
export function CalibrationStateMark({ due }: { due: CalibrationDue }) {
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-hair py-px text-small ${LOOK[due.state]}`}
      data-calibration={due.state}
      title={due.state === 'overdue' && due.daysLeft < 0 ? `${-due.daysLeft} days past its calibration due date` : undefined}
    >
      <CalibrationGlyph state={due.state} />
      <span>{due.text}</span>
    </span>
  );
}

import type { MeasurementStatus } from '@shared/schemas/measurements';

export const MEASUREMENT_STATUS_WORDS: Record<MeasurementStatus, string> = {
  draft: 'Draft',
  analysing: 'Analysing',
  analysed: 'Analysed',
  'analysis-failed': 'Analysis failed',
  submitted: 'With the reviewer',
  approved: 'Approved',
  returned: 'Returned to the bench',
  certified: 'Certified',
};

const common = { fill: 'none', stroke: 'currentColor', strokeWidth: 1.4, strokeLinecap: 'round' as const, strokeLinejoin: 'round' as const };

/** One outline per status, so the status reads without colour: each shape differs, not only its tint. */
function StatusGlyph({ status }: { status: MeasurementStatus }) {
  let drawing;
  switch (status) {
    case 'draft':
      drawing = <circle cx="8" cy="8" r="6.2" {...common} strokeDasharray="2.2 2" />;
      break;
    case 'analysing':
      drawing = (
        <>
          <circle cx="8" cy="8" r="6.2" {...common} opacity={0.35} />
          <path d="M8 1.8a6.2 6.2 0 0 1 6.2 6.2" {...common} strokeWidth={1.8} />
          <circle cx="8" cy="8" r="1.3" fill="currentColor" />
        </>
      );
      break;
    case 'analysed':
      drawing = (
        <>
          <circle cx="8" cy="8" r="6.2" {...common} />
          <path d="M4.6 8.6h1.6l1.2-3 1.6 5.2 1.2-2.2h1.4" {...common} />
        </>
      );
      break;
    case 'analysis-failed':
      drawing = (
        <>
          <rect x="1.8" y="1.8" width="12.4" height="12.4" rx="1" {...common} />
          <path d="M5.4 5.4 10.6 10.6M10.6 5.4 5.4 10.6" {...common} />
        </>
      );
      break;
    case 'submitted':
      // An hourglass: waiting on a second person (a tray with an arrow read as a download button).
      drawing = (
        <>
          <path d="M4.2 1.8h7.6M4.2 14.2h7.6" {...common} />
          <path d="M5.4 1.8v1.7c0 1.7 2.6 2.8 2.6 4.5s-2.6 2.8-2.6 4.5v1.7M10.6 1.8v1.7c0 1.7-2.6 2.8-2.6 4.5s2.6 2.8 2.6 4.5v1.7" {...common} />
          <path d="M6.5 13.2 8 11.4l1.5 1.8Z" fill="currentColor" />
        </>
      );
      break;
    case 'approved':
      drawing = (
        <>
          <path d="M8 1.5 13.8 4v4.2c0 3.2-2.6 5.4-5.8 6.3-3.2-.9-5.8-3.1-5.8-6.3V4Z" {...common} />
          <path d="M5.3 8.2 7.2 10 10.8 6.2" {...common} />
        </>
      );
      break;
    case 'returned':
      drawing = <path d="M6 3.2 2.6 6.4 6 9.6M2.8 6.4h6.6a4 4 0 0 1 0 8H7" {...common} />;
      break;
    case 'certified':
      drawing = (
        <>
          <circle cx="8" cy="6.4" r="4.6" {...common} />
          <path d="M5.4 10.2 4.2 14.8 8 13.2 11.8 14.8 10.6 10.2" {...common} />
          <circle cx="8" cy="6.4" r="1.8" fill="currentColor" />
        </>
      );
      break;
  }
  return (
    <svg viewBox="0 0 16 16" className="size-4 shrink-0" aria-hidden="true" focusable="false" data-glyph={`status-${status}`}>
      {drawing}
    </svg>
  );
}

const LOOK: Partial<Record<MeasurementStatus, string>> = {
  'analysis-failed': 'border-nonconform/45 bg-nonconform-tint text-nonconform',
  returned: 'border-undecided/40 bg-undecided-tint text-undecided',
};

/**
 * A measurement's status by word and its own outline; only the two that need
 * action carry a tint. `plain` drops the frame of the others, for a page
 * header where a framed word would sit among buttons and read as one.
 */
export function MeasurementStatusMark({ status, size = 'md', plain = false }: { status: MeasurementStatus; size?: 'sm' | 'md'; plain?: boolean }) {
  const framed = !plain || LOOK[status] !== undefined;
  const look = LOOK[status] ?? (framed ? 'border-rule-strong bg-sheet text-ink' : 'border-transparent text-ink');
  const padding = !framed ? '' : size === 'sm' ? 'px-1.5' : 'px-2';
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-hair border font-medium ${look} ${padding} ${
        size === 'sm' ? 'py-px text-caption' : 'py-0.5 text-small'
      }`}
      data-status={status}
    >
      <StatusGlyph status={status} />
      {MEASUREMENT_STATUS_WORDS[status]}
    </span>
  );
}

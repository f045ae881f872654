/**
 * The technician's open measurements grouped by status, in the order they
 * need the technician: sent back first, then failed, unfinished, running,
 * ready to submit, and last what waits for a reviewer.
 */
import type { MeasurementListItem, MeasurementStatus } from '@shared/schemas/measurements';

export interface OpenWorkGroup {
  status: MeasurementStatus;
  /** What to do next, in one sentence. */
  nextStep: string;
  items: MeasurementListItem[];
}

const GROUPS: { status: MeasurementStatus; nextStep: string }[] = [
  { status: 'returned', nextStep: 'A reviewer sent these back with comments; correct them and analyse again.' },
  { status: 'analysis-failed', nextStep: 'Read the engine’s sentence, fix the frames or readings, and re-run.' },
  { status: 'draft', nextStep: 'Upload the frames, give their rail readings, then analyse.' },
  { status: 'analysing', nextStep: 'The engine is measuring the frames; each page shows the progress.' },
  { status: 'analysed', nextStep: 'Check the result, exclude frames and re-run if needed, then submit for review.' },
  { status: 'submitted', nextStep: 'Waiting for a reviewer; nothing to do at the bench.' },
];

export function groupOpenMeasurements(items: readonly MeasurementListItem[]): OpenWorkGroup[] {
  return GROUPS.map(({ status, nextStep }) => ({
    status,
    nextStep,
    items: items.filter((item) => item.status === status).sort((a, b) => (a.updatedAt < b.updatedAt ? 1 : a.updatedAt > b.updatedAt ? -1 : 0)),
  })).filter((group) => group.items.length > 0);
}

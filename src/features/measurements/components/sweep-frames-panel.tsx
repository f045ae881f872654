import { useEffect, useMemo, useState } from 'react';
import { canChangeFrames, type MeasurementStatus, type SweepDetail } from '@shared/schemas/measurements';
import type { Frame } from '@shared/schemas/frames';
import type { ReadingsBody } from '@shared/schemas/readings';
import { formatFixed } from '@/components/charts/chart-format';
import { ProblemNote } from '@/components/ui/problem-note';
import { isApiError } from '@/lib/api-client';
import { useDeleteFrame } from '@/features/measurements/api/delete-frame';
import { usePutSweepReadings } from '@/features/measurements/api/put-sweep-readings';
import { useSetFrameExcluded } from '@/features/measurements/api/update-frame';
import { FrameDropZone } from '@/features/measurements/components/frame-drop-zone';
import { FramePreviewDialog } from '@/features/measurements/components/frame-preview-dialog';
import { FramesTable } from '@/features/measurements/components/frames-table';
import { ReadingsEntry, type ReadingsMode } from '@/features/measurements/components/readings-entry';
import { UploadList } from '@/features/measurements/components/upload-list';
import { useFrameUploads } from '@/features/measurements/hooks/use-frame-uploads';
import { MINIMUM_FRAMES_PER_SWEEP } from '@/features/measurements/utils/analysis-readiness';
import { parseDecimal } from '@/features/measurements/utils/parse-decimal';
import {
  editedReadingsPreview,
  startStepReadingsPreview,
  textReadingsPreview,
  type ReadingsPreview,
} from '@/features/measurements/utils/readings-preview';

export interface SweepFramesPanelProps {
  measurementId: string;
  status: MeasurementStatus;
  sweep: SweepDetail;
  sweepCount: number;
  /** True once any analysis was requested: frames can then be excluded but no longer removed. */
  hasAnalyses: boolean;
  /** False for people who may read but not change the bench work (reviewers, admins). */
  mayEdit: boolean;
  onUploadsInFlightChange?: (sweepId: string, count: number) => void;
}

function fixedReadingsText(sweep: SweepDetail): string {
  const parts: string[] = [];
  if (sweep.objectPositionMm !== null) parts.push(`target at ${formatFixed(sweep.objectPositionMm, 3)} mm`);
  if (sweep.lensPositionMm !== null) parts.push(`lens mark at ${formatFixed(sweep.lensPositionMm, 3)} mm`);
  if (sweep.sensorPositionMm !== null) parts.push(`sensor at ${formatFixed(sweep.sensorPositionMm, 3)} mm`);
  return `${sweep.moving === 'sensor' ? 'Sensor moves' : 'Lens moves'}${parts.length > 0 ? `; ${parts.join(', ')}` : ''}.`;
}

/**
 * One sweep on the measurement page: drop many frames (each uploads with its
 * own progress), give their rail readings three ways with a preview before
 * saving, and choose which frames the next analysis uses.
 */
export function SweepFramesPanel({ measurementId, status, sweep, sweepCount, hasAnalyses, mayEdit, onUploadsInFlightChange }: SweepFramesPanelProps) {
  const sweepLabel = sweepCount > 1 ? `sweep ${sweep.position + 1}` : 'the sweep';
  const canChange = mayEdit && canChangeFrames(status);
  const frames = sweep.frames;
  const uploads = useFrameUploads({ measurementId, sweepId: sweep.id, existingFileNames: frames.map((f) => f.fileName) });
  const inFlight = uploads.summary.waiting + uploads.summary.uploading;
  useEffect(() => onUploadsInFlightChange?.(sweep.id, inFlight), [inFlight, onUploadsInFlightChange, sweep.id]);

  const [mode, setMode] = useState<ReadingsMode | null>(null);
  const [startText, setStartText] = useState('');
  const [stepText, setStepText] = useState('');
  const [text, setText] = useState('');
  const [editedCells, setEditedCells] = useState<Record<string, string>>({});
  const [previewIndex, setPreviewIndex] = useState<number | null>(null);
  const putReadings = usePutSweepReadings(measurementId);
  const setExcluded = useSetFrameExcluded(measurementId);
  const removeFrame = useDeleteFrame(measurementId);

  const preview: ReadingsPreview | null = useMemo(() => {
    if (mode === 'start-step') return startStepReadingsPreview({ frames, startText, stepText });
    if (mode === 'text') return textReadingsPreview({ frames, text });
    if (mode === 'edit') return editedReadingsPreview({ frames, cellTexts: editedCells });
    return null;
  }, [mode, frames, startText, stepText, text, editedCells]);

  const serverFields = putReadings.error && isApiError(putReadings.error) ? putReadings.error.fields : {};
  const rowProblems = useMemo(() => {
    const problems: Record<string, string> = {};
    if (mode === 'edit' || mode === 'text') Object.assign(problems, preview?.fileProblems ?? {});
    for (const frame of frames) if (serverFields[frame.fileName]) problems[frame.fileName] = serverFields[frame.fileName];
    return problems;
  }, [mode, preview, frames, serverFields]);

  function changeMode(next: ReadingsMode | null) {
    putReadings.reset();
    setMode(next);
    if (next === 'edit') setEditedCells({});
  }

  function save() {
    if (!preview?.ready) return;
    let body: ReadingsBody;
    if (mode === 'start-step') body = { mode: 'start-step', startMm: parseDecimal(startText) as number, stepMm: parseDecimal(stepText) as number };
    else if (mode === 'text') body = { mode: 'text', text };
    else body = { mode: 'table', rows: preview.rows.map((row) => ({ fileName: row.fileName, positionMm: row.positionMm as number })) };
    putReadings.mutate({ sweepId: sweep.id, body }, { onSuccess: () => setMode(null) });
  }

  const withReading = frames.filter((f) => f.positionMm !== null).length;
  const included = frames.filter((f) => !f.excluded).length;
  const saveError =
    putReadings.error === null
      ? null
      : {
          message: putReadings.error.message,
          details: isApiError(putReadings.error) ? Object.entries(putReadings.error.fields).filter(([key]) => !frames.some((f) => f.fileName === key)).map(([, v]) => v) : [],
        };

  return (
    <section
      aria-label={`Frames of ${sweepLabel}`}
      className="space-y-3 rounded-sheet border border-rule bg-sheet/60 p-4"
      data-role="sweep-panel"
      data-sweep={sweep.position + 1}
    >
      <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
        <h3 className="text-title-sm">{sweepCount > 1 ? `Sweep ${sweep.position + 1}` : 'Sweep'}</h3>
        <p className="text-small text-ink-soft">{fixedReadingsText(sweep)}</p>
        <p className="ml-auto text-small text-ink-soft" data-role="sweep-counts">
          <span className="numerals text-ink">{frames.length}</span> frames · <span className="numerals text-ink">{withReading}</span> with readings
          · <span className="numerals text-ink">{included}</span> in analysis
          {included < MINIMUM_FRAMES_PER_SWEEP ? <span className="text-ink-faint"> (needs ≥ {MINIMUM_FRAMES_PER_SWEEP})</span> : null}
        </p>
      </div>

      {canChange ? (
        <>
          <FrameDropZone onFiles={uploads.add} disabled={false} sweepLabel={sweepLabel} />
          <UploadList entries={uploads.entries} summary={uploads.summary} refused={uploads.refused} onRetry={uploads.retry} onClearFinished={uploads.clearFinished} />
        </>
      ) : mayEdit ? (
        <p className="text-small text-ink-faint">
          Frames and readings are fixed while the measurement is {status === 'analysing' ? 'being analysed' : 'with the reviewer or certified'}.
        </p>
      ) : null}

      <ReadingsEntry
        mode={mode}
        onModeChange={changeMode}
        startText={startText}
        stepText={stepText}
        onStartStepChange={({ startText: s, stepText: t }) => {
          if (s !== undefined) setStartText(s);
          if (t !== undefined) setStepText(t);
        }}
        text={text}
        onTextChange={setText}
        preview={preview}
        onSave={save}
        isSaving={putReadings.isPending}
        saveError={saveError}
        frameCount={frames.length}
        canChange={canChange && inFlight === 0}
      />

      {setExcluded.error ? <ProblemNote title="The frame was not changed" message={setExcluded.error.message} /> : null}
      {removeFrame.error ? <ProblemNote title="The frame was not removed" message={removeFrame.error.message} /> : null}

      <FramesTable
        sweepLabel={sweepLabel}
        frames={frames}
        preview={mode === 'start-step' || mode === 'text' ? preview : null}
        editedCells={mode === 'edit' ? editedCells : null}
        onEditCell={(fileName, value) => setEditedCells((cells) => ({ ...cells, [fileName]: value }))}
        rowProblems={rowProblems}
        canChange={canChange}
        onToggleExcluded={(frame: Frame) => setExcluded.mutate({ frameId: frame.id, excluded: !frame.excluded })}
        togglingFrameId={setExcluded.isPending ? (setExcluded.variables?.frameId ?? null) : null}
        onRemove={canChange && !hasAnalyses ? (frame: Frame) => removeFrame.mutate(frame.id) : null}
        onOpenPreview={(frame) => setPreviewIndex(frames.findIndex((f) => f.id === frame.id))}
      />
      <FramePreviewDialog frames={frames} index={previewIndex} onIndexChange={setPreviewIndex} sweepLabel={sweepLabel} />
    </section>
  );
}

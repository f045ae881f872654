import { useId, useRef, type ReactNode } from 'react';
import { formatFixed } from '@/components/charts/chart-format';
import { Button } from '@/components/ui/button';
import { ProblemNote } from '@/components/ui/problem-note';
import { TextField } from '@/components/ui/text-field';
import { FieldProblem } from '@/components/ui/field-frame';
import type { ReadingsPreview } from '@/features/measurements/utils/readings-preview';

export type ReadingsMode = 'start-step' | 'text' | 'edit';

export const READINGS_MODE_WORDS: Record<ReadingsMode, string> = {
  'start-step': 'Start and step',
  text: 'Paste or upload a table',
  edit: 'Type into the frames table',
};

export interface ReadingsEntryProps {
  mode: ReadingsMode | null;
  onModeChange: (mode: ReadingsMode | null) => void;
  startText: string;
  stepText: string;
  onStartStepChange: (change: { startText?: string; stepText?: string }) => void;
  text: string;
  onTextChange: (text: string) => void;
  preview: ReadingsPreview | null;
  onSave: () => void;
  isSaving: boolean;
  /** The server's refusal: its sentence and per-file or per-line sentences. */
  saveError: { message: string; details: string[] } | null;
  frameCount: number;
  canChange: boolean;
}

function PreviewSummary({ preview }: { preview: ReadingsPreview }) {
  const given = preview.rows.filter((row) => row.positionMm !== null);
  if (given.length === 0) return null;
  const positions = given.map((row) => row.positionMm as number);
  const fromMm = Math.min(...positions);
  const toMm = Math.max(...positions);
  return (
    <p className="text-small text-ink-soft" data-role="readings-preview-summary">
      <span className="numerals text-ink">{given.length}</span> of <span className="numerals text-ink">{preview.rows.length}</span> frames get a
      reading, from <span className="numerals text-ink">{formatFixed(fromMm, 3)}</span> to{' '}
      <span className="numerals text-ink">{formatFixed(toMm, 3)}</span> mm; <span className="numerals text-ink">{preview.changedCount}</span>{' '}
      {preview.changedCount === 1 ? 'changes' : 'change'}. The “New reading” column shows each one.
    </p>
  );
}

function ProblemList({ title, items }: { title: string; items: string[] }) {
  if (items.length === 0) return null;
  return (
    <div className="rounded-sheet border border-nonconform/40 bg-nonconform-tint/40 px-3 py-2" data-role="readings-problems">
      <p className="text-small font-semibold text-ink">{title}</p>
      <ul className="mt-1 max-h-40 space-y-0.5 overflow-y-auto text-small text-ink">
        {items.map((item, index) => (
          <li key={index}>{item}</li>
        ))}
      </ul>
    </div>
  );
}

/**
 * The three ways to give a sweep's rail readings: a start and step in
 * natural file-name order, a pasted or uploaded two-column table with its
 * problems shown per line as it is typed, or typing into the frames table.
 * Nothing is saved until the preview is complete and Save is pressed.
 */
export function ReadingsEntry(props: ReadingsEntryProps) {
  const { mode, onModeChange, preview, onSave, isSaving, saveError, frameCount, canChange } = props;
  const name = useId();
  const fileInput = useRef<HTMLInputElement>(null);

  if (!canChange || frameCount === 0) return null;

  let body: ReactNode = null;
  if (mode === 'start-step') {
    body = (
      <div className="grid gap-3 sm:grid-cols-[12rem_12rem_1fr] sm:items-start">
        <TextField
          label="First frame’s reading (mm)"
          inputMode="decimal"
          value={props.startText}
          onChange={(event) => props.onStartStepChange({ startText: event.target.value })}
          error={props.startText !== '' ? preview?.fieldProblems.startMm : undefined}
          placeholder="e.g. 447.0"
          autoFocus
        />
        <TextField
          label="Step between frames (mm)"
          inputMode="decimal"
          value={props.stepText}
          onChange={(event) => props.onStartStepChange({ stepText: event.target.value })}
          error={props.stepText !== '' ? preview?.fieldProblems.stepMm : undefined}
          placeholder="e.g. 0.25"
        />
        <p className="pt-7 text-caption text-ink-faint">
          Frames are taken in natural file-name order (frame_2 before frame_10). A negative step gives falling readings.
        </p>
      </div>
    );
  } else if (mode === 'text') {
    const lineProblems = preview?.lineProblems.map((problem) => problem.message) ?? [];
    const fileProblems = Object.values(preview?.fileProblems ?? {});
    body = (
      <div className="space-y-2">
        <div className="flex flex-wrap items-end justify-between gap-2">
          <label htmlFor={`${name}-text`} className="text-small font-medium text-ink">
            Two columns per line: file name, rail reading in mm
          </label>
          <div>
            <input
              ref={fileInput}
              type="file"
              accept=".csv,.tsv,.txt,text/csv,text/plain,text/tab-separated-values"
              className="sr-only"
              aria-label="Upload a readings table file"
              onChange={async (event) => {
                const file = event.target.files?.[0];
                if (file) props.onTextChange(await file.text());
                event.target.value = '';
              }}
            />
            <Button variant="secondary" size="sm" onClick={() => fileInput.current?.click()}>
              Load a .csv or .txt file…
            </Button>
          </div>
        </div>
        <textarea
          id={`${name}-text`}
          value={props.text}
          onChange={(event) => props.onTextChange(event.target.value)}
          rows={8}
          spellCheck={false}
          placeholder={'file,position_mm\nframe_0001.png,447.00\nframe_0002.png,447.25'}
          className="w-full rounded-sheet border border-rule-strong bg-sheet px-3 py-2 font-mono text-small text-ink"
          aria-describedby={`${name}-text-hint`}
          autoFocus
        />
        <p id={`${name}-text-hint`} className="text-caption text-ink-faint">
          Columns separated by a comma, semicolon, tab or spaces; a header line and lines starting with # are skipped.
        </p>
        {props.text.trim() !== '' ? (
          <>
            <ProblemList title={`Problems in the text (${lineProblems.length})`} items={lineProblems} />
            <ProblemList title={`Problems by file (${fileProblems.length})`} items={fileProblems} />
          </>
        ) : null}
      </div>
    );
  } else if (mode === 'edit') {
    const fileProblems = Object.values(preview?.fileProblems ?? {});
    body = (
      <div className="space-y-2">
        <p className="text-small text-ink-soft">Type each frame’s rail reading into the table below, then save them all at once.</p>
        {fileProblems.length > 0 ? <FieldProblem message={`${fileProblems.length} ${fileProblems.length === 1 ? 'reading needs' : 'readings need'} attention: ${fileProblems[0]}${fileProblems.length > 1 ? ' …' : ''}`} /> : null}
      </div>
    );
  }

  return (
    <div className="space-y-3 rounded-sheet border border-rule bg-paper/60 px-4 py-3" data-role="readings-entry">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <p className="text-small font-semibold text-ink">Rail readings</p>
        <div role="radiogroup" aria-label="How to enter the rail readings" className="inline-flex overflow-hidden rounded-sheet border border-rule-strong">
          {(Object.keys(READINGS_MODE_WORDS) as ReadingsMode[]).map((option) => (
            <button
              key={option}
              type="button"
              role="radio"
              aria-checked={mode === option}
              onClick={() => onModeChange(mode === option ? null : option)}
              className={`border-r border-rule-strong px-3 py-1 text-small last:border-r-0 ${mode === option ? 'bg-ink text-sheet' : 'bg-sheet text-ink-soft hover:bg-shade'}`}
            >
              {READINGS_MODE_WORDS[option]}
            </button>
          ))}
        </div>
      </div>
      {body}
      {mode !== null ? (
        <div className="space-y-2">
          {preview && preview.ready ? <PreviewSummary preview={preview} /> : null}
          {saveError ? (
            <ProblemNote title="The readings were not saved" message={saveError.message} action={saveError.details.length > 0 ? <ul className="list-disc pl-4 text-small text-ink-soft">{saveError.details.slice(0, 8).map((d, i) => <li key={i}>{d}</li>)}</ul> : undefined} />
          ) : null}
          <div className="flex items-center gap-2">
            <Button size="sm" onClick={onSave} disabled={!preview?.ready} isBusy={isSaving}>
              Save readings
            </Button>
            <Button size="sm" variant="quiet" onClick={() => onModeChange(null)}>
              Cancel
            </Button>
            {!preview?.ready ? <span className="text-caption text-ink-faint">Save is possible once every frame has exactly one reading.</span> : null}
          </div>
        </div>
      ) : null}
    </div>
  );
}

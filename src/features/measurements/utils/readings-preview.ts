/**
 * What a readings entry will do before it is saved: which frame gets which
 * rail reading, and every problem by line or by file. Built on the same
 * shared functions the server runs for `PUT …/readings`, so the preview and
 * the stored readings cannot differ.
 */
import type { Frame } from '@shared/schemas/frames';
import {
  assignReadings,
  parseReadingsTable,
  readingsFromStartStep,
  type ReadingsProblem,
  type ReadingsSourceRow,
} from '@shared/schemas/readings';
import { parseDecimal } from '@/features/measurements/utils/parse-decimal';

export interface ReadingsPreviewRow {
  fileName: string;
  /** The reading this entry gives the frame; null when it gives none. */
  positionMm: number | null;
  /** The frame's reading now. */
  currentPositionMm: number | null;
  changed: boolean;
}

export interface ReadingsPreview {
  /** One row per frame, in natural file-name order for start + step, in the frames' order otherwise. */
  rows: ReadingsPreviewRow[];
  /** Problems of the text itself, by line. */
  lineProblems: ReadingsProblem[];
  /** Sentences by file name (or by the name a line gave): unknown files, repeats, frames without a reading. */
  fileProblems: Record<string, string>;
  /** Problems of the start and step fields, by field. */
  fieldProblems: Partial<Record<'startMm' | 'stepMm', string>>;
  /** True when saving would give every frame exactly one reading. */
  ready: boolean;
  changedCount: number;
}

function previewFrom(frames: readonly Frame[], sourceRows: readonly ReadingsSourceRow[], orderedNames: readonly string[]) {
  const assignment = assignReadings({ fileNames: frames.map((f) => f.fileName), rows: sourceRows });
  const current = new Map(frames.map((f) => [f.fileName, f.positionMm]));
  const rows = orderedNames.map((fileName) => {
    const positionMm = assignment.positionsMmByFileName.get(fileName) ?? null;
    const currentPositionMm = current.get(fileName) ?? null;
    return { fileName, positionMm, currentPositionMm, changed: positionMm !== null && positionMm !== currentPositionMm };
  });
  return { rows, fileProblems: assignment.problems, changedCount: rows.filter((r) => r.changed).length };
}

export function startStepReadingsPreview(options: { frames: readonly Frame[]; startText: string; stepText: string }): ReadingsPreview {
  const { frames } = options;
  const startMm = parseDecimal(options.startText);
  const stepMm = parseDecimal(options.stepText);
  const fieldProblems: ReadingsPreview['fieldProblems'] = {};
  if (startMm === undefined) fieldProblems.startMm = 'Enter the rail reading of the first frame, in mm.';
  else if (startMm === null) fieldProblems.startMm = 'The first reading must be a number in mm, e.g. 447.0.';
  if (stepMm === undefined) fieldProblems.stepMm = 'Enter the step between frames, in mm (negative when the readings fall).';
  else if (stepMm === null) fieldProblems.stepMm = 'The step must be a number in mm, e.g. 0.25.';
  else if (stepMm === 0) fieldProblems.stepMm = 'The step must not be zero.';

  if (typeof startMm !== 'number' || typeof stepMm !== 'number' || stepMm === 0) {
    return {
      rows: frames.map((f) => ({ fileName: f.fileName, positionMm: null, currentPositionMm: f.positionMm, changed: false })),
      lineProblems: [],
      fileProblems: {},
      fieldProblems,
      ready: false,
      changedCount: 0,
    };
  }
  const sourceRows = readingsFromStartStep({ fileNames: frames.map((f) => f.fileName), startMm, stepMm });
  const built = previewFrom(frames, sourceRows, sourceRows.map((r) => r.fileName));
  return {
    ...built,
    lineProblems: [],
    fieldProblems,
    ready: frames.length > 0 && Object.keys(built.fileProblems).length === 0,
  };
}

export function textReadingsPreview(options: { frames: readonly Frame[]; text: string }): ReadingsPreview {
  const { frames, text } = options;
  const parsed = parseReadingsTable(text);
  const built = previewFrom(
    frames,
    parsed.rows.map((row) => ({ fileName: row.fileName, positionMm: row.positionMm, line: row.line })),
    frames.map((f) => f.fileName),
  );
  return {
    ...built,
    lineProblems: parsed.problems,
    fieldProblems: {},
    ready: frames.length > 0 && text.trim() !== '' && parsed.problems.length === 0 && Object.keys(built.fileProblems).length === 0,
  };
}

/** The cells a person typed in the frames table, checked: a number per frame, by file name. */
export function editedReadingsPreview(options: { frames: readonly Frame[]; cellTexts: Readonly<Record<string, string>> }): ReadingsPreview {
  const { frames, cellTexts } = options;
  const fileProblems: Record<string, string> = {};
  const sourceRows: ReadingsSourceRow[] = [];
  frames.forEach((frame, index) => {
    const text = cellTexts[frame.fileName] ?? (frame.positionMm === null ? '' : String(frame.positionMm));
    const value = parseDecimal(text);
    if (value === undefined) fileProblems[frame.fileName] = `${frame.fileName} has no reading.`;
    else if (value === null) fileProblems[frame.fileName] = `The reading of ${frame.fileName} must be a number in mm.`;
    else sourceRows.push({ fileName: frame.fileName, positionMm: value, row: index + 1 });
  });
  const built = previewFrom(frames, sourceRows, frames.map((f) => f.fileName));
  const problems = { ...built.fileProblems, ...fileProblems };
  return {
    rows: built.rows,
    lineProblems: [],
    fileProblems: problems,
    fieldProblems: {},
    ready: frames.length > 0 && Object.keys(problems).length === 0,
    changedCount: built.changedCount,
  };
}

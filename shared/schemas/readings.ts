/**
 * Rail readings of a sweep's frames (docs/api-bench.md, `PUT
 * /api/sweeps/:sweepId/readings`): the request body, the parser of a pasted
 * or uploaded two-column table, and the rule that every frame gets exactly
 * one reading. The client runs the same functions for its preview.
 */
import { z } from 'zod';
import type { Frame } from './frames';
import { compareFrameFileNames, sanitiseFrameFileName } from './frames';

/** Longest pasted or uploaded readings text, in characters. */
export const READINGS_TEXT_MAX_LENGTH = 500_000;
/** Most rows in a readings table. */
export const READINGS_MAX_ROWS = 10_000;

const readingNumber = (field: string) =>
  z
    .number({ error: `Field "${field}" must be a number (mm).` })
    .refine(Number.isFinite, { error: `Field "${field}" must be a finite number (mm).` });

export const readingsModes = ['start-step', 'table', 'text'] as const;
export type ReadingsMode = (typeof readingsModes)[number];

export const readingsBody = z.discriminatedUnion(
  'mode',
  [
    z.strictObject({
      mode: z.literal('start-step'),
      startMm: readingNumber('startMm'),
      stepMm: readingNumber('stepMm').refine((step) => step !== 0, { error: 'Field "stepMm" must not be zero.' }),
    }),
    z.strictObject({
      mode: z.literal('table'),
      rows: z
        .array(
          z.strictObject({
            fileName: z
              .string({ error: 'Each row needs a "fileName" (text).' })
              .trim()
              .min(1, { error: 'Each row needs a "fileName" that is not empty.' }),
            positionMm: readingNumber('positionMm'),
          }),
          { error: 'Field "rows" must be a list of { fileName, positionMm }.' },
        )
        .max(READINGS_MAX_ROWS, { error: `Field "rows" must have at most ${READINGS_MAX_ROWS} rows.` }),
    }),
    z.strictObject({
      mode: z.literal('text'),
      text: z
        .string({ error: 'Field "text" must be text: two columns per line, the file name and the rail reading.' })
        .max(READINGS_TEXT_MAX_LENGTH, { error: `Field "text" must be at most ${READINGS_TEXT_MAX_LENGTH} characters long.` }),
    }),
  ],
  { error: 'Field "mode" must be one of: start-step, table, text.' },
);
export type ReadingsBody = z.input<typeof readingsBody>;
export type ReadingsInput = z.output<typeof readingsBody>;

export interface SetReadingsResponse {
  frames: Frame[];
}

/* --------------------------------- parsing -------------------------------- */

export interface ReadingsTableRow {
  /** 1-based line of the text the row came from. */
  line: number;
  fileName: string;
  positionMm: number;
}

export interface ReadingsProblem {
  line: number;
  message: string;
}

export interface ReadingsTableParse {
  rows: ReadingsTableRow[];
  problems: ReadingsProblem[];
  /** The line taken as a header (its reading column is not a number), or null. */
  headerLine: number | null;
}

function unquote(cell: string): string {
  const trimmed = cell.trim();
  if (trimmed.length >= 2 && trimmed.startsWith('"') && trimmed.endsWith('"')) return trimmed.slice(1, -1).replace(/""/g, '"').trim();
  return trimmed;
}

/**
 * A rail reading in millimetres: optional sign, digits with a decimal point
 * (or a decimal comma where the column separator is not a comma), optional
 * exponent, optional "mm" unit.
 */
function parseReading(cell: string, decimalCommaAllowed: boolean): number | null {
  const text = cell.replace(/\s*mm$/i, '');
  const pattern = decimalCommaAllowed ? /^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/ : /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
  if (!pattern.test(text)) return null;
  const value = Number(text.replace(',', '.'));
  return Number.isFinite(value) ? value : null;
}

function looksLikeImageFileName(name: string): boolean {
  return /\.(png|jpe?g|tiff?)$/i.test(name);
}

/** Tab, then semicolon, then comma, then spaces: the first one present on the line separates its columns. */
function splitColumns(line: string): { cells: string[]; separator: 'tab' | 'semicolon' | 'comma' | 'space' } {
  if (line.includes('\t')) return { cells: line.split('\t'), separator: 'tab' };
  if (line.includes(';')) return { cells: line.split(';'), separator: 'semicolon' };
  if (line.includes(',')) return { cells: line.split(','), separator: 'comma' };
  // A unit after the reading ("448.5 mm") belongs to the reading, not to a third column.
  const trimmed = line.trim().replace(/\s+mm$/i, 'mm');
  // With spaces as separator the reading is the last word, so a file name may itself contain spaces.
  const lastSpace = trimmed.search(/\s+\S+$/);
  if (lastSpace < 0) return { cells: [trimmed], separator: 'space' };
  return { cells: [trimmed.slice(0, lastSpace), trimmed.slice(lastSpace)], separator: 'space' };
}

/**
 * Parses a two-column readings table (file name, rail reading in mm), one
 * frame per line, columns separated by a tab, semicolon, comma or spaces.
 * Blank lines and lines starting with "#" are skipped; a first line whose
 * reading is not a number (and whose first column is not an image file name)
 * is taken as a header. Quoted CSV cells are unquoted.
 */
export function parseReadingsTable(text: string): ReadingsTableParse {
  const rows: ReadingsTableRow[] = [];
  const problems: ReadingsProblem[] = [];
  let headerLine: number | null = null;
  let contentLinesSeen = 0;

  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  lines.forEach((raw, index) => {
    const line = index + 1;
    if (raw.trim() === '' || raw.trim().startsWith('#')) return;
    contentLinesSeen += 1;
    const { cells: rawCells, separator } = splitColumns(raw);
    const cells = rawCells.map(unquote);
    while (cells.length > 2 && cells[cells.length - 1] === '') cells.pop();
    if (cells.length !== 2) {
      problems.push({
        line,
        message:
          cells.length < 2
            ? `Line ${line} has one column; give two: the file name and the rail reading (mm).`
            : `Line ${line} has ${cells.length} columns; give two: the file name and the rail reading (mm).`,
      });
      return;
    }
    const [fileName, readingText] = cells;
    const positionMm = parseReading(readingText, separator !== 'comma');
    if (positionMm === null) {
      if (contentLinesSeen === 1 && !looksLikeImageFileName(fileName)) {
        headerLine = line;
        return;
      }
      problems.push({
        line,
        message:
          readingText === ''
            ? `Line ${line} gives no reading for ${fileName || 'its file'}.`
            : `Line ${line}: the reading "${readingText}"${fileName ? ` for ${fileName}` : ''} is not a number.`,
      });
      return;
    }
    if (fileName === '') {
      problems.push({ line, message: `Line ${line} has a reading but no file name.` });
      return;
    }
    rows.push({ line, fileName, positionMm });
  });
  return { rows, problems, headerLine };
}

/* -------------------------------- assigning ------------------------------- */

export interface ReadingsSourceRow {
  fileName: string;
  positionMm: number;
  /** Where the row came from, for messages: a text line, or a 1-based table row. */
  line?: number;
  row?: number;
}

export interface ReadingsAssignment {
  /** One reading per frame file name, when `problems` is empty. */
  positionsMmByFileName: Map<string, number>;
  /** Sentences keyed by the file name they concern (or "line N"); empty when every frame got exactly one reading. */
  problems: Record<string, string>;
}

function whereOf(row: ReadingsSourceRow): string {
  if (row.line !== undefined) return `line ${row.line}`;
  if (row.row !== undefined) return `row ${row.row}`;
  return '';
}

function listWheres(rows: ReadingsSourceRow[]): string {
  const wheres = rows.map(whereOf).filter(Boolean);
  if (wheres.length === 0) return '';
  const kind = wheres[0].split(' ')[0];
  const numbers = wheres.map((w) => w.split(' ')[1]);
  const joined = numbers.length === 2 ? numbers.join(' and ') : `${numbers.slice(0, -1).join(', ')} and ${numbers[numbers.length - 1]}`;
  return ` (${kind}s ${joined})`;
}

/** A table's file name matched the way uploads are stored (last path segment, sanitised). */
function storedNameOf(fileName: string): string {
  const sanitised = sanitiseFrameFileName(fileName);
  return sanitised.ok ? sanitised.fileName : fileName.trim();
}

/**
 * Gives every frame exactly one reading from `rows`: a file listed twice, a
 * file that is not a frame of the sweep, and a frame without a reading are
 * each reported under the file's name.
 */
export function assignReadings(options: { fileNames: readonly string[]; rows: readonly ReadingsSourceRow[] }): ReadingsAssignment {
  const known = new Set(options.fileNames);
  const rowsByName = new Map<string, ReadingsSourceRow[]>();
  const problems: Record<string, string> = {};

  for (const row of options.rows) {
    const stored = known.has(row.fileName) ? row.fileName : storedNameOf(row.fileName);
    if (!known.has(stored)) {
      const where = whereOf(row);
      problems[row.fileName] ??= `${row.fileName}${where ? ` (${where})` : ''} is not a frame of this sweep.`;
      continue;
    }
    const list = rowsByName.get(stored) ?? [];
    list.push(row);
    rowsByName.set(stored, list);
  }

  const positionsMmByFileName = new Map<string, number>();
  for (const fileName of options.fileNames) {
    const rows = rowsByName.get(fileName) ?? [];
    if (rows.length === 0) problems[fileName] = `${fileName} has no reading.`;
    else if (rows.length > 1) problems[fileName] = `${fileName} has ${rows.length} readings${listWheres(rows)}; give exactly one.`;
    else positionsMmByFileName.set(fileName, rows[0].positionMm);
  }
  return { positionsMmByFileName, problems };
}

/** Rail readings from a start and a step, the frames taken in natural file-name order. */
export function readingsFromStartStep(options: { fileNames: readonly string[]; startMm: number; stepMm: number }): ReadingsSourceRow[] {
  return [...options.fileNames].sort(compareFrameFileNames).map((fileName, index) => ({
    fileName,
    // Rounded to 1 nm so that 447 + 3 × 0.1 reads 447.3, not 447.30000000000001.
    positionMm: Math.round((options.startMm + index * options.stepMm) * 1e9) / 1e9,
  }));
}

import { lensFieldName, WORK_REQUEST_MAX_LENSES, type WorkRequestBody } from '@shared/schemas/portal';

export interface LensDraft {
  /** Stable key for React; never sent. */
  key: string;
  identifier: string;
  description: string;
  partNumber: string;
  nominalFocalLengthMm: string;
  toleranceValue: string;
  toleranceUnit: 'percent' | 'mm';
}

export interface WorkRequestDraft {
  title: string;
  clientReference: string;
  dueDate: string;
  notes: string;
  lenses: LensDraft[];
}

export type FieldProblems = Partial<Record<string, string>>;

let nextKey = 0;
export function emptyLensDraft(): LensDraft {
  nextKey += 1;
  return { key: `lens-${nextKey}`, identifier: '', description: '', partNumber: '', nominalFocalLengthMm: '', toleranceValue: '', toleranceUnit: 'percent' };
}

export function emptyWorkRequestDraft(): WorkRequestDraft {
  return { title: '', clientReference: '', dueDate: '', notes: '', lenses: [emptyLensDraft()] };
}

/** A decimal as typed, with a comma or a point; null when it is not a number. */
export function parseDecimal(text: string): number | null {
  const cleaned = text.trim().replace(',', '.').replace('−', '-');
  if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(cleaned)) return null;
  const value = Number(cleaned);
  return Number.isFinite(value) ? value : null;
}

/** Every field name the form can show a sentence beside, for the server's `fields`. */
export function shownFieldNames(lensCount: number): string[] {
  const lensFields = ['identifier', 'description', 'partNumber', 'nominalFocalLengthMm', 'tolerancePercent', 'toleranceMm'];
  const names = ['title', 'clientReference', 'dueDate', 'notes', 'lenses'];
  for (let index = 0; index < lensCount; index += 1) for (const field of lensFields) names.push(lensFieldName(index, field));
  return names;
}

/** The request body, or the problems the form can see before sending (the server checks everything again). */
export function workRequestFromDraft(draft: WorkRequestDraft): { ok: true; request: WorkRequestBody } | { ok: false; problems: FieldProblems } {
  const problems: FieldProblems = {};
  if (!draft.title.trim()) problems.title = 'Give the request a title, e.g. "Incoming inspection, spring batch".';
  if (draft.lenses.length === 0) problems.lenses = 'Add at least one lens to measure.';
  if (draft.lenses.length > WORK_REQUEST_MAX_LENSES) problems.lenses = `At most ${WORK_REQUEST_MAX_LENSES} lenses per request.`;
  const lenses = draft.lenses.map((lens, index) => {
    const nominal = parseDecimal(lens.nominalFocalLengthMm);
    const tolerance = parseDecimal(lens.toleranceValue);
    const toleranceField = lens.toleranceUnit === 'percent' ? 'tolerancePercent' : 'toleranceMm';
    if (!lens.identifier.trim()) problems[lensFieldName(index, 'identifier')] = 'Give the identifier or serial marked on the lens.';
    if (nominal === null || nominal === 0) problems[lensFieldName(index, 'nominalFocalLengthMm')] = 'Give the nominal focal length in mm (negative for a diverging lens).';
    if (tolerance === null || tolerance <= 0) problems[lensFieldName(index, toleranceField)] = 'Give the tolerance as a number above 0.';
    return {
      identifier: lens.identifier.trim(),
      description: lens.description.trim(),
      partNumber: lens.partNumber.trim() || null,
      nominalFocalLengthMm: nominal ?? 0,
      [toleranceField]: tolerance ?? 0,
    };
  });
  if (Object.keys(problems).length > 0) return { ok: false, problems };
  return {
    ok: true,
    request: {
      title: draft.title.trim(),
      clientReference: draft.clientReference.trim() || null,
      dueDate: draft.dueDate || null,
      notes: draft.notes.trim() || null,
      lenses,
    },
  };
}

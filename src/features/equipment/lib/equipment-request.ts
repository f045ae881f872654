/**
 * From the equipment form to `POST /api/equipment` and
 * `PATCH /api/equipment/:id` (docs/api-bench.md). Values are checked against
 * the kind's field list; the server checks them again.
 */
import type { EquipmentItem, EquipmentKindName, UpdateEquipmentBody } from '@shared/schemas/equipment';
import type { CreateEquipmentRequest } from '@/features/equipment/api/create-equipment';
import { parseDecimal } from '@/features/equipment/lib/parse-decimal';
import { EQUIPMENT_VALUE_FIELDS, type ValueField } from '@/features/equipment/lib/equipment-value-fields';

export interface EquipmentDraft {
  kind: EquipmentKindName;
  identifier: string;
  description: string;
  serialNumber: string;
  /** As typed, keyed by the value's name (e.g. `pixelPitchUm`). */
  values: Record<string, string>;
  calibrationReference: string;
  calibrationDueDate: string;
}

export type FieldProblems = Partial<Record<string, string>>;
export type DraftOutcome<Request> = { ok: true; request: Request } | { ok: false; problems: FieldProblems };

/** The server names a value's problem `values.<key>`; the form uses the same keys. */
export function valueProblemKey(key: string): string {
  return `values.${key}`;
}

export function emptyEquipmentDraft(kind: EquipmentKindName): EquipmentDraft {
  return {
    kind,
    identifier: '',
    description: '',
    serialNumber: '',
    values: Object.fromEntries(EQUIPMENT_VALUE_FIELDS[kind].map((field) => [field.key, ''])),
    calibrationReference: '',
    calibrationDueDate: '',
  };
}

export function equipmentDraftFrom(item: EquipmentItem): EquipmentDraft {
  return {
    kind: item.kind,
    identifier: item.identifier,
    description: item.description,
    serialNumber: item.serialNumber ?? '',
    values: Object.fromEntries(
      EQUIPMENT_VALUE_FIELDS[item.kind].map((field) => {
        const value = item.values[field.key];
        return [field.key, value === null || value === undefined ? '' : String(value)];
      }),
    ),
    calibrationReference: item.calibrationReference,
    calibrationDueDate: item.calibrationDueDate,
  };
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

function isIsoDate(text: string): boolean {
  if (!ISO_DATE.test(text)) return false;
  const [year, month, day] = text.split('-').map(Number);
  const date = new Date(Date.UTC(year, month - 1, day));
  return date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day;
}

function readValue(field: ValueField, text: string, problems: FieldProblems, values: Record<string, string | number>, all: Record<string, string>): void {
  const key = valueProblemKey(field.key);
  const trimmed = text.trim();
  if (trimmed === '') {
    if (field.required) problems[key] = `Give the ${field.label.toLowerCase()}${field.type === 'number' ? ` in ${field.unit}` : ''}.`;
    return;
  }
  if (field.type === 'choice') {
    if (!field.choices.some((choice) => choice.value === trimmed)) problems[key] = `Choose one of the listed ${field.label.toLowerCase()}s.`;
    else values[field.key] = trimmed;
    return;
  }
  const value = parseDecimal(trimmed);
  if (value === null) {
    problems[key] = `“${trimmed}” is not a number; write it like ${field.placeholder ?? '1.5'}.`;
    return;
  }
  if (field.integer && !Number.isInteger(value)) {
    problems[key] = `The ${field.label.toLowerCase()} is a whole number of ${field.unit}.`;
    return;
  }
  if (field.minimum === 'positive' && !(value > 0)) {
    problems[key] = `The ${field.label.toLowerCase()} must be greater than zero.`;
    return;
  }
  if (field.minimum === 'non-negative' && value < 0) {
    problems[key] = `The ${field.label.toLowerCase()} cannot be negative.`;
    return;
  }
  if (field.uncertaintyOf) {
    const of = parseDecimal(all[field.uncertaintyOf] ?? '');
    if (of !== null && of > 0 && value >= of) {
      problems[key] = `An uncertainty as large as the value itself (${of} ${field.unit}) cannot be right; check the digits.`;
      return;
    }
  }
  values[field.key] = value;
}

function checkCommon(draft: EquipmentDraft, problems: FieldProblems): Record<string, string | number> {
  if (draft.identifier.trim() === '') problems.identifier = 'Give the lab’s identifier for this item, e.g. the asset tag.';
  if (draft.calibrationReference.trim() === '') problems.calibrationReference = 'Give the calibration certificate or report this item’s values come from.';
  const due = draft.calibrationDueDate.trim();
  if (due === '') problems.calibrationDueDate = 'Give the date the next calibration is due.';
  else if (!isIsoDate(due)) problems.calibrationDueDate = 'Enter the calibration due date as a calendar date (YYYY-MM-DD).';
  const values: Record<string, string | number> = {};
  for (const field of EQUIPMENT_VALUE_FIELDS[draft.kind]) readValue(field, draft.values[field.key] ?? '', problems, values, draft.values);
  return values;
}

export function createEquipmentRequest(draft: EquipmentDraft): DraftOutcome<CreateEquipmentRequest> {
  const problems: FieldProblems = {};
  const values = checkCommon(draft, problems);
  if (Object.keys(problems).length > 0) return { ok: false, problems };
  const request: CreateEquipmentRequest = {
    kind: draft.kind,
    identifier: draft.identifier.trim(),
    values,
    calibrationReference: draft.calibrationReference.trim(),
    calibrationDueDate: draft.calibrationDueDate.trim(),
  };
  if (draft.description.trim() !== '') request.description = draft.description.trim();
  if (draft.serialNumber.trim() !== '') request.serialNumber = draft.serialNumber.trim();
  return { ok: true, request };
}

function sameValues(a: Record<string, string | number | null>, b: Record<string, string | number | null>): boolean {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)].filter((key) => (a[key] ?? null) !== null || (b[key] ?? null) !== null));
  return [...keys].every((key) => (a[key] ?? null) === (b[key] ?? null));
}

/**
 * Only what changed. The values go as one object whenever any of them
 * changed, since the server checks them together for the kind.
 */
export function updateEquipmentRequest(original: EquipmentItem, draft: EquipmentDraft): DraftOutcome<UpdateEquipmentBody> {
  const problems: FieldProblems = {};
  const values = checkCommon({ ...draft, kind: original.kind }, problems);
  if (Object.keys(problems).length > 0) return { ok: false, problems };
  const request: UpdateEquipmentBody = {};
  const identifier = draft.identifier.trim();
  if (identifier !== original.identifier) request.identifier = identifier;
  if (draft.description.trim() !== original.description) request.description = draft.description.trim();
  const serialNumber = draft.serialNumber.trim() === '' ? null : draft.serialNumber.trim();
  if (serialNumber !== original.serialNumber) request.serialNumber = serialNumber;
  if (!sameValues(values, original.values)) request.values = values;
  if (draft.calibrationReference.trim() !== original.calibrationReference) request.calibrationReference = draft.calibrationReference.trim();
  if (draft.calibrationDueDate.trim() !== original.calibrationDueDate) request.calibrationDueDate = draft.calibrationDueDate.trim();
  return { ok: true, request };
}

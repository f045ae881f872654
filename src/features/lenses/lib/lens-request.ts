/**
 * From the "Add lens" form to `POST /api/work-orders/:id/lenses`
 * (docs/api-bench.md): the nominal goes as a focal length OR a power, never
 * both, and the tolerance as a percentage OR millimetres, whichever the
 * person chose.
 */
import type { CreateLensBody, LensKind } from '@shared/schemas/lenses';
import { focalLengthFromPowerMm, lensKindOf, powerFromFocalLengthDioptres, toleranceBand, type ToleranceBand } from '@/features/lenses/lib/lens-optics';

export type NominalMode = 'focal-length' | 'power';
export type ToleranceMode = 'percent' | 'mm';

export interface LensDraft {
  identifier: string;
  description: string;
  partNumber: string;
  nominalMode: NominalMode;
  nominalText: string;
  toleranceMode: ToleranceMode;
  toleranceText: string;
}

export const EMPTY_LENS_DRAFT: Readonly<LensDraft> = Object.freeze({
  identifier: '',
  description: '',
  partNumber: '',
  nominalMode: 'focal-length',
  nominalText: '',
  toleranceMode: 'percent',
  toleranceText: '',
});

export type FieldProblems = Partial<Record<string, string>>;
export type DraftOutcome<Request> = { ok: true; request: Request } | { ok: false; problems: FieldProblems };

const DECIMAL = /^[+\-\u2212]?(\d+([.,]\d*)?|[.,]\d+)$/;

/**
 * A decimal number as people type it at a bench: a point or a comma for the
 * decimals, an optional sign (the typographic minus too). No thousands
 * separators and no exponents: "1,500" is one and a half, not fifteen hundred.
 */
export function parseDecimal(text: string): number | null {
  const trimmed = text.trim().replace(/\s+/g, '');
  if (!DECIMAL.test(trimmed)) return null;
  const value = Number(trimmed.replace('\u2212', '-').replace(',', '.'));
  return Number.isFinite(value) ? value : null;
}

export function nominalField(mode: NominalMode): 'nominalFocalLengthMm' | 'nominalPowerDioptres' {
  return mode === 'focal-length' ? 'nominalFocalLengthMm' : 'nominalPowerDioptres';
}

export function toleranceField(mode: ToleranceMode): 'tolerancePercent' | 'toleranceMm' {
  return mode === 'percent' ? 'tolerancePercent' : 'toleranceMm';
}

/** The server's limit (@shared/schemas/lenses). */
const TOLERANCE_PERCENT_LIMIT = 100;

export function createLensRequest(draft: LensDraft): DraftOutcome<CreateLensBody> {
  const problems: FieldProblems = {};
  const identifier = draft.identifier.trim();
  if (identifier === '') problems.identifier = 'Give the identifier or serial number marked on the lens.';

  const nominalKey = nominalField(draft.nominalMode);
  const nominal = parseDecimal(draft.nominalText);
  if (draft.nominalText.trim() === '') {
    problems[nominalKey] =
      draft.nominalMode === 'focal-length' ? 'Give the nominal focal length in millimetres.' : 'Give the nominal power in dioptres.';
  } else if (nominal === null) {
    problems[nominalKey] = `“${draft.nominalText.trim()}” is not a number; write it like 100 or −49.8.`;
  } else if (nominal === 0) {
    problems[nominalKey] = 'A lens with zero power has no focal length; check the nominal value.';
  }

  const toleranceKey = toleranceField(draft.toleranceMode);
  const tolerance = parseDecimal(draft.toleranceText);
  if (draft.toleranceText.trim() === '') {
    problems[toleranceKey] = draft.toleranceMode === 'percent' ? 'Give the tolerance in percent of the focal length.' : 'Give the tolerance in millimetres.';
  } else if (tolerance === null) {
    problems[toleranceKey] = `“${draft.toleranceText.trim()}” is not a number; write it like 1 or 0.5.`;
  } else if (tolerance <= 0) {
    problems[toleranceKey] = 'The tolerance is a ± half-width and must be greater than zero.';
  } else if (draft.toleranceMode === 'percent' && tolerance > TOLERANCE_PERCENT_LIMIT) {
    problems[toleranceKey] = `A tolerance of ${tolerance} % is wider than the lens itself; give at most ${TOLERANCE_PERCENT_LIMIT} %.`;
  }

  if (Object.keys(problems).length > 0) return { ok: false, problems };

  const request: CreateLensBody = { identifier };
  const description = draft.description.trim();
  const partNumber = draft.partNumber.trim();
  if (description !== '') request.description = description;
  if (partNumber !== '') request.partNumber = partNumber;
  request[nominalKey] = nominal!;
  request[toleranceKey] = tolerance!;
  return { ok: true, request };
}

export interface LensDraftPreview {
  kind: LensKind;
  focalLengthMm: number;
  powerDioptres: number;
  band: ToleranceBand | null;
}

/** What the draft means in the other unit, while the person types; null until the nominal parses. */
export function previewLensDraft(draft: LensDraft): LensDraftPreview | null {
  const nominal = parseDecimal(draft.nominalText);
  if (nominal === null || nominal === 0) return null;
  const focalLengthMm = draft.nominalMode === 'focal-length' ? nominal : focalLengthFromPowerMm(nominal);
  const tolerance = parseDecimal(draft.toleranceText);
  const toleranceValid = tolerance !== null && tolerance > 0 && !(draft.toleranceMode === 'percent' && tolerance > TOLERANCE_PERCENT_LIMIT);
  return {
    kind: lensKindOf(focalLengthMm),
    focalLengthMm,
    powerDioptres: draft.nominalMode === 'power' ? nominal : powerFromFocalLengthDioptres(nominal),
    band: toleranceValid
      ? toleranceBand({
          nominalFocalLengthMm: focalLengthMm,
          tolerancePercent: draft.toleranceMode === 'percent' ? tolerance : null,
          toleranceMm: draft.toleranceMode === 'mm' ? tolerance : null,
        })
      : null,
  };
}

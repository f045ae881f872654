/**
 * Whether an analysis run decided conformity against the lens specification
 * the lens row holds now. The run's stored manifest carries the lens block it
 * was given (engine-manifest.ts); the lens row may have been edited since,
 * because the nominal value and tolerance lock only from submission on.
 */
import type { DecisionRule } from '../../db/schema';
import { engineToleranceOf } from '../engine-manifest';

export interface LensSpecification {
  nominalFocalLengthMm: number;
  tolerancePercent: number | null;
  toleranceMm: number | null;
}

export type LensSpecificationDifference =
  /** The run's manifest has no lens block, so its result holds no conformity decision. */
  | 'no-lens-in-analysis'
  /** Nominal focal length or a tolerance differs. */
  | 'specification'
  /** Same specification, but the work order's decision rule differs. */
  | 'decision-rule';

interface ManifestLens {
  nominalFocalLengthMm?: unknown;
  tolerancePercent?: unknown;
  toleranceMm?: unknown;
  decisionRule?: unknown;
}

function manifestLensOf(storedManifest: unknown): ManifestLens | null {
  const manifest = (storedManifest as { manifest?: { lens?: unknown } } | null)?.manifest;
  const lens = manifest?.lens;
  return lens && typeof lens === 'object' ? (lens as ManifestLens) : null;
}

/** Null when the run's manifest lens equals the lens row and the rule; else what differs. */
export function analysedLensSpecificationDifference(
  storedManifest: unknown,
  lens: LensSpecification,
  decisionRule: DecisionRule,
): LensSpecificationDifference | null {
  const analysed = manifestLensOf(storedManifest);
  if (!analysed) return 'no-lens-in-analysis';
  // The manifest got these numbers from the same double-precision columns, and JSON keeps a double exactly, so === is right.
  // The manifest carries the one tolerance the engine applies (the tighter, when the lens gives both).
  const applied: { tolerancePercent?: number; toleranceMm?: number } = engineToleranceOf(lens);
  const sameSpecification =
    analysed.nominalFocalLengthMm === lens.nominalFocalLengthMm &&
    (analysed.tolerancePercent ?? null) === (applied.tolerancePercent ?? null) &&
    (analysed.toleranceMm ?? null) === (applied.toleranceMm ?? null);
  if (!sameSpecification) return 'specification';
  // The engine's manifest schema defaults a missing rule to simple.
  if ((analysed.decisionRule ?? 'simple') !== decisionRule) return 'decision-rule';
  return null;
}

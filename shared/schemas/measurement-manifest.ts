import { z } from 'zod';

/**
 * The measurement manifest: the one fixed interface between the engine and
 * everything outside it (see the manifest contract in the README). Extend
 * only by adding optional fields.
 */

const finite = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, { message: `${what} must be a finite number` });
const positive = (what: string) => finite(what).refine((v) => v > 0, { message: `${what} must be greater than zero` });
const nonNegative = (what: string) =>
  finite(what).refine((v) => v >= 0, { message: `${what} must be zero or more` }).optional().default(0);

export const measurementMethods = [
  'finite-conjugate',
  'multi-conjugate',
  'displacement',
  'collimator',
  'auxiliary-lens',
] as const;

export const focusOperators = ['gradient-energy', 'laplacian-variance', 'brenner', 'normalised-variance'] as const;

const frameSchema = z.object({
  file: z
    .string({ error: 'file must be a relative path to an image' })
    .min(1, 'file must not be empty')
    .refine((f) => !f.startsWith('/') && !f.split(/[\\/]/).includes('..'), {
      message: 'file must be a path inside the measurement folder (no leading "/" and no "..")',
    }),
  positionMm: finite('positionMm'),
});

const sweepSchema = z
  .object({
    moving: z.enum(['sensor', 'lens'], { error: 'moving must be "sensor" or "lens"' }),
    objectPositionMm: finite('objectPositionMm').optional(),
    lensPositionMm: finite('lensPositionMm').optional(),
    sensorPositionMm: finite('sensorPositionMm').optional(),
    frames: z.array(frameSchema, { error: 'frames must be a list' }).min(5, 'frames must list at least 5 frames'),
  })
  .superRefine((sweep, ctx) => {
    if (sweep.moving === 'sensor' && sweep.lensPositionMm === undefined) {
      ctx.addIssue({ code: 'custom', path: ['lensPositionMm'], message: 'lensPositionMm is required when the sensor moves' });
    }
    if (sweep.moving === 'lens' && sweep.sensorPositionMm === undefined) {
      ctx.addIssue({ code: 'custom', path: ['sensorPositionMm'], message: 'sensorPositionMm is required when the lens moves' });
    }
    const seen = new Set<string>();
    sweep.frames.forEach((frame, index) => {
      if (seen.has(frame.file)) {
        ctx.addIssue({ code: 'custom', path: ['frames', index, 'file'], message: `file "${frame.file}" is listed twice` });
      }
      seen.add(frame.file);
    });
  });

export const measurementManifestSchema = z
  .object({
    method: z.enum(measurementMethods, {
      error: `method must be one of ${measurementMethods.join(', ')}`,
    }),
    camera: z.object(
      {
        pixelPitchUm: positive('pixelPitchUm'),
        pixelPitchUncertaintyUm: nonNegative('pixelPitchUncertaintyUm'),
      },
      { error: 'camera must be an object with pixelPitchUm' },
    ),
    target: z.object(
      {
        pattern: z.enum(['dot-pair', 'square'], { error: 'pattern must be "dot-pair" or "square"' }),
        sizeMm: positive('sizeMm'),
        sizeUncertaintyMm: nonNegative('sizeUncertaintyMm'),
        polarity: z
          .enum(['dark-on-light', 'light-on-dark'], { error: 'polarity must be "dark-on-light" or "light-on-dark"' })
          .optional(),
      },
      { error: 'target must be an object with pattern and sizeMm' },
    ),
    scale: z
      .object({ uncertaintyMm: nonNegative('uncertaintyMm') }, { error: 'scale must be an object' })
      .optional()
      .default({ uncertaintyMm: 0 }),
    collimator: z
      .object({
        focalLengthMm: positive('focalLengthMm'),
        focalLengthUncertaintyMm: nonNegative('focalLengthUncertaintyMm'),
      })
      .optional(),
    auxiliaryLens: z
      .object({
        focalLengthMm: positive('focalLengthMm'),
        focalLengthUncertaintyMm: nonNegative('focalLengthUncertaintyMm'),
      })
      .optional(),
    /** Optional (Paraxia extension): the lens's nominal value and tolerance, for a conformity decision. */
    lens: z
      .object({
        nominalFocalLengthMm: finite('nominalFocalLengthMm').refine((v) => v !== 0, {
          message: 'nominalFocalLengthMm must not be zero',
        }),
        tolerancePercent: positive('tolerancePercent').optional(),
        toleranceMm: positive('toleranceMm').optional(),
        decisionRule: z.enum(['simple', 'guarded'], { error: 'decisionRule must be "simple" or "guarded"' }).default('simple'),
      })
      .refine((l) => l.tolerancePercent !== undefined || l.toleranceMm !== undefined, {
        message: 'lens needs tolerancePercent or toleranceMm',
      })
      .optional(),
    /** Optional (Paraxia extension): analysis settings. */
    analysis: z
      .object({
        focusOperator: z.enum(focusOperators, { error: `focusOperator must be one of ${focusOperators.join(', ')}` }).optional(),
        excludedFiles: z.array(z.string()).optional(),
        monteCarloDraws: z.number().int().min(1000).max(2_000_000).optional(),
      })
      .optional(),
    sweeps: z.array(sweepSchema, { error: 'sweeps must be a list' }).min(1, 'sweeps must hold at least one sweep'),
  })
  .superRefine((m, ctx) => {
    const need = (cond: boolean, path: (string | number)[], message: string) => {
      if (!cond) ctx.addIssue({ code: 'custom', path, message });
    };
    const sensorMoving = m.method !== 'displacement';
    m.sweeps.forEach((sweep, i) => {
      if (sensorMoving) {
        need(sweep.moving === 'sensor', ['sweeps', i, 'moving'], `moving must be "sensor" for the ${m.method} method`);
      } else {
        need(sweep.moving === 'lens', ['sweeps', i, 'moving'], 'moving must be "lens" for the displacement method');
      }
      if (m.method !== 'collimator') {
        need(sweep.objectPositionMm !== undefined, ['sweeps', i, 'objectPositionMm'], `objectPositionMm is required for the ${m.method} method`);
      }
    });
    if (m.method === 'multi-conjugate') {
      need(m.sweeps.length >= 2, ['sweeps'], 'the multi-conjugate method needs at least 2 sweeps at different object distances');
    }
    if (m.method === 'collimator') {
      need(m.collimator !== undefined, ['collimator'], 'collimator (focalLengthMm) is required for the collimator method');
    }
    if (m.method === 'auxiliary-lens') {
      need(m.auxiliaryLens !== undefined, ['auxiliaryLens'], 'auxiliaryLens (focalLengthMm) is required for the auxiliary-lens method');
    }
  });

export type MeasurementManifest = z.infer<typeof measurementManifestSchema>;
export type MeasurementManifestInput = z.input<typeof measurementManifestSchema>;
export type ManifestSweep = MeasurementManifest['sweeps'][number];

/** Formats a zod issue path the way a person reads a JSON document: sweeps[0].frames[3].file */
export function formatIssuePath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out;
}

export type ManifestCheck =
  | { ok: true; manifest: MeasurementManifest }
  | { ok: false; message: string; fields: Record<string, string> };

/** Validates a parsed manifest; on failure, one sentence naming the first bad field plus a map of all. */
export function checkMeasurementManifest(raw: unknown): ManifestCheck {
  const parsed = measurementManifestSchema.safeParse(raw);
  if (parsed.success) return { ok: true, manifest: parsed.data };
  const fields: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const where = formatIssuePath(issue.path) || '(manifest)';
    if (!(where in fields)) fields[where] = issue.message;
  }
  const [firstPath, firstMessage] = Object.entries(fields)[0];
  return { ok: false, message: `invalid manifest: ${firstPath}: ${firstMessage}`, fields };
}

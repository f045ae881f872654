import { and, desc, eq, isNotNull, ne } from 'drizzle-orm';
import { toleranceBandOf, type PartNumberSpreadPoint, type PartNumberSpreadResponse } from '../../shared/schemas/lenses';
import type { Database } from '../db/client';
import { analysisRuns, lenses, measurements, workOrders } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { currentResultColumns, currentSucceededAnalysis } from './lenses';
import { processCapability } from './process-capability';

/**
 * The spread of measured focal lengths over the lenses of one part number:
 * per lens, the newest measurement whose current analysis succeeded (a
 * measurement a reviewer returned is left out), and Cp/Cpk of those values
 * against the tolerance band of the newest lens of that part number.
 */
export async function partNumberSpread(
  db: Database,
  partNumber: string,
  filter: { organisationId?: string } = {},
): Promise<PartNumberSpreadResponse> {
  const inScope = and(
    eq(lenses.partNumber, partNumber),
    filter.organisationId ? eq(workOrders.organisationId, filter.organisationId) : undefined,
  );
  const lensRows = await db
    .select({
      id: lenses.id,
      nominalFocalLengthMm: lenses.nominalFocalLengthMm,
      tolerancePercent: lenses.tolerancePercent,
      toleranceMm: lenses.toleranceMm,
    })
    .from(lenses)
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(inScope)
    .orderBy(desc(lenses.createdAt), desc(lenses.id));
  if (lensRows.length === 0) {
    throw new HttpError(HttpStatus.NOT_FOUND, `No lens has the part number "${partNumber}"${filter.organisationId ? ' in that organisation' : ''}.`);
  }
  const specification = lensRows[0];
  const specificationsDiffer = lensRows.some(
    (lens) =>
      lens.nominalFocalLengthMm !== specification.nominalFocalLengthMm ||
      lens.tolerancePercent !== specification.tolerancePercent ||
      lens.toleranceMm !== specification.toleranceMm,
  );
  const band = toleranceBandOf(specification);

  const latestResults = await db
    .selectDistinctOn([lenses.id], {
      lensId: lenses.id,
      identifier: lenses.identifier,
      measurementId: measurements.id,
      measurementNumber: measurements.number,
      ...currentResultColumns,
    })
    .from(lenses)
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .innerJoin(measurements, eq(measurements.lensId, lenses.id))
    .innerJoin(analysisRuns, currentSucceededAnalysis)
    .where(and(inScope, ne(measurements.status, 'returned'), isNotNull(analysisRuns.result)))
    .orderBy(lenses.id, desc(measurements.createdAt), desc(measurements.number));

  const points: PartNumberSpreadPoint[] = latestResults
    .filter((row) => row.focalLengthMm !== null && row.expandedUncertaintyMm !== null)
    .map((row) => ({
      lensId: row.lensId,
      identifier: row.identifier,
      measurementId: row.measurementId,
      measurementNumber: row.measurementNumber,
      focalLengthMm: row.focalLengthMm as number,
      expandedUncertaintyMm: row.expandedUncertaintyMm as number,
      decision: row.decision,
    }))
    .sort((a, b) => a.identifier.localeCompare(b.identifier, 'en', { numeric: true }) || a.lensId.localeCompare(b.lensId));

  let stats: PartNumberSpreadResponse['stats'] = null;
  let statsNote: string | null = null;
  if (points.length < 2) {
    statsNote = `Cp and Cpk need measured results from at least two lenses; ${points.length === 0 ? 'none has' : 'only one has'} one yet.`;
  } else {
    stats = processCapability({
      valuesMm: points.map((point) => point.focalLengthMm),
      lowerLimitMm: band.lowerLimitMm,
      upperLimitMm: band.upperLimitMm,
    });
    if (stats.cp === null) statsNote = 'All measured focal lengths are identical, so the spread is zero and Cp and Cpk are undefined.';
  }

  return {
    partNumber,
    nominalFocalLengthMm: specification.nominalFocalLengthMm,
    tolerancePercent: specification.tolerancePercent,
    toleranceMm: specification.toleranceMm,
    lowerLimitMm: band.lowerLimitMm,
    upperLimitMm: band.upperLimitMm,
    lensCount: lensRows.length,
    specificationsDiffer,
    points,
    stats,
    statsNote,
  };
}

/**
 * Rail readings of a sweep's frames: from a start and a step, from a table,
 * or from pasted or uploaded text. Every frame of the sweep gets exactly one
 * reading, or nothing changes.
 */
import { asc, eq, sql } from 'drizzle-orm';
import { compareFrameFileNames, type Frame } from '../../shared/schemas/frames';
import {
  assignReadings,
  parseReadingsTable,
  readingsFromStartStep,
  type ReadingsInput,
  type ReadingsSourceRow,
} from '../../shared/schemas/readings';
import type { Database } from '../db/client';
import { frames, measurements, sweeps } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import type { Actor } from './catalogue-queries';
import { recordMeasurementChange } from './measurement-change';
import { frameChangeRefusal, sweepNotFound, toFrame } from './frame-storage';

function readingsRefused(fields: Record<string, string>): HttpError {
  const sentences = Object.values(fields);
  const more = sentences.length > 1 ? ` (and ${sentences.length - 1} more problem${sentences.length > 2 ? 's' : ''})` : '';
  return new HttpError(HttpStatus.BAD_REQUEST, `The readings were not saved: ${sentences[0]}${more}`, fields);
}

/**
 * Sets the rail reading of every frame of a sweep in one statement, inside a
 * transaction that holds the measurement row, so an upload or an analysis
 * request cannot slip between the check and the write.
 */
export async function setSweepReadings(db: Database, sweepId: string, input: ReadingsInput, actor: Actor): Promise<Frame[]> {
  return db.transaction(async (tx) => {
    const [sweep] = await tx.select({ id: sweeps.id, position: sweeps.position, measurementId: sweeps.measurementId }).from(sweeps).where(eq(sweeps.id, sweepId));
    if (!sweep) throw sweepNotFound(sweepId);
    const [measurement] = await tx
      .select({ number: measurements.number, status: measurements.status })
      .from(measurements)
      .where(eq(measurements.id, sweep.measurementId))
      .for('update');
    const refusal = frameChangeRefusal({ measurementNumber: measurement.number, measurementStatus: measurement.status }, 'changing readings');
    if (refusal) throw new HttpError(HttpStatus.CONFLICT, refusal);

    const frameRows = await tx.select().from(frames).where(eq(frames.sweepId, sweepId)).orderBy(asc(frames.fileName));
    if (frameRows.length === 0) {
      throw new HttpError(HttpStatus.BAD_REQUEST, `Sweep ${sweep.position + 1} has no frames yet; upload its frames before giving readings.`);
    }
    const fileNames = frameRows.map((row) => row.fileName);

    let rows: ReadingsSourceRow[];
    const fields: Record<string, string> = {};
    if (input.mode === 'start-step') {
      rows = readingsFromStartStep({ fileNames, startMm: input.startMm, stepMm: input.stepMm });
    } else if (input.mode === 'table') {
      rows = input.rows.map((row, index) => ({ ...row, row: index + 1 }));
    } else {
      const parsed = parseReadingsTable(input.text);
      for (const problem of parsed.problems) fields[`line ${problem.line}`] = problem.message;
      rows = parsed.rows;
      if (rows.length === 0 && parsed.problems.length === 0) {
        throw readingsRefused({ text: 'The text holds no readings: give one line per frame, the file name and the rail reading (mm).' });
      }
    }
    const assignment = assignReadings({ fileNames, rows });
    Object.assign(fields, assignment.problems);
    if (Object.keys(fields).length > 0) throw readingsRefused(fields);

    const values = frameRows.map((row) => sql`(${row.id}::uuid, ${assignment.positionsMmByFileName.get(row.fileName)}::double precision)`);
    await tx.execute(sql`
      update frames set position_mm = readings.position_mm
      from (values ${sql.join(values, sql`, `)}) as readings(id, position_mm)
      where frames.id = readings.id`);
    await recordMeasurementChange(tx, { measurementId: sweep.measurementId, actor, action: 'sweep.readings-set', details: { number: measurement.number, sweepId, mode: input.mode, frames: frameRows.length } });

    const updated = await tx.select().from(frames).where(eq(frames.sweepId, sweepId));
    return updated.sort((a, b) => compareFrameFileNames(a.fileName, b.fileName)).map(toFrame);
  });
}

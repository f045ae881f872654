import { pipeline } from 'node:stream/promises';
import type { RequestHandler } from 'express';
import { certificateFileName, type ReissueCertificateInput } from '../../../shared/schemas/certificates';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf, signedInUser } from '../../services/catalogue-queries';
import {
  findDownloadableCertificate,
  getCertificateSummary,
  listMeasurementCertificates,
  requireMeasurementExists,
} from '../../services/certificates/certificate-records';
import { issueCertificate, reissueCertificate } from '../../services/certificates/issue-certificate';

export function getMeasurementCertificates(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const { measurementId } = res.locals.params as { measurementId: string };
    await requireMeasurementExists(deps.db, measurementId);
    res.status(HttpStatus.OK).json({ certificates: await listMeasurementCertificates(deps.db, measurementId) });
  };
}

export function postCertificate(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { measurementId } = res.locals.params as { measurementId: string };
    const id = await issueCertificate(deps, measurementId, actorOf(req));
    res.status(HttpStatus.CREATED).json({ certificate: await getCertificateSummary(deps.db, id) });
  };
}

export function postReissue(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { certificateId } = res.locals.params as { certificateId: string };
    const id = await reissueCertificate(deps, certificateId, (res.locals.body as ReissueCertificateInput).reason, actorOf(req));
    res.status(HttpStatus.CREATED).json({ certificate: await getCertificateSummary(deps.db, id) });
  };
}

export function getCertificatePdf(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { certificateId } = res.locals.params as { certificateId: string };
    const row = await findDownloadableCertificate(deps.db, certificateId, signedInUser(req));
    const stored = await deps.storage.getObjectStream(row.objectKey);
    res.status(HttpStatus.OK);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Length', String(row.byteSize));
    res.setHeader('Content-Disposition', `attachment; filename="${certificateFileName(row.number, row.revision)}"`);
    res.setHeader('X-Content-SHA256', row.sha256);
    res.setHeader('Cache-Control', 'private, no-store');
    try {
      await pipeline(stored.stream, res);
    } catch (error) {
      if (!res.writableFinished) deps.log.warn('A certificate download ended early.', { certificateId, error });
    }
  };
}

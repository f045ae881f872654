import type { RequestHandler } from 'express';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import multer from 'multer';
import type { AppDeps } from '../../deps';
import { sha256Hex } from '../../certificates/verification-code';
import { HttpError, type ApiErrorBody } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { findCertificateByCode } from '../../services/verification/find-certificate-by-code';
import type { DocumentCheck } from '../../../shared/schemas/verification';

export const VERIFICATION_RATE_LIMIT = { limit: 60, windowMs: 15 * 60_000 } as const;
export const CERTIFICATE_UPLOAD_MAX_BYTES = 10 * 1024 * 1024;

const limiters = new WeakMap<AppDeps, RequestHandler>();

/** One budget per client address for lookups and uploads together, so codes cannot be guessed in bulk. */
export function verificationRateLimit(deps: AppDeps): RequestHandler {
  let limiter = limiters.get(deps);
  if (!limiter) {
    const minutes = Math.ceil(VERIFICATION_RATE_LIMIT.windowMs / 60_000);
    limiter = rateLimit({
      windowMs: VERIFICATION_RATE_LIMIT.windowMs,
      limit: VERIFICATION_RATE_LIMIT.limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      keyGenerator: (req) => ipKeyGenerator(req.ip ?? 'unknown'),
      handler: (_req, res) => {
        const body: ApiErrorBody = {
          error: { message: `Too many certificate checks from this address; wait up to ${minutes} minutes and try again.` },
        };
        res.status(HttpStatus.TOO_MANY_REQUESTS).json(body);
      },
    });
    limiters.set(deps, limiter);
  }
  return limiter;
}

function shownCode(typed: string): string {
  const trimmed = typed.trim();
  return trimmed.length > 40 ? `${trimmed.slice(0, 40)}…` : trimmed;
}

function notFoundBody(typed: string) {
  return { found: false as const, error: { message: `No certificate has the verification code "${shownCode(typed)}". Check the code printed beside the QR code.` } };
}

export function getVerification(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const typed = String(req.params.code ?? '');
    const found = await findCertificateByCode(deps.db, typed);
    res.setHeader('cache-control', 'no-store');
    if (!found) {
      deps.log.info('A certificate verification found no certificate.', { code: shownCode(typed), ip: req.ip });
      res.status(HttpStatus.NOT_FOUND).json(notFoundBody(typed));
      return;
    }
    res.status(HttpStatus.OK).json(found.view);
  };
}

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: CERTIFICATE_UPLOAD_MAX_BYTES, files: 1, fields: 4 } });

/** Multer's own errors, said for this form. */
function describeUploadError(error: unknown): unknown {
  if (!(error instanceof multer.MulterError)) return error;
  if (error.code === 'LIMIT_FILE_SIZE') {
    const message = 'The file is larger than 10 MB; a Paraxia certificate PDF is much smaller, so this is not one.';
    return new HttpError(HttpStatus.PAYLOAD_TOO_LARGE, message, { file: message });
  }
  const message = 'Send one PDF file in the form field "file".';
  return new HttpError(HttpStatus.BAD_REQUEST, message, { file: message });
}

const receiveSingleFile = upload.single('file');

/** Reads the multipart upload into memory (at most 10 MB). */
export const receiveCertificateFile: RequestHandler = (req, res, next) => {
  receiveSingleFile(req, res, (error?: unknown) => next(error ? describeUploadError(error) : undefined));
};

export function postVerificationDocument(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const typed = String(req.params.code ?? '');
    const file = req.file;
    if (!file) {
      const message = 'Attach the certificate PDF in the form field "file".';
      throw new HttpError(HttpStatus.BAD_REQUEST, message, { file: message });
    }
    if (!file.buffer.subarray(0, 5).equals(Buffer.from('%PDF-'))) {
      const message = `The file "${file.originalname}" is not a PDF; upload the certificate as you received it.`;
      throw new HttpError(HttpStatus.BAD_REQUEST, message, { file: message });
    }
    const found = await findCertificateByCode(deps.db, typed);
    res.setHeader('cache-control', 'no-store');
    if (!found) {
      deps.log.info('A certificate file check named no known certificate.', { code: shownCode(typed), ip: req.ip });
      res.status(HttpStatus.NOT_FOUND).json(notFoundBody(typed));
      return;
    }
    const uploadedSha256 = sha256Hex(file.buffer);
    const matches = uploadedSha256 === found.sha256;
    if (!matches) deps.log.info('An uploaded certificate file does not match its code.', { number: found.view.number, revision: found.view.revision, ip: req.ip });
    const body: DocumentCheck = {
      found: true,
      matches,
      number: found.view.number,
      revision: found.view.revision,
      status: found.view.status,
      currentRevision: found.view.currentRevision,
      uploadedSha256,
    };
    res.status(HttpStatus.OK).json(body);
  };
}

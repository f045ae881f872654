import type { ErrorRequestHandler, RequestHandler } from 'express';
import multer from 'multer';
import { HttpError, type ApiErrorBody } from '../http-error';
import { HttpStatus, type HttpStatusCode } from '../http-status';
import type { Logger } from '../services/logger';

interface BodyParserError extends Error {
  type: string;
  status?: number;
  limit?: number;
}

function isBodyParserError(error: unknown): error is BodyParserError {
  return error instanceof Error && typeof (error as BodyParserError).type === 'string' && typeof (error as BodyParserError).status === 'number';
}

function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${Number((bytes / (1024 * 1024)).toFixed(1))} MiB`;
  if (bytes >= 1024) return `${Number((bytes / 1024).toFixed(1))} KiB`;
  return `${bytes} bytes`;
}

const multerMessages: Record<string, (field?: string) => string> = {
  LIMIT_FILE_SIZE: (field) => `A file in "${field}" is larger than the upload limit.`,
  LIMIT_FILE_COUNT: (field) => `Too many files were sent${field ? ` in "${field}"` : ''}.`,
  LIMIT_PART_COUNT: () => 'The upload has too many parts.',
  LIMIT_FIELD_KEY: () => 'A form field name is too long.',
  LIMIT_FIELD_VALUE: (field) => `The value of "${field}" is too long.`,
  LIMIT_FIELD_COUNT: () => 'The form has too many fields.',
  LIMIT_UNEXPECTED_FILE: (field) => `The upload has a file in an unexpected field "${field}".`,
  MISSING_FIELD_NAME: () => 'A file in the upload has no field name.',
};

/** The errors busboy (multer's parser) raises for a malformed form, by message; they carry no code. */
const MALFORMED_FORM_MESSAGES = new Set([
  'Malformed content type',
  'Malformed part header',
  'Malformed urlencoded form',
  'Missing Content-Type',
  'Multipart: Boundary not found',
  'Unexpected end of file',
  'Unexpected end of form',
]);

/** PostgreSQL SQLSTATE class 08 (connection exception) and 57P01–57P03 (server shutting down or starting), PostgreSQL manual, Appendix A. */
const DATABASE_UNAVAILABLE_CODES = /^(08\d{3}|57P0[123]|ECONNREFUSED|ECONNRESET|EPIPE|ETIMEDOUT|EHOSTUNREACH)$/;
/** node-postgres reports a lost or refused connection by message only. */
const DATABASE_UNAVAILABLE_MESSAGES = /^(Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Connection terminated unexpectedly)/;

export const DATABASE_UNAVAILABLE_MESSAGE = 'The database cannot be reached just now, so nothing was read or saved; please try again in a minute.';

/** True when the error, or one it wraps (Drizzle wraps driver errors as `cause`), says the database is out of reach. */
export function isDatabaseUnavailable(error: unknown): boolean {
  for (let current = error, depth = 0; current instanceof Error && depth < 5; current = current.cause, depth++) {
    const code = (current as { code?: unknown }).code;
    if (typeof code === 'string' && DATABASE_UNAVAILABLE_CODES.test(code)) return true;
    if (DATABASE_UNAVAILABLE_MESSAGES.test(current.message)) return true;
  }
  return false;
}

/** PostgreSQL SQLSTATE 40001 (serialization failure) and 40P01 (deadlock detected), PostgreSQL manual, Appendix A. */
const CONCURRENT_CHANGE_CODES = new Set(['40001', '40P01']);

export const CONCURRENT_CHANGE_MESSAGE = 'Someone else changed the same records at the same moment, so nothing was saved; please try again.';

/** True when the error, or one it wraps, is PostgreSQL giving up a transaction that collided with another. */
export function isConcurrentChange(error: unknown): boolean {
  for (let current = error, depth = 0; current instanceof Error && depth < 5; current = current.cause, depth++) {
    const code = (current as { code?: unknown }).code;
    if (typeof code === 'string' && CONCURRENT_CHANGE_CODES.has(code)) return true;
  }
  return false;
}

/** Maps an error to the one API error shape; returns null for a bug. */
export function describeClientError(error: unknown): { status: HttpStatusCode; body: ApiErrorBody } | null {
  if (error instanceof HttpError) return { status: error.status, body: error.toBody() };

  if (isDatabaseUnavailable(error)) {
    return { status: HttpStatus.SERVICE_UNAVAILABLE, body: { error: { message: DATABASE_UNAVAILABLE_MESSAGE } } };
  }

  // The transaction was rolled back whole, so retrying is safe.
  if (isConcurrentChange(error)) return { status: HttpStatus.CONFLICT, body: { error: { message: CONCURRENT_CHANGE_MESSAGE } } };

  if (error instanceof multer.MulterError) {
    const message = (multerMessages[error.code] ?? (() => 'The upload could not be read.'))(error.field);
    const status = error.code === 'LIMIT_FILE_SIZE' || error.code === 'LIMIT_FILE_COUNT' ? HttpStatus.PAYLOAD_TOO_LARGE : HttpStatus.BAD_REQUEST;
    return { status, body: { error: error.field ? { message, fields: { [error.field]: message } } : { message } } };
  }

  if (error instanceof Error && error.constructor === Error && MALFORMED_FORM_MESSAGES.has(error.message)) {
    return {
      status: HttpStatus.BAD_REQUEST,
      body: { error: { message: `The upload could not be read as a multipart form (${error.message.toLowerCase()}); check the file name for control characters and send it again.` } },
    };
  }

  if (isBodyParserError(error)) {
    switch (error.type) {
      case 'entity.parse.failed':
        return { status: HttpStatus.BAD_REQUEST, body: { error: { message: 'The request body is not valid JSON.' } } };
      case 'entity.too.large':
        return {
          status: HttpStatus.PAYLOAD_TOO_LARGE,
          body: { error: { message: `The request body is larger than the ${error.limit ? formatBytes(error.limit) : 'allowed'} limit.` } },
        };
      case 'encoding.unsupported':
      case 'charset.unsupported':
        return { status: HttpStatus.UNSUPPORTED_MEDIA_TYPE, body: { error: { message: 'The request body uses an unsupported character encoding.' } } };
      case 'request.aborted':
      case 'request.size.invalid':
        return { status: HttpStatus.BAD_REQUEST, body: { error: { message: 'The request body arrived incomplete.' } } };
      default:
        if (error.status && error.status >= 400 && error.status < 500) {
          return { status: HttpStatus.BAD_REQUEST, body: { error: { message: 'The request body could not be read.' } } };
        }
    }
  }
  // http-errors style errors from Express internals (e.g. serve-static's 404).
  const status = (error as { status?: unknown; expose?: unknown } | null)?.status;
  if (typeof status === 'number' && status >= 400 && status < 500 && (error as { expose?: unknown }).expose === true) {
    const message = status === HttpStatus.NOT_FOUND ? 'Not found.' : 'The request could not be handled.';
    return { status: status as HttpStatusCode, body: { error: { message } } };
  }
  return null;
}

export const INTERNAL_ERROR_MESSAGE = 'Something went wrong on the server. The error has been logged; please try again.';

/** The only error handler: client errors keep their sentence, anything else
 * is logged with its stack and answered with a plain 500. */
export function errorHandler(log: Logger): ErrorRequestHandler {
  return (error, req, res, next) => {
    if (res.headersSent) return next(error);
    const described = describeClientError(error);
    if (described) {
      if (described.status === HttpStatus.SERVICE_UNAVAILABLE) {
        log.warn('A service the request needs is out of reach.', { method: req.method, path: req.originalUrl, error: String(error) });
        res.setHeader('Retry-After', '30');
      }
      res.status(described.status).json(described.body);
      return;
    }
    log.error('Unhandled error while serving a request.', { method: req.method, path: req.originalUrl, error });
    const body: ApiErrorBody = { error: { message: INTERNAL_ERROR_MESSAGE } };
    res.status(HttpStatus.INTERNAL_SERVER_ERROR).json(body);
  };
}

/** JSON 404 for any /api path that no route matched. */
export const apiNotFound: RequestHandler = (req, res) => {
  const body: ApiErrorBody = { error: { message: `There is no API endpoint ${req.method} ${req.originalUrl.split('?')[0]}.` } };
  res.status(HttpStatus.NOT_FOUND).json(body);
};

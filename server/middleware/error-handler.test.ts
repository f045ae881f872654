import express from 'express';
import multer from 'multer';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import type { Logger } from '../services/logger';
import {
  apiNotFound,
  CONCURRENT_CHANGE_MESSAGE,
  DATABASE_UNAVAILABLE_MESSAGE,
  errorHandler,
  INTERNAL_ERROR_MESSAGE,
  isDatabaseUnavailable,
} from './error-handler';

function recordingLogger() {
  const errors: { message: string; details?: Record<string, unknown> }[] = [];
  const log: Logger = {
    debug: () => undefined,
    info: () => undefined,
    warn: () => undefined,
    error: (message, details) => errors.push({ message, details }),
  };
  return { log, errors };
}

function appThrowing(error: unknown, log: Logger) {
  const app = express();
  app.get('/api/boom', async () => {
    throw error;
  });
  app.use('/api', apiNotFound);
  app.use(errorHandler(log));
  return app;
}

describe('errorHandler', () => {
  it('answers a bug with a plain 500 that carries no stack trace, and logs the stack', async () => {
    const { log, errors } = recordingLogger();
    const bug = new TypeError('Cannot read properties of undefined (reading "focalLengthMm")');
    const response = await request(appThrowing(bug, log)).get('/api/boom');
    expect(response.status).toBe(500);
    expect(response.body).toEqual({ error: { message: INTERNAL_ERROR_MESSAGE } });
    expect(response.text).not.toContain('focalLengthMm');
    expect(response.text).not.toContain('at ');
    expect(errors).toHaveLength(1);
    expect((errors[0].details?.error as Error).stack).toContain('TypeError');
  });

  it('passes an HttpError through with its status, sentence and fields', async () => {
    const { log, errors } = recordingLogger();
    const error = new HttpError(HttpStatus.CONFLICT, 'That lens identifier is already used.', { serial: 'Serial is taken.' });
    const response = await request(appThrowing(error, log)).get('/api/boom');
    expect(response.status).toBe(409);
    expect(response.body).toEqual({ error: { message: 'That lens identifier is already used.', fields: { serial: 'Serial is taken.' } } });
    expect(errors).toHaveLength(0);
  });

  it('maps an oversized multer upload to 413 naming the field', async () => {
    const { log } = recordingLogger();
    const response = await request(appThrowing(new multer.MulterError('LIMIT_FILE_SIZE', 'frames'), log)).get('/api/boom');
    expect(response.status).toBe(413);
    expect(response.body).toEqual({
      error: { message: 'A file in "frames" is larger than the upload limit.', fields: { frames: 'A file in "frames" is larger than the upload limit.' } },
    });
  });

  it('maps an unexpected multer file field to 400', async () => {
    const { log } = recordingLogger();
    const response = await request(appThrowing(new multer.MulterError('LIMIT_UNEXPECTED_FILE', 'photo'), log)).get('/api/boom');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('The upload has a file in an unexpected field "photo".');
  });

  it('answers a database out of reach with 503, a sentence and Retry-After, whether the driver error comes bare or wrapped', async () => {
    const { log, errors } = recordingLogger();
    const refused = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' });
    const wrapped = new Error('Failed query: select 1', { cause: refused });
    for (const error of [refused, wrapped, new Error('Connection terminated unexpectedly')]) {
      const response = await request(appThrowing(error, log)).get('/api/boom');
      expect(response.status).toBe(503);
      expect(response.headers['retry-after']).toBe('30');
      expect(response.body).toEqual({ error: { message: DATABASE_UNAVAILABLE_MESSAGE } });
    }
    expect(errors).toHaveLength(0);
  });

  it('treats the server shutting down (SQLSTATE 57P01) as out of reach, and a constraint violation (23505) as a bug', () => {
    // SQLSTATE codes from the PostgreSQL manual, Appendix A.
    expect(isDatabaseUnavailable(Object.assign(new Error('terminating connection due to administrator command'), { code: '57P01' }))).toBe(true);
    expect(isDatabaseUnavailable(Object.assign(new Error('duplicate key value'), { code: '23505' }))).toBe(false);
  });

  it('answers a transaction PostgreSQL gave up on a collision (SQLSTATE 40P01 deadlock, 40001 serialization) with 409 and a sentence to try again', async () => {
    // SQLSTATE codes from the PostgreSQL manual, Appendix A.
    const { log, errors } = recordingLogger();
    const deadlock = Object.assign(new Error('deadlock detected'), { code: '40P01' });
    for (const error of [deadlock, new Error('Failed query: update people', { cause: deadlock }), Object.assign(new Error('could not serialize access'), { code: '40001' })]) {
      const response = await request(appThrowing(error, log)).get('/api/boom');
      expect(response.status).toBe(409);
      expect(response.body).toEqual({ error: { message: CONCURRENT_CHANGE_MESSAGE } });
    }
    expect(errors).toHaveLength(0);
  });

  it('maps a malformed multipart form (busboy) to 400 with a sentence instead of a 500', async () => {
    const { log, errors } = recordingLogger();
    const response = await request(appThrowing(new Error('Malformed part header'), log)).get('/api/boom');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe(
      'The upload could not be read as a multipart form (malformed part header); check the file name for control characters and send it again.',
    );
    expect(errors).toHaveLength(0);
  });
});

import type { RouteDefinition } from '../route-definition';
import {
  getVerification,
  postVerificationDocument,
  receiveCertificateFile,
  verificationRateLimit,
} from './verification.handlers';

export const verificationRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/verification/:code',
    roles: 'public',
    summary: 'Whether a verification code belongs to a genuine certificate, current or superseded, with its key results; 404 when unknown. Rate-limited.',
    handlers: (deps) => [verificationRateLimit(deps), getVerification(deps)],
  },
  {
    method: 'post',
    path: '/api/verification/:code/document',
    roles: 'public',
    summary: 'Compares the SHA-256 of an uploaded PDF ("file", at most 10 MB) with the one kept for that code. Rate-limited.',
    handlers: (deps) => [verificationRateLimit(deps), receiveCertificateFile, postVerificationDocument(deps)],
  },
];

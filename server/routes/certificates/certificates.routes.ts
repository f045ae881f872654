import { certificateIdParams, issueCertificateBody, reissueCertificateBody } from '../../../shared/schemas/certificates';
import { measurementIdParams } from '../../../shared/schemas/measurements';
import { validateBody, validateParams } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getCertificatePdf, getMeasurementCertificates, postCertificate, postReissue } from './certificates.handlers';

export const certificateRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/measurements/:measurementId/certificates',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'Every revision of the measurement’s certificate, newest first, with status, hash and download path.',
    handlers: (deps) => [validateParams(measurementIdParams), getMeasurementCertificates(deps)],
  },
  {
    method: 'post',
    path: '/api/measurements/:measurementId/certificates',
    roles: ['reviewer', 'admin'],
    summary: 'Issues revision 1 of a certificate for an approved measurement, which becomes certified (four-eyes rule).',
    handlers: (deps) => [validateParams(measurementIdParams), validateBody(issueCertificateBody), postCertificate(deps)],
  },
  {
    method: 'post',
    path: '/api/certificates/:certificateId/reissue',
    roles: ['reviewer', 'admin'],
    summary: 'Issues the next revision of a current certificate with a required reason; the previous one is superseded.',
    handlers: (deps) => [validateParams(certificateIdParams), validateBody(reissueCertificateBody), postReissue(deps)],
  },
  {
    method: 'get',
    path: '/api/certificates/:certificateId/pdf',
    roles: ['technician', 'reviewer', 'admin', 'client'],
    summary: 'Downloads a certificate revision as PDF; a client only its own organisation’s (404 otherwise).',
    handlers: (deps) => [validateParams(certificateIdParams), getCertificatePdf(deps)],
  },
];

import { describe, expect, it } from 'vitest';
import { CertificateDataError, parseCertificateData, type CertificateData } from '../../server/certificates/certificate-data';
import { renderCertificatePdf } from '../../server/certificates/render-certificate-pdf';
import { makeCertificateData, makeMultiConjugateData, makeRevisionTwoData } from './certificate-fixture';

/** The data with one change, typed loosely so tests can break it on purpose. */
function changed(mutate: (data: Record<string, any>) => void): unknown {
  const data = structuredClone(makeCertificateData()) as Record<string, any>;
  mutate(data);
  return data;
}

function problems(input: unknown): Record<string, string> {
  try {
    parseCertificateData(input);
  } catch (error) {
    if (error instanceof CertificateDataError) return error.fields;
    throw error;
  }
  throw new Error('parseCertificateData accepted data it should refuse');
}

describe('parseCertificateData', () => {
  it('parseCertificateData accepts the invented lab’s certificates unchanged', () => {
    for (const data of [makeCertificateData(), makeRevisionTwoData(), makeMultiConjugateData()]) {
      expect(parseCertificateData(data)).toEqual(data);
    }
  });

  it('parseCertificateData accepts a budget row with no degrees of freedom as Infinity or as null (JSON)', () => {
    expect(() => parseCertificateData(changed((d) => (d.results.uncertaintyBudget[0].degreesOfFreedom = null)))).not.toThrow();
    expect(() => parseCertificateData(changed((d) => (d.results.uncertaintyBudget[0].degreesOfFreedom = Infinity)))).not.toThrow();
  });

  it('parseCertificateData names a missing or mistyped field in one sentence', () => {
    expect(problems(changed((d) => delete d.lab.name))).toEqual({ 'lab.name': 'lab.name is missing.' });
    expect(problems(changed((d) => (d.results.coverageFactor = '2.05')))).toEqual({ 'results.coverageFactor': 'results.coverageFactor must be a number.' });
    expect(problems(changed((d) => (d.certificate.issueDate = '12/03/2026')))).toEqual({
      'certificate.issueDate': 'certificate.issueDate must be a calendar date written YYYY-MM-DD.',
    });
    expect(problems(changed((d) => (d.measurement.method = 'autocollimator')))).toEqual({
      'measurement.method': "measurement.method must be one of 'finite-conjugate', 'multi-conjugate', 'displacement', 'collimator', 'auxiliary-lens'.",
    });
    expect(problems(changed((d) => (d.measurement.environment.relativeHumidityPercent = 140)))).toEqual({
      'measurement.environment.relativeHumidityPercent': 'measurement.environment.relativeHumidityPercent must be at most 100.',
    });
    expect(problems(changed((d) => (d.equipment = [])))).toEqual({ equipment: 'equipment must list at least 1 entry.' });
  });

  it('parseCertificateData puts the first problem and the count of the others in its message', () => {
    const input = changed((d) => {
      delete d.lab.name;
      d.client.addressLines = [];
    });
    expect(() => parseCertificateData(input)).toThrow('The certificate cannot be drawn: lab.name is missing. (and 1 more problem)');
  });

  it('parseCertificateData refuses equipment past its due date without a recorded override', () => {
    expect(problems(changed((d) => delete d.equipment[2].override))).toEqual({
      'equipment[2].override': 'equipment[2].override is required: RS-01 was past its calibration due date 2026-02-28 when measured on 2026-03-10.',
    });
  });

  it('parseCertificateData refuses tolerance limits that do not follow from the nominal value and tolerance', () => {
    // ±1 % of 100 mm gives an upper limit of 101 mm (arithmetic), not 101.5 mm.
    expect(problems(changed((d) => (d.conformity.upperLimitMm = 101.5)))).toEqual({
      'conformity.upperLimitMm': 'conformity.upperLimitMm must equal the limit that follows from the nominal value and tolerance (101 mm).',
    });
    expect(problems(changed((d) => (d.item.tolerance = { percent: 1, mm: 1 })))).toEqual({
      'item.tolerance': 'item.tolerance must give exactly one of percent and mm.',
    });
  });

  it('parseCertificateData refuses a conformity decision that the decision rule does not give', () => {
    expect(problems(changed((d) => (d.conformity.decision = 'does-not-conform')))).toEqual({
      'conformity.decision': "conformity.decision must be 'conforms', which the guarded rule gives for the reported value and U.",
    });
  });

  it('parseCertificateData refuses U that is not k × u and a power that is not 1000 / f', () => {
    expect(Object.keys(problems(changed((d) => (d.results.expandedUncertaintyMm = 0.2))))).toEqual(['results.expandedUncertaintyMm']);
    expect(problems(changed((d) => (d.results.opticalPowerDioptres = 10)))).toEqual({
      'results.opticalPowerDioptres': 'results.opticalPowerDioptres must equal 1000 / focalLengthMm (9.9766 D).',
    });
  });

  it('parseCertificateData enforces the four-eyes rule between performer and authoriser', () => {
    expect(problems(changed((d) => (d.people.authorisedBy.name = d.people.performedBy[0].name)))).toEqual({
      'people.authorisedBy.name': 'people.authorisedBy.name must name someone other than the people who performed the measurement (four-eyes rule).',
    });
  });

  it('parseCertificateData asks for the replaced revision and reason from revision 2 on, and refuses them on revision 1', () => {
    expect(problems(changed((d) => (d.certificate.revision = 2)))).toEqual({
      'certificate.replaces': 'certificate.replaces is required from revision 2 on (the withdrawn revision and the reason).',
    });
    expect(problems(changed((d) => (d.certificate.replaces = { revision: 1, reason: 'Typo' })))).toEqual({
      'certificate.replaces': 'certificate.replaces must be left out of a first revision.',
    });
  });

  it('parseCertificateData refuses text the bundled fonts cannot print, and accepts Latin Extended-A names', () => {
    expect(problems(changed((d) => (d.client.name = 'Orrindale 光学')))).toEqual({
      'client.name': 'client.name contains characters the certificate fonts cannot print: "光", "学".',
    });
    expect(problems(changed((d) => (d.client.addressLines = ['Line one\nLine two'])))).toEqual({
      'client.addressLines[0]': 'client.addressLines[0] contains characters the certificate fonts cannot print: U+000A.',
    });
    expect(() => parseCertificateData(changed((d) => (d.client.name = 'Ōrrindale Łódź Šťastný Őrség')))).not.toThrow();
  });

  it('parseCertificateData refuses a malformed verification code or address', () => {
    // O is outside the alphabet (it reads as zero).
    expect(problems(changed((d) => (d.verification.code = '7KQ4-MX2R-9TWO')))).toEqual({
      'verification.code': 'verification.code must be a code of grouped characters such as 7KQ4-MX2R-9TWH.',
    });
    expect(problems(changed((d) => (d.verification.publicBaseUrl = 'ftp://verify.example')))).toEqual({
      'verification.publicBaseUrl': 'verification.publicBaseUrl must be an http(s) address.',
    });
  });

  it('renderCertificatePdf checks its data before drawing anything', async () => {
    const bad = changed((d) => delete d.equipment[2].override) as CertificateData;
    await expect(renderCertificatePdf(bad)).rejects.toBeInstanceOf(CertificateDataError);
  });
});

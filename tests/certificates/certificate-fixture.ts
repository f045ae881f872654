/**
 * Invented certificate data: the lab, client, people, lens and equipment are
 * made up (".example" addresses). The focus curve is a Gaussian plus a
 * constant with small pseudo-random noise from a fixed seed, and the budget
 * is internally consistent: u(f) is the root sum of squares of the listed
 * contributions, U = k·u, P = 1000/f.
 */
import type { BudgetRow } from '../../shared/measure/types';
import type { CertificateData } from '../../server/certificates/certificate-data';

/** Park–Miller minimal standard generator, uniform in (0, 1); only for repeatable fixture noise. */
function seededUniform(seed: number): () => number {
  let state = seed % 2147483647;
  return () => {
    state = (state * 16807) % 2147483647;
    return state / 2147483647;
  };
}

export function gaussianFocusCurve(options: { startMm: number; stepMm: number; count: number; peakMm: number; sigmaMm: number; seed: number; uMm: number }) {
  const { startMm, stepMm, count, peakMm, sigmaMm, seed, uMm } = options;
  const uniform = seededUniform(seed);
  const model = (z: number) => 0.06 + 0.94 * Math.exp(-((z - peakMm) ** 2) / (2 * sigmaMm ** 2));
  const positionsMm = Array.from({ length: count }, (_, i) => Number((startMm + i * stepMm).toFixed(3)));
  const focusValues = positionsMm.map((z) => model(z) + 0.03 * (uniform() - 0.5));
  const fitFrom = peakMm - 2.6 * sigmaMm;
  const fitTo = peakMm + 2.6 * sigmaMm;
  const curve = Array.from({ length: 61 }, (_, i) => {
    const positionMm = fitFrom + ((fitTo - fitFrom) * i) / 60;
    return { positionMm, value: model(positionMm) };
  });
  return { positionsMm, focusValues, curve, bestFocusPositionMm: peakMm, bestFocusStandardUncertaintyMm: uMm };
}

function budgetRow(source: string, value: number, unit: string, standardUncertainty: number, degreesOfFreedom: number, sensitivity: number): BudgetRow {
  return { source, value, unit, standardUncertainty, degreesOfFreedom, sensitivity, contributionMm: Math.abs(sensitivity) * standardUncertainty, varianceShare: 0 };
}

export const focalLengthMm = 100.2345;
export const coverageFactor = 2.0518;

export function finiteConjugateBudget(): BudgetRow[] {
  const rows = [
    budgetRow('Object position reading', 200.0, 'mm', 0.029, Infinity, -0.1109),
    budgetRow('Lens reference mark reading', 500.0, 'mm', 0.029, Infinity, -0.6203),
    budgetRow('Best focus (curve fit)', 652.314, 'mm', 0.0118, 17, 0.6203),
    budgetRow('Rail reading error at best focus', 0, 'mm', 0.029, Infinity, 0.6203),
    budgetRow('Pixel pitch', 3.45, 'µm', 0.0035, Infinity, -9.71),
    budgetRow('Target size (dot spacing)', 20.0, 'mm', 0.008, Infinity, 1.674),
    budgetRow('Image size at best focus', 2914.6, 'px', 0.85, 12, 0.0207),
  ];
  const variance = rows.reduce((sum, r) => sum + r.contributionMm ** 2, 0);
  return rows.map((r) => ({ ...r, varianceShare: r.contributionMm ** 2 / variance }));
}

export function makeCertificateData(): CertificateData {
  const budget = finiteConjugateBudget();
  const standardUncertaintyMm = Math.sqrt(budget.reduce((sum, r) => sum + r.contributionMm ** 2, 0));
  const expandedUncertaintyMm = coverageFactor * standardUncertaintyMm;
  return {
    certificate: { number: 'QOT-2026-0042', revision: 1, issueDate: '2026-03-12' },
    lab: {
      name: 'Quillmere Optical Test Laboratory',
      addressLines: ['Unit 4, Lanternwright Yard', '7 Meridian Road', 'Quillmere QM4 2ZX, Examplia'],
      email: 'certificates@quillmere-optics.example',
      phone: '+00 555 0142',
    },
    client: {
      name: 'Orrindale Instrument Works',
      addressLines: ['Incoming Inspection', '22 Harrow Fen Lane', 'Orrindale OR9 6LT, Examplia'],
      orderReference: 'PO-58213',
    },
    item: {
      identifier: 'L-2026-0187',
      serialNumber: 'PCX100-A-00412',
      description: 'Plano-convex singlet, 25.4 mm diameter, crown glass, uncoated',
      partNumber: 'PCX-100-25',
      nominalFocalLengthMm: 100,
      tolerance: { percent: 1 },
      dateReceived: '2026-03-04',
      condition: 'No visible damage; surfaces clean',
    },
    measurement: {
      method: 'finite-conjugate',
      dates: ['2026-03-10'],
      location: 'Bench 2, permanent laboratory premises',
      environment: { temperatureC: 20.6, relativeHumidityPercent: 41 },
    },
    equipment: [
      {
        kind: 'camera',
        identifier: 'CAM-07',
        description: 'Monochrome board camera, 3.45 µm pixel pitch, bare sensor (no camera lens)',
        calibrationReference: 'QOT-CAL-2025-118',
        calibrationDueDate: '2026-09-30',
      },
      {
        kind: 'target',
        identifier: 'TGT-03',
        description: 'Chrome-on-glass dot-pair target, 20.000 mm nominal dot spacing',
        calibrationReference: 'EXA-DIM-24-0671',
        calibrationDueDate: '2027-01-31',
      },
      {
        kind: 'rail-scale',
        identifier: 'RS-01',
        description: 'Optical rail, 1 m, with linear scale read to 0.01 mm',
        calibrationReference: 'QOT-CAL-2025-090',
        calibrationDueDate: '2026-02-28',
        override: {
          reason: 'Scale checked against gauge block set GB-2 on 2026-03-09 with no deviation above 0.01 mm; recalibration booked for 2026-03-24.',
          approvedBy: 'Dr Imre Salvatierra',
          approvedOn: '2026-03-09',
        },
      },
      {
        kind: 'environment-monitor',
        identifier: 'ENV-02',
        description: 'Thermo-hygrometer, resolution 0.1 °C and 1 % RH',
        calibrationReference: 'QOT-CAL-2025-131',
        calibrationDueDate: '2026-11-15',
      },
    ],
    results: {
      focalLengthMm,
      standardUncertaintyMm,
      expandedUncertaintyMm,
      coverageFactor,
      coverageProbability: 0.95,
      effectiveDegreesOfFreedom: 27.4,
      opticalPowerDioptres: 1000 / focalLengthMm,
      opticalPowerExpandedUncertaintyDioptres: (1000 * expandedUncertaintyMm) / focalLengthMm ** 2,
      backFocalDistanceMm: 96.8127,
      backFocalDistanceStandardUncertaintyMm: 0.0552,
      sweeps: [
        {
          label: 'Sweep 1',
          magnifications: [0.50243],
          focusCurve: gaussianFocusCurve({ startMm: 650.0, stepMm: 0.2, count: 24, peakMm: 652.314, sigmaMm: 0.45, seed: 4242, uMm: 0.0118 }),
        },
      ],
      uncertaintyBudget: budget,
    },
    conformity: { rule: 'guarded', decision: 'conforms', lowerLimitMm: 99, upperLimitMm: 101 },
    people: {
      performedBy: [{ name: 'Agnieszka Wróbel-Łęcka', role: 'Bench technician', date: '2026-03-10' }],
      authorisedBy: { name: 'Dr Imre Salvatierra', role: 'Senior metrologist, reviewer', date: '2026-03-12' },
    },
    remarks: ['The lens was measured with its plane side facing the sensor.'],
    verification: { code: '7KQ4-MX2R-9TWH', publicBaseUrl: 'https://verify.quillmere-optics.example' },
  };
}

/** The same lens re-issued: revision 2 replaces revision 1. */
export function makeRevisionTwoData(): CertificateData {
  const data = makeCertificateData();
  return {
    ...data,
    certificate: {
      ...data.certificate,
      revision: 2,
      issueDate: '2026-03-19',
      replaces: { revision: 1, reason: 'The client’s order reference was printed wrongly.' },
    },
    client: { ...data.client, orderReference: 'PO-58231' },
    people: { ...data.people, authorisedBy: { ...data.people.authorisedBy, date: '2026-03-19' } },
    verification: { ...data.verification, code: 'H3NP-W8CT-Q6ZE' },
  };
}

/** A thick lens by the multi-conjugate method: three sweeps (small multiples) and principal planes. */
export function makeMultiConjugateData(): CertificateData {
  const data = makeCertificateData();
  const sweeps = [
    { label: 'Sweep 1 (object at 300 mm)', peak: 451.82, m: 0.4978 },
    { label: 'Sweep 2 (object at 400 mm)', peak: 434.16, m: 0.3321 },
    { label: 'Sweep 3 (object at 550 mm)', peak: 421.57, m: 0.2225 },
  ].map((s, i) => ({
    label: s.label,
    magnifications: [s.m],
    focusCurve: gaussianFocusCurve({ startMm: s.peak - 2.3, stepMm: 0.2, count: 24, peakMm: s.peak, sigmaMm: 0.4 + 0.05 * i, seed: 77 + i, uMm: 0.01 + 0.002 * i }),
  }));
  return {
    ...data,
    measurement: { ...data.measurement, method: 'multi-conjugate', dates: ['2026-03-10', '2026-03-11'] },
    results: {
      ...data.results,
      principalPlanes: { frontOffsetMm: 3.214, rearOffsetMm: -1.871, frontOffsetStandardUncertaintyMm: 0.084, rearOffsetStandardUncertaintyMm: 0.091 },
      sweeps,
    },
    people: { ...data.people, performedBy: [...data.people.performedBy, { name: 'Oskar Lindqvist-Mbeki', role: 'Bench technician', date: '2026-03-11' }] },
  };
}

/** Bessel's method: one lens-moving sweep with two sharp positions, drawn in one plot. */
export function makeDisplacementData(): CertificateData {
  const data = makeCertificateData();
  const first = gaussianFocusCurve({ startMm: 180, stepMm: 0.5, count: 9, peakMm: 182.1, sigmaMm: 0.6, seed: 11, uMm: 0.021 });
  const second = gaussianFocusCurve({ startMm: 316, stepMm: 0.5, count: 9, peakMm: 317.9, sigmaMm: 0.6, seed: 12, uMm: 0.024 });
  return {
    ...data,
    measurement: { ...data.measurement, method: 'displacement' },
    results: {
      ...data.results,
      backFocalDistanceMm: undefined,
      backFocalDistanceStandardUncertaintyMm: undefined,
      sweeps: [
        {
          label: 'Sweep 1 (D = 500 mm)',
          magnifications: [1.7462, 0.5727],
          focusCurve: {
            positionsMm: [...first.positionsMm, ...second.positionsMm],
            focusValues: [...first.focusValues, ...second.focusValues],
            curve: first.curve,
            bestFocusPositionMm: first.bestFocusPositionMm,
            bestFocusStandardUncertaintyMm: first.bestFocusStandardUncertaintyMm,
            secondPeak: { curve: second.curve, bestFocusPositionMm: second.bestFocusPositionMm, bestFocusStandardUncertaintyMm: second.bestFocusStandardUncertaintyMm },
          },
        },
      ],
    },
  };
}

/**
 * The revision-1 data with a budget of `rowCount` rows: the finite-conjugate
 * rows, then rail-reading error inputs of further sweeps (0.020 mm × 0.036 =
 * 0.00072 mm each), so the budget ends lower on its page as the count grows;
 * and register-style identifiers of 15 and 16 characters. u(f), U and the
 * variance shares are recomputed.
 */
export function makeBudgetData(rowCount: number): CertificateData {
  const data = makeCertificateData();
  const base = finiteConjugateBudget();
  const extra = Array.from({ length: Math.max(0, rowCount - base.length) }, (_, i) =>
    budgetRow(`rail reading error at best focus, sweep ${i + 2}`, 0, 'mm', 0.02, Infinity, 0.036),
  );
  const rows = [...base, ...extra].slice(0, rowCount);
  const variance = rows.reduce((sum, r) => sum + r.contributionMm ** 2, 0);
  const standardUncertaintyMm = Math.sqrt(variance);
  const expandedUncertaintyMm = coverageFactor * standardUncertaintyMm;
  data.results = {
    ...data.results,
    standardUncertaintyMm,
    expandedUncertaintyMm,
    opticalPowerExpandedUncertaintyDioptres: (1000 * expandedUncertaintyMm) / focalLengthMm ** 2,
    uncertaintyBudget: rows.map((r) => ({ ...r, varianceShare: r.contributionMm ** 2 / variance })),
  };
  data.equipment[0] = { ...data.equipment[0], identifier: 'CAM-794f/cfa4fe' };
  data.equipment[2] = { ...data.equipment[2], identifier: 'RAIL-7b87/f39ed3' };
  return data;
}

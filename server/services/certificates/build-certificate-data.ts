/**
 * CertificateData for a measurement, read from the database inside the
 * issuing transaction: the lab, the client, the work order, the lens, the
 * method, equipment with calibration references and recorded overrides,
 * environment, the current analysis run's result with the conformity
 * decision it holds (the one the reviewer approved), who performed and who
 * authorised.
 */
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { MeasurementResult, SweepResult } from '../../../shared/schemas/measurement-result';
import type { CertificateData } from '../../certificates/certificate-data';
import { analysisRuns, equipment, lenses, measurements, organisationContacts, organisations, people, workOrders } from '../../db/schema';
import { invariant } from '../../invariant';
import type { Queryable } from '../numbering';
import { analysedLensSpecificationDifference } from '../review/analysed-lens-specification';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';

type Sweep = CertificateData['results']['sweeps'][number];

const isoDate = (date: Date) => date.toISOString().slice(0, 10);

function sweepLabel(sweep: SweepResult, index: number, method: MeasurementResult['method']): string {
  if (method === 'multi-conjugate' && typeof sweep.objectPositionMm === 'number' && typeof sweep.lensPositionMm === 'number') {
    return `Sweep ${index + 1} (object ${Math.abs(sweep.lensPositionMm - sweep.objectPositionMm).toFixed(0)} mm from lens)`;
  }
  if (method === 'displacement' && typeof sweep.objectPositionMm === 'number' && typeof sweep.sensorPositionMm === 'number') {
    return `Sweep ${index + 1} (D = ${Math.abs(sweep.sensorPositionMm - sweep.objectPositionMm).toFixed(0)} mm)`;
  }
  return `Sweep ${index + 1}`;
}

function certificateSweep(sweep: SweepResult, index: number, method: MeasurementResult['method']): Sweep {
  const used = (sweep.frames ?? []).filter((f) => f.status === 'used' && f.focusValue !== null);
  const fits = sweep.focusFits ?? [];
  invariant(fits.length > 0, `sweep ${index + 1} of the result has no fitted focus curve`);
  const first = fits[0];
  const bestFocusPositionMm = sweep.bestFocusPositionsMm?.[0] ?? sweep.bestFocusPositionMm ?? first.bestFocusPositionMm;
  const bestFocusStandardUncertaintyMm = sweep.bestFocusStandardUncertaintiesMm?.[0] ?? sweep.bestFocusStandardUncertaintyMm ?? first.standardUncertaintyMm;
  const magnifications = (sweep.magnifications ?? (sweep.magnification === null ? [] : [sweep.magnification])).map(Math.abs).filter((m) => m > 0);
  const second = method === 'displacement' ? fits[1] : undefined;
  return {
    label: sweepLabel(sweep, index, method),
    magnifications,
    focusCurve: {
      positionsMm: used.map((f) => f.positionMm),
      focusValues: used.map((f) => f.focusValue as number),
      curve: first.curve,
      bestFocusPositionMm,
      bestFocusStandardUncertaintyMm,
      ...(second
        ? {
            secondPeak: {
              curve: second.curve,
              bestFocusPositionMm: sweep.bestFocusPositionsMm?.[1] ?? second.bestFocusPositionMm,
              bestFocusStandardUncertaintyMm: sweep.bestFocusStandardUncertaintiesMm?.[1] ?? second.standardUncertaintyMm,
            },
          }
        : {}),
    },
  };
}

/** The client's postal address (when recorded) and the contact who receives certificates; something is always said. */
function clientLines(postalAddress: string, contact: { name: string; position: string | null; email: string } | undefined): string[] {
  const lines = postalAddress ? postalAddress.split('\n') : [];
  if (contact) lines.push([contact.name, contact.position].filter(Boolean).join(', '), contact.email);
  return lines.length > 0 ? lines : ['Contact details held on the laboratory’s work order file'];
}

export interface CertificateIdentity {
  number: string;
  revision: number;
  issueDate: string;
  replaces?: { revision: number; reason: string };
  verificationCode: string;
  publicBaseUrl: string;
}

/** Reads everything the certificate prints; the caller checks and renders it (renderCertificatePdf parses it). */
export async function buildCertificateData(tx: Queryable, measurementId: string, identity: CertificateIdentity): Promise<CertificateData> {
  const [row] = await tx
    .select({ measurement: measurements, lens: lenses, workOrder: workOrders, client: organisations })
    .from(measurements)
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .where(eq(measurements.id, measurementId));
  invariant(row, `measurement ${measurementId} exists when its certificate is built`);
  const { measurement: m, lens, workOrder, client } = row;
  invariant(m.currentAnalysisId && m.approvedById && m.approvedAt, `measurement ${m.number} is approved with a current analysis`);

  const [run] = await tx.select().from(analysisRuns).where(and(eq(analysisRuns.id, m.currentAnalysisId), eq(analysisRuns.status, 'succeeded')));
  invariant(run?.result, `measurement ${m.number}'s current analysis has a result`);
  const result = run.result as unknown as MeasurementResult;
  // Submission refuses a run analysed against another specification, and the specification locks from then on.
  const difference = analysedLensSpecificationDifference(run.manifest, lens, workOrder.decisionRule);
  invariant(
    difference === null || difference === 'decision-rule',
    `measurement ${m.number}'s analysis v${run.version} was analysed against the lens specification its lens row holds (${difference})`,
  );
  const conformity = result.conformity;
  invariant(conformity, `measurement ${m.number}'s analysis v${run.version} holds a conformity decision`);

  const personIds = [m.performedById, m.approvedById, ...m.equipmentOverrides.map((o) => o.recordedById)].filter((id): id is string => Boolean(id));
  const personRows = await tx.select({ id: people.id, name: people.name, organisationId: people.organisationId }).from(people).where(inArray(people.id, personIds));
  const nameOf = new Map(personRows.map((p) => [p.id, p.name]));
  const approver = personRows.find((p) => p.id === m.approvedById);

  const labRows = await tx
    .select({ id: organisations.id, name: organisations.name, postalAddress: organisations.postalAddress, email: organisations.email, phone: organisations.phone })
    .from(organisations)
    .where(eq(organisations.kind, 'lab'))
    .orderBy(asc(organisations.createdAt));
  const lab = labRows.find((o) => o.id === approver?.organisationId) ?? labRows[0];
  if (!lab || lab.postalAddress === '') {
    throw new HttpError(
      HttpStatus.CONFLICT,
      `A certificate must state the laboratory’s address (ISO/IEC 17025 §7.8.2.1), and ${lab ? `${lab.name} has` : 'the laboratory has'} none recorded; an administrator can enter it under Administration → Organisations, then issue again.`,
    );
  }

  const contacts = await tx
    .select()
    .from(organisationContacts)
    .where(and(eq(organisationContacts.organisationId, client.id), eq(organisationContacts.receivesCertificates, true)))
    .orderBy(asc(organisationContacts.createdAt))
    .limit(1);
  const contact = contacts[0];

  const equipmentIds = [m.cameraId, m.targetId, m.railScaleId, m.collimatorId, m.auxiliaryLensId].filter((id): id is string => Boolean(id));
  const equipmentRows = await tx.select().from(equipment).where(inArray(equipment.id, equipmentIds));
  const byId = new Map(equipmentRows.map((e) => [e.id, e]));

  const measuredOn = m.measuredOn ?? isoDate(run.finishedAt ?? run.createdAt);
  const approvedOn = isoDate(m.approvedAt);
  const f = result.focalLengthMm;
  const dof = result.effectiveDegreesOfFreedom;

  return {
    certificate: {
      number: identity.number,
      revision: identity.revision,
      issueDate: identity.issueDate,
      ...(identity.replaces ? { replaces: identity.replaces } : {}),
    },
    lab: {
      name: lab.name,
      addressLines: lab.postalAddress.split('\n'),
      ...(lab.email ? { email: lab.email } : {}),
      ...(lab.phone ? { phone: lab.phone } : {}),
    },
    client: {
      name: client.name,
      addressLines: clientLines(client.postalAddress, contact),
      orderReference: workOrder.clientReference ? `${workOrder.clientReference} (work order ${workOrder.number})` : `Work order ${workOrder.number}`,
    },
    item: {
      identifier: lens.identifier,
      description: lens.description.trim() || 'Lens (no description recorded)',
      ...(lens.partNumber ? { partNumber: lens.partNumber } : {}),
      nominalFocalLengthMm: lens.nominalFocalLengthMm,
      tolerance: lens.tolerancePercent !== null ? { percent: lens.tolerancePercent } : { mm: lens.toleranceMm ?? undefined },
    },
    measurement: {
      method: m.method,
      dates: [measuredOn],
      environment: { temperatureC: m.temperatureC ?? Number.NaN, relativeHumidityPercent: m.relativeHumidityPercent ?? Number.NaN },
    },
    equipment: equipmentIds.map((id) => {
      const item = byId.get(id);
      invariant(item, `equipment ${id} of measurement ${m.number} exists`);
      const override = m.equipmentOverrides.find((o) => o.equipmentId === id);
      return {
        kind: item.kind,
        identifier: item.identifier,
        description: item.description.trim() || item.kind,
        calibrationReference: item.calibrationReference,
        calibrationDueDate: item.calibrationDueDate,
        ...(override
          ? { override: { reason: override.reason, approvedBy: nameOf.get(override.recordedById) ?? 'not recorded', approvedOn: override.recordedAt.slice(0, 10) } }
          : {}),
      };
    }),
    results: {
      focalLengthMm: f,
      standardUncertaintyMm: result.standardUncertaintyMm,
      expandedUncertaintyMm: result.expandedUncertaintyMm,
      coverageFactor: result.coverageFactor,
      coverageProbability: result.coverageProbability ?? 0.95,
      ...(typeof dof === 'number' && dof > 0 ? { effectiveDegreesOfFreedom: dof } : {}),
      opticalPowerDioptres: 1000 / f,
      opticalPowerExpandedUncertaintyDioptres: result.opticalPowerExpandedUncertaintyDioptres ?? (1000 * result.expandedUncertaintyMm) / f ** 2,
      ...(result.backFocalDistanceMm !== undefined
        ? { backFocalDistanceMm: result.backFocalDistanceMm, backFocalDistanceStandardUncertaintyMm: result.backFocalDistanceStandardUncertaintyMm }
        : {}),
      ...(result.principalPlanes ? { principalPlanes: result.principalPlanes } : {}),
      sweeps: result.sweeps.map((sweep, index) => certificateSweep(sweep, index, result.method)),
      uncertaintyBudget: result.uncertaintyBudget.map((r) => ({
        source: r.source,
        value: r.value,
        unit: r.unit,
        standardUncertainty: r.standardUncertainty,
        // JSON turns an infinite ν into null; ν ≤ 0 never comes from the engine but must not reach print.
        degreesOfFreedom: typeof r.degreesOfFreedom === 'number' && r.degreesOfFreedom > 0 ? r.degreesOfFreedom : null,
        sensitivity: r.sensitivity,
        contributionMm: r.contributionMm,
        varianceShare: r.varianceShare,
      })),
    },
    // The decision as analysed and approved; the work order's rule may have changed since (it is not locked), the result's has not.
    conformity: { rule: conformity.rule, decision: conformity.decision, lowerLimitMm: conformity.lowerLimitMm, upperLimitMm: conformity.upperLimitMm },
    people: {
      performedBy: [{ name: (m.performedById && nameOf.get(m.performedById)) || 'not recorded', role: 'Bench technician', date: measuredOn }],
      authorisedBy: { name: approver?.name ?? 'not recorded', role: 'Reviewer', date: approvedOn },
    },
    verification: { code: identity.verificationCode, publicBaseUrl: identity.publicBaseUrl },
  };
}

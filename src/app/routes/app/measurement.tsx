import { useCallback, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { FRAME_THUMBNAIL_MAX_SIDE_PX } from '@shared/schemas/frames';
import type { MeasurementDetail } from '@shared/schemas/measurements';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { PageHeader } from '@/components/ui/page-header';
import { ProblemNote } from '@/components/ui/problem-note';
import { SafetyNote } from '@/components/ui/safety-note';
import { Section } from '@/components/ui/section';
import { isApiError } from '@/lib/api-client';
import { hasAnyRole } from '@/lib/authorization';
import { invariant } from '@/lib/invariant';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { useAnalysisRun } from '@/features/measurements/api/get-analysis-run';
import { useMeasurement } from '@/features/measurements/api/get-measurement';
import { AnalysisPanel } from '@/features/measurements/components/analysis-panel';
import { AnalysisVersionPicker } from '@/features/measurements/components/analysis-version-picker';
import { MeasurementSetupSummary } from '@/features/measurements/components/measurement-setup-summary';
import { MeasurementStatusMark } from '@/features/measurements/components/measurement-status-mark';
import { SweepFramesPanel } from '@/features/measurements/components/sweep-frames-panel';
import { frameGeometry, framesByManifestFile } from '@/features/measurements/utils/frame-files';
import { methodRequirements } from '@/features/measurements/utils/method-requirements';
import { MeasurementResultView } from '@/features/measurement-result/components/measurement-result-view';
import { ReviewPanel } from '@/features/review/components/review-panel';
import { CertificatesPanel } from '@/features/certificates/components/certificates-panel';

const linkClass = 'underline decoration-rule-strong underline-offset-4 hover:text-ink';

/** The result of the version shown, with frames found by the names the analysis gave them. */
function ResultOfVersion({ measurement, version }: { measurement: MeasurementDetail; version: number }) {
  const current = measurement.currentAnalysis;
  const fetched = useAnalysisRun(measurement.id, current && current.version === version ? null : version);
  const run = current && current.version === version ? current : fetched.data;
  const cameraPitch = measurement.equipment.find((e) => e.role === 'camera')?.values.pixelPitchUm;
  const geometry = frameGeometry(measurement.sweeps, FRAME_THUMBNAIL_MAX_SIDE_PX);
  const byFile = framesByManifestFile(measurement.sweeps);

  if (!run) {
    if (fetched.isError) return <ProblemNote title={`Analysis v${version} could not be loaded`} message={fetched.error.message} />;
    return <LoadingNote what={`analysis v${version}`} />;
  }
  if (run.status === 'failed') {
    return <ProblemNote title={`Analysis v${version} failed`} message={run.errorMessage ?? 'The engine stopped without saying why.'} />;
  }
  if (!run.result || !geometry) {
    return <p className="text-small text-ink-faint">Analysis v{version} has no result yet ({run.status}).</p>;
  }
  return (
    <MeasurementResultView
      result={run.result}
      analysisVersion={version}
      frameWidthPx={geometry.frameWidthPx}
      frameHeightPx={geometry.frameHeightPx}
      thumbnailScale={geometry.thumbnailScale}
      thumbnailUrl={(file) => byFile.get(file)?.thumbnailUrl ?? ''}
      frameUrl={(file) => byFile.get(file)?.previewUrl ?? ''}
      pixelPitchUm={typeof cameraPitch === 'number' ? cameraPitch : undefined}
    />
  );
}

/** `/measurements/:measurementId`: set-up, frames and readings per sweep, analysis with progress, and the result by version. */
export function MeasurementRoute() {
  const { measurementId } = useParams();
  invariant(measurementId, 'the measurement route has a :measurementId segment');
  const { data: user } = useCurrentUser();
  const measurementQuery = useMeasurement(measurementId);
  const [chosenVersion, setChosenVersion] = useState<number | null>(null);
  const [uploadsBySweep, setUploadsBySweep] = useState<Record<string, number>>({});
  const onUploadsInFlightChange = useCallback(
    (sweepId: string, count: number) => setUploadsBySweep((current) => (current[sweepId] === count ? current : { ...current, [sweepId]: count })),
    [],
  );
  const onRunFinished = useCallback(() => setChosenVersion(null), []);
  const isCertified = measurementQuery.data?.status === 'certified';
  const isTechnician = user ? hasAnyRole(user, ['technician']) : false;
  const mayEditBench = isTechnician && !isCertified;

  if (measurementQuery.isPending) return <LoadingNote what="the measurement" />;
  if (measurementQuery.isError) {
    const notFound = isApiError(measurementQuery.error) && measurementQuery.error.status === 404;
    return (
      <div className="space-y-4">
        <title>Measurement · Paraxia</title>
        <ProblemNote
          title={notFound ? 'There is no measurement at this address' : 'The measurement could not be loaded'}
          message={measurementQuery.error.message}
          action={
            notFound ? null : (
              <Button variant="secondary" size="sm" onClick={() => measurementQuery.refetch()} isBusy={measurementQuery.isFetching}>
                Load again
              </Button>
            )
          }
        />
      </div>
    );
  }

  const measurement = measurementQuery.data;
  const sweeps = [...measurement.sweeps].sort((a, b) => a.position - b.position);
  const uploadsInFlight = Object.values(uploadsBySweep).reduce((sum, n) => sum + n, 0);
  const currentVersion = measurement.currentAnalysis?.version ?? null;
  const finishedRuns = measurement.analyses.filter((run) => run.status === 'succeeded' || run.status === 'failed');
  // Until a run succeeds there is no result to show; a failed run's sentence is in the Analysis section.
  const shownVersion = currentVersion === null ? null : (chosenVersion ?? currentVersion);
  const requirements = methodRequirements(measurement.method);

  return (
    <div className="space-y-8">
      <title>{`Measurement ${measurement.number} · Paraxia`}</title>
      <div className="space-y-4">
        <nav aria-label="Where this measurement belongs" className="flex flex-wrap items-baseline gap-1.5 text-small text-ink-soft">
          <Link to="/work-orders" className={linkClass}>
            Work orders
          </Link>
          <span aria-hidden="true">/</span>
          <Link to={`/work-orders/${measurement.workOrder.id}`} className={`numerals ${linkClass}`}>
            {measurement.workOrder.number}
          </Link>
          <span className="text-ink-faint">{measurement.workOrder.organisation.name}</span>
          <span aria-hidden="true">/</span>
          <Link to={`/lenses/${measurement.lens.id}`} className={`numerals ${linkClass}`}>
            {measurement.lens.identifier}
          </Link>
          <span aria-hidden="true">/</span>
          <span className="numerals text-ink">{measurement.number}</span>
        </nav>
        <PageHeader
          kicker={`Measurement · ${requirements.name}`}
          title={`${measurement.lens.identifier} — ${measurement.number}`}
          actions={
            <dl className="text-right">
              <dt className="text-caption font-semibold uppercase tracking-wider text-ink-faint">Status</dt>
              <dd className="mt-1">
                <MeasurementStatusMark status={measurement.status} plain />
              </dd>
            </dl>
          }
        >
          {measurement.lens.description || 'Lens under test'} · nominal{' '}
          <span className="numerals text-ink">{measurement.lens.nominalFocalLengthMm}</span> <span className="font-light text-ink-faint">mm</span>
          {measurement.lens.tolerancePercent !== null ? <> · ± {measurement.lens.tolerancePercent} %</> : null}
          {measurement.lens.toleranceMm !== null ? <> · ± {measurement.lens.toleranceMm} mm</> : null}
        </PageHeader>
      </div>

      {user ? (
        <Section title="Review" description="Submission, a second person’s approval or return with comments, and the thread.">
          <RegionErrorBoundary region="Review">
            <ReviewPanel measurement={measurement} user={user} />
          </RegionErrorBoundary>
        </Section>
      ) : null}

      {user && (measurement.certificates.length > 0 || measurement.status === 'approved') ? (
        <Section title="Certificates" description="Every revision is kept; a reissue supersedes the previous one and states why.">
          <RegionErrorBoundary region="Certificates">
            <CertificatesPanel measurement={measurement} user={user} />
          </RegionErrorBoundary>
        </Section>
      ) : null}

      <Section title="Set-up" description="As recorded when the measurement was created; the analysis uses these equipment values.">
        <RegionErrorBoundary region="Set-up">
          <MeasurementSetupSummary measurement={measurement} />
        </RegionErrorBoundary>
      </Section>

      <Section
        title="Frames and rail readings"
        description={
          mayEditBench
            ? `Upload each sweep’s through-focus frames, then give every frame its rail reading (mm): the ${requirements.moving === 'sensor' ? 'sensor' : 'lens'} position when it was taken.`
            : `Each sweep’s through-focus frames and their rail readings (mm): the ${requirements.moving === 'sensor' ? 'sensor' : 'lens'} position when each was taken.`
        }
      >
        {mayEditBench ? <SafetyNote context="bench" /> : null}
        <div className="space-y-4">
          {sweeps.map((sweep) => (
            <RegionErrorBoundary key={sweep.id} region={`Sweep ${sweep.position + 1}`}>
              <SweepFramesPanel
                measurementId={measurement.id}
                status={measurement.status}
                mayEdit={mayEditBench}
                sweep={sweep}
                sweepCount={sweeps.length}
                hasAnalyses={measurement.analyses.length > 0}
                onUploadsInFlightChange={onUploadsInFlightChange}
              />
            </RegionErrorBoundary>
          ))}
        </div>
      </Section>

      {mayEditBench ? (
        <Section title="Analysis" description="Every run is kept as a version; a re-run never overwrites an earlier one.">
          <RegionErrorBoundary region="Analysis">
            <AnalysisPanel measurement={measurement} uploadsInFlight={uploadsInFlight} onRunFinished={onRunFinished} />
          </RegionErrorBoundary>
        </Section>
      ) : null}

      <Section
        title="Result"
        description={shownVersion === null ? undefined : 'Focus curves, frames with the detected target, target size through focus, budget and warnings.'}
        actions={
          shownVersion !== null && finishedRuns.length > 0 ? (
            <AnalysisVersionPicker
              analyses={finishedRuns}
              shownVersion={shownVersion}
              currentVersion={currentVersion}
              onChange={(version) => setChosenVersion(version === currentVersion ? null : version)}
            />
          ) : null
        }
      >
        {shownVersion === null ? (
          <p className="rounded-sheet border border-dashed border-rule-strong bg-sheet/70 px-4 py-4 text-small text-ink-soft">
            {measurement.analyses.length === 0
              ? 'No analysis yet. Once every sweep has at least five frames with readings, press Analyse; the result appears here.'
              : 'No analysis has succeeded yet. The Analysis section above says what the engine reported.'}
          </p>
        ) : (
          <RegionErrorBoundary key={shownVersion} region={`Analysis v${shownVersion}`}>
            {shownVersion !== currentVersion && currentVersion !== null ? (
              <p className="mb-4 rounded-sheet border border-undecided/40 bg-undecided-tint/60 px-4 py-2 text-small text-ink" role="note">
                You are reading analysis v{shownVersion}, an older run kept for the record. The measurement’s current result is v{currentVersion}.
              </p>
            ) : null}
            <ResultOfVersion measurement={measurement} version={shownVersion} />
          </RegionErrorBoundary>
        )}
      </Section>
    </div>
  );
}

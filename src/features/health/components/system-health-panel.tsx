import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { CircleTickGlyph, SquareCrossGlyph } from '@/components/ui/mark-glyphs';
import { ProblemNote } from '@/components/ui/problem-note';
import { Quantity } from '@/components/ui/quantity';
import type { ServiceCheck, ServiceName } from '@/types/api';
import { useHealth } from '@/features/health/api/get-health';

const SERVICES: { name: ServiceName; label: string; role: string }[] = [
  { name: 'database', label: 'Database', role: 'Records, reviews and the audit log' },
  { name: 'objectStorage', label: 'Object storage', role: 'Frames, thumbnails and certificate PDFs' },
  { name: 'mail', label: 'Mail', role: 'Invitations and notices to clients' },
];

function ServiceStatusMark({ ok }: { ok: boolean }) {
  return ok ? (
    <span className="inline-flex shrink-0 items-center gap-1.5 whitespace-nowrap rounded-hair border border-conforms/35 bg-conforms-tint px-2 py-0.5 text-small font-medium text-conforms">
      <CircleTickGlyph className="size-4" />
      Working
    </span>
  ) : (
    <span className="inline-flex shrink-0 items-center gap-1.5 whitespace-nowrap rounded-hair border border-nonconform/35 bg-nonconform-tint px-2 py-0.5 text-small font-medium text-nonconform">
      <SquareCrossGlyph className="size-4" />
      Not answering
    </span>
  );
}

function ServiceCard({ label, role, check }: { label: string; role: string; check: ServiceCheck | undefined }) {
  return (
    <li className="flex flex-col gap-2 rounded-sheet border border-rule bg-sheet px-4 py-3 shadow-sheet">
      <div className="flex items-start justify-between gap-3">
        <div>
          <h3 className="font-sans text-body font-semibold">{label}</h3>
          <p className="text-caption text-ink-faint">{role}</p>
        </div>
        {check ? <ServiceStatusMark ok={check.ok} /> : null}
      </div>
      {check ? (
        <dl className="flex items-baseline gap-2 text-small">
          <dt className="text-ink-faint">Answered in</dt>
          <dd>
            <Quantity value={check.latencyMs} unit="ms" digits={0} />
          </dd>
        </dl>
      ) : (
        <p className="text-small text-ink-faint">The server did not report on this service.</p>
      )}
      {check?.message ? <p className="border-t border-rule pt-2 text-small text-ink-soft">{check.message}</p> : null}
    </li>
  );
}

function formatClock(ms: number): string {
  return new Date(ms).toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', second: '2-digit' });
}

/** Live state of the services Paraxia depends on, refreshed every 15 s. */
export function SystemHealthPanel() {
  const health = useHealth();

  if (health.isPending) return <LoadingNote what="service health" />;
  if (health.isError) {
    return (
      <ProblemNote
        title="Service health is unknown"
        message={health.error.message}
        action={
          <Button variant="secondary" size="sm" onClick={() => health.refetch()} isBusy={health.isFetching}>
            Check again
          </Button>
        }
      />
    );
  }

  const report = health.data;
  const failing = SERVICES.filter((service) => report.checks[service.name] && !report.checks[service.name].ok);
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-body" role="status" aria-live="polite">
          {report.status === 'ok' && failing.length === 0 ? (
            <span className="font-medium">All services are working.</span>
          ) : (
            <span className="font-medium">
              Degraded: {failing.length} of {SERVICES.length} services not answering.
            </span>
          )}{' '}
          <span className="text-small text-ink-faint">
            Checked at <span className="numerals">{formatClock(health.dataUpdatedAt)}</span>
          </span>
        </p>
        <Button variant="secondary" size="sm" onClick={() => health.refetch()} isBusy={health.isFetching}>
          Check now
        </Button>
      </div>
      <ul className="grid items-start gap-3 md:grid-cols-3">
        {SERVICES.map((service) => (
          <ServiceCard key={service.name} label={service.label} role={service.role} check={report.checks[service.name]} />
        ))}
      </ul>
    </div>
  );
}

/**
 * One autocannon instance per signed-in person, one connection each, so
 * every connection carries its own session cookie (autocannon's shared
 * request list would otherwise share one cookie). Every response time is
 * kept, so p95 is computed exactly rather than read from autocannon's
 * fixed percentile list (which has p90 and p97.5 but no p95).
 */
import autocannon from 'autocannon';
import { summariseLatencies, type LatencySummary } from './latency-summary';
import type { HttpSession } from './sign-in-over-http';

export interface LoadPhaseResult extends LatencySummary {
  durationSeconds: number;
  requestsPerSecond: number;
  /** Non-2xx answers, connection errors and timeouts together. */
  errors: number;
  statusCounts: Record<string, number>;
  /** p95 per kind of request (the path with ids and query left out), to show where the time goes. */
  p95MsByKind: Record<string, number>;
}

/** "/api/work-orders/<id>?…" → "GET /api/work-orders/:id". */
function kindOf(path: string): string {
  return `GET ${path.split('?')[0].replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g, ':id')}${path.includes('?') ? '?…' : ''}`;
}

export async function runSignedInLoad(options: {
  baseUrl: string;
  sessions: readonly HttpSession[];
  durationSeconds: number;
  /** Picks the next path (with query) for a request. */
  nextPath: () => string;
  /** Each person's pace; absent, each sends its next request as soon as the last is answered (saturation). */
  requestsPerSecondPerUser?: number;
}): Promise<LoadPhaseResult> {
  const latenciesMs: number[] = [];
  const latenciesByKind = new Map<string, number[]>();
  const statusCounts: Record<string, number> = {};
  let failures = 0;
  const choose = (inFlight: string[]) => {
    const path = options.nextPath();
    inFlight.push(path);
    return path;
  };
  // Paced people start spread over one interval, as people do; started together, their timers would fire in step and queue behind each other.
  const startGapMs = options.requestsPerSecondPerUser ? 1000 / options.requestsPerSecondPerUser / options.sessions.length : 0;
  const runs = options.sessions.map(
    (session, index) =>
      new Promise<autocannon.Result>((resolve, reject) => setTimeout(() => {
        // One connection without pipelining: answers come back in the order the paths were chosen.
        const pathsInFlight: string[] = [];
        const instance = autocannon(
          {
            url: options.baseUrl,
            connections: 1,
            duration: options.durationSeconds,
            timeout: 10,
            ...(options.requestsPerSecondPerUser ? { overallRate: options.requestsPerSecondPerUser } : {}),
            headers: { cookie: session.cookie, accept: 'application/json' },
            requests: [{ method: 'GET', setupRequest: (request) => ({ ...request, path: choose(pathsInFlight) }) }],
          },
          (error, result) => (error ? reject(error) : resolve(result)),
        );
        instance.on('response', (_client, statusCode, _bytes, responseTimeMs) => {
          latenciesMs.push(responseTimeMs);
          const kind = kindOf(pathsInFlight.shift() ?? '?');
          if (!latenciesByKind.has(kind)) latenciesByKind.set(kind, []);
          latenciesByKind.get(kind)!.push(responseTimeMs);
          statusCounts[statusCode] = (statusCounts[statusCode] ?? 0) + 1;
        });
      }, index * startGapMs)),
  );
  const results = await Promise.all(runs);
  for (const result of results) failures += result.errors + result.timeouts + result.non2xx;
  const summary = summariseLatencies(latenciesMs);
  return {
    ...summary,
    durationSeconds: options.durationSeconds,
    requestsPerSecond: summary.requests / options.durationSeconds,
    errors: failures,
    statusCounts,
    p95MsByKind: Object.fromEntries([...latenciesByKind].sort().map(([kind, values]) => [kind, Math.round(summariseLatencies(values).p95Ms)])),
  };
}

import type { MeasurementMethod } from '@shared/measure/types';
import { methodRequirements } from '@/features/measurements/utils/method-requirements';

export interface BenchDiagramProps {
  method: MeasurementMethod;
  /** Number of sweeps set up; the multi-conjugate drawing shows that many target places. */
  sweepCount: number;
}

const RAIL_Y = 118;
const AXIS_Y = 66;
const X = { target: 70, collimator: 175, lens: 320, sensor: 540 } as const;

const ink = 'var(--color-ink)';
const soft = 'var(--color-ink-soft)';
const faint = 'var(--color-ink-faint)';
const rule = 'var(--color-rule-strong)';

function ConvergingLensShape({ x, label }: { x: number; label?: string }) {
  return (
    <g data-part={label ?? 'lens'}>
      <path d={`M${x} ${AXIS_Y - 32} Q${x + 13} ${AXIS_Y} ${x} ${AXIS_Y + 32} Q${x - 13} ${AXIS_Y} ${x} ${AXIS_Y - 32}Z`} fill="var(--color-sheet)" stroke={ink} strokeWidth="1.6" />
    </g>
  );
}

function DivergingLensShape({ x }: { x: number }) {
  return (
    <path
      d={`M${x - 7} ${AXIS_Y - 32} H${x + 7} Q${x + 2} ${AXIS_Y} ${x + 7} ${AXIS_Y + 32} H${x - 7} Q${x - 2} ${AXIS_Y} ${x - 7} ${AXIS_Y - 32}Z`}
      fill="var(--color-sheet)"
      stroke={ink}
      strokeWidth="1.6"
    />
  );
}

function Target({ x, ghost = false }: { x: number; ghost?: boolean }) {
  return (
    <g opacity={ghost ? 0.35 : 1}>
      <rect x={x - 3} y={AXIS_Y - 26} width="6" height="52" fill="var(--color-sheet)" stroke={ink} strokeWidth="1.4" strokeDasharray={ghost ? '3 2' : undefined} />
      <circle cx={x} cy={AXIS_Y - 10} r="2.2" fill={ink} />
      <circle cx={x} cy={AXIS_Y + 10} r="2.2" fill={ink} />
    </g>
  );
}

function Sensor({ x }: { x: number }) {
  return (
    <g>
      <rect x={x} y={AXIS_Y - 30} width="12" height="60" fill={soft} stroke={ink} strokeWidth="1.2" />
      <path d={`M${x + 12} ${AXIS_Y - 16} h10 v32 h-10`} fill="none" stroke={ink} strokeWidth="1.2" />
    </g>
  );
}

/** A double-headed arrow over the part that moves through the sweep. */
function MovesArrow({ x }: { x: number }) {
  const y = AXIS_Y - 44;
  return (
    <g data-role="moves" stroke={ink} strokeWidth="1.6" fill="none" strokeLinecap="round" strokeLinejoin="round">
      <path d={`M${x - 30} ${y} H${x + 30}`} />
      <path d={`M${x - 24} ${y - 5} L${x - 30} ${y} L${x - 24} ${y + 5}M${x + 24} ${y - 5} L${x + 30} ${y} L${x + 24} ${y + 5}`} />
      <text x={x} y={y - 9} textAnchor="middle" fill={ink} stroke="none" fontSize="13" fontWeight="600">
        moves
      </text>
    </g>
  );
}

function Label({ x, lines, anchor = 'middle' }: { x: number; lines: string[]; anchor?: 'start' | 'middle' | 'end' }) {
  return (
    <text x={x} y={RAIL_Y + 20} textAnchor={anchor} fontSize="13" fill={soft}>
      {lines.map((line, i) => (
        <tspan key={line} x={x} dy={i === 0 ? 0 : 16} fontWeight={i === 0 ? 600 : 400} fill={i === 0 ? ink : soft}>
          {line}
        </tspan>
      ))}
    </text>
  );
}

/** A carrier post from the part down to the rail. */
function Post({ x }: { x: number }) {
  return <path d={`M${x} ${AXIS_Y + 32} V${RAIL_Y - 4} M${x - 7} ${RAIL_Y - 4} H${x + 7}`} stroke={rule} strokeWidth="2" />;
}

/**
 * The bench as the chosen method sets it up: where the target, lens and
 * sensor sit on the rail, which of them moves through the sweep, and which
 * fixed rail readings each sweep needs. Light travels left to right, and
 * rail readings grow the same way.
 */
export function BenchDiagram({ method, sweepCount }: BenchDiagramProps) {
  const requirements = methodRequirements(method);
  const lensMoves = requirements.moving === 'lens';
  const collimator = method === 'collimator';
  const auxiliary = method === 'auxiliary-lens';
  const ghostTargets = method === 'multi-conjugate' ? Math.max(1, sweepCount - 1) : 0;
  const reading = (field: 'objectPositionMm' | 'lensPositionMm' | 'sensorPositionMm') =>
    requirements.sweepReadings.includes(field) ? 'fixed · reading per sweep' : null;

  const description = [
    collimator ? 'Target at the focal plane of a collimator, so the light leaves it parallel.' : 'Target on the rail.',
    auxiliary ? 'The lens under test in contact with a known converging lens.' : 'The lens under test on its carrier.',
    'A bare camera sensor.',
    lensMoves ? 'The lens moves; target and sensor stay fixed.' : 'The sensor moves through focus; target and lens stay fixed.',
    method === 'multi-conjugate' ? `The target stands at a different distance in each of the ${sweepCount} sweeps.` : '',
  ]
    .filter(Boolean)
    .join(' ');

  return (
    <figure className="self-start rounded-sheet border border-rule bg-sheet px-3 pb-2 pt-3" data-role="bench-diagram" data-method={method}>
      <svg viewBox="0 0 640 184" className="h-auto w-full" role="img" aria-label={`Bench set-up: ${description}`}>
        {/* optical axis */}
        <path d={`M30 ${AXIS_Y} H600`} stroke={rule} strokeWidth="1" strokeDasharray="6 4" />

        {/* rays: a faint sketch of the light path, not to scale */}
        <g stroke={faint} strokeWidth="0.9" fill="none" opacity="0.8">
          {collimator ? (
            <>
              <path d={`M${X.target} ${AXIS_Y - 10} L${X.collimator} ${AXIS_Y - 22} H${X.lens} L${X.sensor} ${AXIS_Y + 4}`} />
              <path d={`M${X.target} ${AXIS_Y - 10} L${X.collimator} ${AXIS_Y + 2} H${X.lens} L${X.sensor} ${AXIS_Y + 4}`} />
            </>
          ) : (
            <>
              <path d={`M${X.target} ${AXIS_Y - 10} L${X.lens} ${AXIS_Y - 26} L${X.sensor} ${AXIS_Y + 12}`} />
              <path d={`M${X.target} ${AXIS_Y - 10} L${X.lens} ${AXIS_Y + 18} L${X.sensor} ${AXIS_Y + 12}`} />
            </>
          )}
        </g>

        {/* rail with ticks */}
        <g>
          <rect x="24" y={RAIL_Y - 4} width="592" height="8" rx="1" fill="var(--color-shade)" stroke={rule} />
          {Array.from({ length: 30 }, (_, i) => (
            <path key={i} d={`M${30 + i * 20} ${RAIL_Y - 4} v${i % 5 === 0 ? 8 : 4}`} stroke={rule} strokeWidth="1" />
          ))}
        </g>

        {/* target, ghost targets for further sweeps */}
        {Array.from({ length: ghostTargets }, (_, i) => (
          <Target key={i} x={X.target + 34 * (i + 1)} ghost />
        ))}
        <Target x={X.target} />
        <Post x={X.target} />
        {collimator ? (
          <>
            <ConvergingLensShape x={X.collimator} label="collimator" />
            <Post x={X.collimator} />
          </>
        ) : null}

        {/* lens under test (and the auxiliary lens in contact) */}
        {lensMoves ? (
          <g opacity="0.3">
            <ConvergingLensShape x={X.lens - 56} />
            <ConvergingLensShape x={X.lens + 56} />
          </g>
        ) : null}
        {auxiliary ? (
          <>
            <ConvergingLensShape x={X.lens - 8} label="auxiliary lens" />
            <DivergingLensShape x={X.lens + 8} />
          </>
        ) : (
          <ConvergingLensShape x={X.lens} />
        )}
        <Post x={X.lens} />

        {/* sensor */}
        {!lensMoves ? (
          <g opacity="0.3">
            <rect x={X.sensor - 40} y={AXIS_Y - 30} width="12" height="60" fill="none" stroke={ink} strokeDasharray="3 2" />
            <rect x={X.sensor + 40} y={AXIS_Y - 30} width="12" height="60" fill="none" stroke={ink} strokeDasharray="3 2" />
          </g>
        ) : null}
        <Sensor x={X.sensor} />
        <Post x={X.sensor + 6} />

        <MovesArrow x={lensMoves ? X.lens : X.sensor + 6} />

        <Label
          x={28}
          anchor="start"
          lines={[
            'Target',
            collimator ? 'at its focus' : method === 'multi-conjugate' ? 'new place each sweep' : (reading('objectPositionMm') ?? ''),
          ]}
        />
        {collimator ? <Label x={X.collimator} lines={['Collimator', 'fixed']} /> : null}
        <Label
          x={X.lens}
          lines={[auxiliary ? 'Lens + auxiliary lens' : 'Lens under test', lensMoves ? 'frame readings' : (reading('lensPositionMm') ?? '')]}
        />
        <Label
          x={X.sensor + 6}
          lines={['Sensor (bare)', lensMoves ? (reading('sensorPositionMm') ?? '') : 'frame readings']}
        />

        <text x="28" y="16" fontSize="12" fill={faint}>
          light and rail readings →
        </text>
      </svg>
      <figcaption className="mt-1 text-caption text-ink-faint">{description} Not to scale.</figcaption>
    </figure>
  );
}

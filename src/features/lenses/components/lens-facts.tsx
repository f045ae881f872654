import type { ReactNode } from 'react';
import { Quantity } from '@/components/ui/quantity';
import type { LensDetail } from '@shared/schemas/lenses';
import { LensKindMark } from '@/features/lenses/components/lens-kind-mark';
import { powerFromFocalLengthDioptres, toleranceBand } from '@/features/lenses/lib/lens-optics';

function Fact({ term, symbol, children, wide = false }: { term: string; symbol?: string; children: ReactNode; wide?: boolean }) {
  return (
    <div className={`min-w-0 border-l border-rule pl-3 ${wide ? 'sm:col-span-2' : ''}`}>
      <dt className="text-caption font-semibold uppercase tracking-wider text-ink-faint">
        {term}
        {/* Symbols keep their case: F′ is the focal point, f′ the focal length. */}
        {symbol ? <span className="ml-1 font-serif normal-case italic tracking-normal">{symbol}</span> : null}
      </dt>
      <dd className="mt-0.5 text-body text-ink">{children}</dd>
    </div>
  );
}

const RULE_WORDS = { simple: 'Simple acceptance', guarded: 'Guarded acceptance, w = U' } as const;

/** What the lens is meant to be: the nominal, in both units, and the band a result must fall in. */
export function LensFacts({ lens }: { lens: LensDetail }) {
  const hasTolerance = lens.tolerancePercent !== null || lens.toleranceMm !== null;
  const band = hasTolerance ? toleranceBand(lens) : null;
  const power = lens.nominalPowerDioptres ?? powerFromFocalLengthDioptres(lens.nominalFocalLengthMm);
  return (
    <dl className="grid gap-x-4 gap-y-3 sm:grid-cols-2 lg:grid-cols-4">
      <Fact term="Nominal focal length" symbol="f′">
        <Quantity value={lens.nominalFocalLengthMm} unit="mm" digits={2} size="lead" />
      </Fact>
      <Fact term="Nominal power" symbol="P">
        <Quantity value={power} unit="D" digits={3} size="lead" />
      </Fact>
      <Fact term="Tolerance band">
        {band ? (
          <span className="flex flex-col">
            <span className="numerals text-lead">
              {band.lowerLimitMm.toFixed(3).replace('-', '\u2212')} … {band.upperLimitMm.toFixed(3).replace('-', '\u2212')}
              <span className="font-sans text-body font-light text-ink-faint"> mm</span>
            </span>
            <span className="text-caption text-ink-faint">
              ±{' '}
              {band.from === 'percent' ? (
                <Quantity value={lens.tolerancePercent!} unit="%" digits={lens.tolerancePercent! < 1 ? 2 : 1} />
              ) : (
                <Quantity value={lens.toleranceMm!} unit="mm" digits={3} />
              )}
              {band.from === 'percent' ? <> of |f′| = <Quantity value={band.halfWidthMm} unit="mm" digits={3} /></> : null}
            </span>
          </span>
        ) : (
          <span className="text-ink-faint">none recorded</span>
        )}
      </Fact>
      <Fact term="Kind">
        <LensKindMark kind={lens.kind} />
      </Fact>
      <Fact term="Description">{lens.description || <span className="text-ink-faint">none</span>}</Fact>
      <Fact term="Part number">{lens.partNumber ? <span className="numerals">{lens.partNumber}</span> : <span className="text-ink-faint">none</span>}</Fact>
      <Fact term="Decision rule" wide>
        {RULE_WORDS[lens.workOrder.decisionRule]} <span className="text-small text-ink-faint">(set on the work order)</span>
      </Fact>
    </dl>
  );
}

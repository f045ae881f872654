import { formatStorageBytes } from '@shared/schemas/storage';

export interface ByteSizeProps {
  bytes: number;
  className?: string;
}

/** A byte count in SI units: the number in tabular figures, the unit lighter; the exact count on hover. */
export function ByteSize({ bytes, className = '' }: ByteSizeProps) {
  const text = formatStorageBytes(bytes);
  const space = text.lastIndexOf(' ');
  const value = space > 0 ? text.slice(0, space) : text;
  const unit = space > 0 ? text.slice(space + 1) : '';
  return (
    <span className={`inline-flex items-baseline gap-x-[0.3em] whitespace-nowrap ${className}`} title={`${bytes.toLocaleString('en-GB')} bytes`} data-bytes={bytes}>
      <span className="numerals text-ink">{value}</span>
      {unit ? <span className="font-sans font-light text-[0.92em] text-ink-faint">{unit}</span> : null}
    </span>
  );
}

/** A count in tabular figures with thin-space thousands separators. */
export function Count({ value }: { value: number }) {
  return <span className="numerals">{value.toLocaleString('en-GB').replace(/,/g, '\u2009')}</span>;
}

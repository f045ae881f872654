import type { ReactNode } from 'react';

export interface DataTableColumn<Row> {
  /** Stable key for React and for `data-column`. */
  key: string;
  header: ReactNode;
  cell: (row: Row) => ReactNode;
  /** Numeric columns are right-aligned in tabular figures so readings line up. */
  numeric?: boolean;
  /** Tailwind width class, e.g. "w-40". */
  widthClass?: string;
}

export interface DataTableProps<Row> {
  /** Read by screen readers; shown visually unless `captionHidden`. */
  caption: string;
  captionHidden?: boolean;
  columns: DataTableColumn<Row>[];
  rows: readonly Row[];
  rowKey: (row: Row) => string;
  /** Shown in a single full-width row when `rows` is empty. */
  emptyText?: string;
  /** Dims a row, e.g. an inactive person or an excluded frame. */
  isRowMuted?: (row: Row) => boolean;
}

/** Dense, ruled, readable: the base for every table of records or readings. */
export function DataTable<Row>({
  caption,
  captionHidden = false,
  columns,
  rows,
  rowKey,
  emptyText = 'Nothing to list.',
  isRowMuted,
}: DataTableProps<Row>) {
  return (
    <div className="overflow-x-auto rounded-sheet border border-rule bg-sheet">
      <table className="w-full border-collapse text-left text-small">
        <caption
          className={
            captionHidden ? 'sr-only' : 'border-b border-rule px-3 py-2 text-left font-serif text-title-sm font-semibold'
          }
        >
          {caption}
        </caption>
        <thead>
          <tr className="bg-shade">
            {columns.map((column) => (
              <th
                key={column.key}
                scope="col"
                className={`border-b border-rule-strong px-3 py-1.5 text-caption font-semibold uppercase tracking-wider text-ink-soft ${
                  column.numeric ? 'text-right' : ''
                } ${column.widthClass ?? ''}`}
              >
                {column.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.length === 0 ? (
            <tr>
              <td colSpan={columns.length} className="px-3 py-4 text-center text-ink-faint">
                {emptyText}
              </td>
            </tr>
          ) : (
            rows.map((row) => (
              <tr
                key={rowKey(row)}
                className={`border-b border-rule/70 last:border-b-0 even:bg-paper/60 hover:bg-shade/70 ${
                  isRowMuted?.(row) ? 'text-ink-faint' : ''
                }`}
              >
                {columns.map((column) => (
                  <td
                    key={column.key}
                    data-column={column.key}
                    className={`px-3 py-1.5 align-baseline ${column.numeric ? 'numerals text-right' : ''}`}
                  >
                    {column.cell(row)}
                  </td>
                ))}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}

import { Link } from 'react-router-dom';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import type { WorkOrderListItem } from '@shared/schemas/work-orders';
import { DueDateText } from '@/features/work-orders/components/due-date-text';
import { SortHeader } from '@/features/work-orders/components/sort-header';
import { WorkOrderStatusMark } from '@/features/work-orders/components/work-order-status-mark';
import { localIsoDate } from '@/features/work-orders/lib/work-order-due';
import { isSortableField, type WorkOrderListState, type WorkOrderSortField } from '@/features/work-orders/lib/work-order-list-state';

export interface WorkOrdersTableProps {
  items: readonly WorkOrderListItem[];
  state: WorkOrderListState;
  onSort: (field: WorkOrderSortField) => void;
  todayIsoDate: string;
  emptyText: string;
  /** False for a client's own list, where every row is the same organisation. */
  showClient?: boolean;
}

function createdDay(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? '—' : localIsoDate(date);
}

export function WorkOrdersTable({ items, state, onSort, todayIsoDate, emptyText, showClient = true }: WorkOrdersTableProps) {
  const header = (field: string, label: string) =>
    isSortableField(field) ? (
      <SortHeader label={label} activeOrder={state.sort === field ? state.order : null} onSort={() => onSort(field)} />
    ) : (
      label
    );
  const columns: DataTableColumn<WorkOrderListItem>[] = [
    {
      key: 'number',
      header: header('number', 'Number'),
      widthClass: 'w-36 whitespace-nowrap',
      cell: (order) => (
        <Link to={`/work-orders/${order.id}`} className="numerals whitespace-nowrap font-medium text-ink underline decoration-rule-strong underline-offset-4 hover:decoration-ink">
          {order.number}
        </Link>
      ),
    },
    { key: 'organisation', header: header('organisation', 'Client'), widthClass: 'min-w-36', cell: (order) => order.organisation.name },
    {
      key: 'title',
      header: header('title', 'Title'),
      cell: (order) => (
        <span className="block min-w-48">
          <span className="block text-ink">{order.title}</span>
          {order.clientReference ? <span className="block text-caption text-ink-faint">ref. {order.clientReference}</span> : null}
        </span>
      ),
    },
    { key: 'status', header: header('status', 'Status'), widthClass: 'w-32', cell: (order) => <WorkOrderStatusMark status={order.status} /> },
    {
      key: 'lenses',
      header: (
        <abbr title="Lenses on the order / measurements made" className="whitespace-nowrap no-underline">
          Lenses / meas.
        </abbr>
      ),
      numeric: true,
      widthClass: 'w-28',
      cell: (order) => (
        <span title={`${order.lensCount} lenses, ${order.measurementCount} measurements`}>
          {order.lensCount}
          <span className="text-ink-faint"> / {order.measurementCount}</span>
        </span>
      ),
    },
    {
      key: 'dueDate',
      header: header('dueDate', 'Due'),
      widthClass: 'w-32',
      cell: (order) => <DueDateText dueDate={order.dueDate} status={order.status} todayIsoDate={todayIsoDate} layout="stacked" />,
    },
    {
      key: 'createdAt',
      header: header('createdAt', 'Created'),
      widthClass: 'w-28',
      cell: (order) => <span className="numerals whitespace-nowrap text-ink-soft">{createdDay(order.createdAt)}</span>,
    },
  ];
  return (
    <DataTable
      caption="Work orders"
      captionHidden
      columns={showClient ? columns : columns.filter((column) => column.key !== 'organisation')}
      rows={items}
      rowKey={(order) => order.id}
      isRowMuted={(order) => order.status === 'cancelled'}
      emptyText={emptyText}
    />
  );
}

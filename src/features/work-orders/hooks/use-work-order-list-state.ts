import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import {
  changeWorkOrderListState,
  readWorkOrderListState,
  writeWorkOrderListState,
  type WorkOrderListChange,
  type WorkOrderListState,
} from '@/features/work-orders/lib/work-order-list-state';

/**
 * The table's state kept in the address bar: a link can be shared and the
 * back button steps through earlier searches, filters and pages.
 */
export function useWorkOrderListState(): [WorkOrderListState, (change: WorkOrderListChange, options?: { replace?: boolean }) => void] {
  const [searchParams, setSearchParams] = useSearchParams();
  const state = useMemo(() => readWorkOrderListState(searchParams), [searchParams]);
  const change = useCallback(
    (next: WorkOrderListChange, options: { replace?: boolean } = {}) => {
      setSearchParams((current) => writeWorkOrderListState(changeWorkOrderListState(readWorkOrderListState(current), next)), {
        replace: options.replace ?? false,
      });
    },
    [setSearchParams],
  );
  return [state, change];
}

import { useEffect, useState } from 'react';
import { localIsoDate } from '@/features/work-orders/lib/work-order-due';

/** Today's date (YYYY-MM-DD, local time), renewed every minute so an open page notices midnight. */
export function useTodayIsoDate(): string {
  const [today, setToday] = useState(() => localIsoDate(new Date()));
  useEffect(() => {
    const timer = window.setInterval(() => setToday(localIsoDate(new Date())), 60_000);
    return () => window.clearInterval(timer);
  }, []);
  return today;
}

import { useEffect, useState } from 'react';

function localIsoDate(date: Date): string {
  return `${date.getFullYear()}-${String(date.getMonth() + 1).padStart(2, '0')}-${String(date.getDate()).padStart(2, '0')}`;
}

/** Today's date (YYYY-MM-DD, local time), renewed every minute so an open page notices midnight. */
export function useTodayIsoDate(): string {
  const [today, setToday] = useState(() => localIsoDate(new Date()));
  useEffect(() => {
    const timer = window.setInterval(() => setToday(localIsoDate(new Date())), 60_000);
    return () => window.clearInterval(timer);
  }, []);
  return today;
}

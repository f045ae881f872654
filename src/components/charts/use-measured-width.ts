import { useEffect, useLayoutEffect, useRef, useState } from 'react';

// useLayoutEffect does nothing on the server; useEffect keeps server rendering quiet.
const useBrowserLayoutEffect = typeof window === 'undefined' ? useEffect : useLayoutEffect;

/**
 * The rendered width of an element, kept up to date with a ResizeObserver.
 * Plots draw in real pixels at that width (rather than scaling a viewBox), so
 * tick labels stay the same size on every screen. `fixedWidthPx` skips the
 * measuring (tests, print); `fallbackWidthPx` is used until the first measure;
 * the width never goes below `minimumWidthPx` (default 280).
 */
export function useMeasuredWidth<T extends HTMLElement>(options: { fixedWidthPx?: number; fallbackWidthPx: number; minimumWidthPx?: number }) {
  const ref = useRef<T>(null);
  const [measuredWidthPx, setMeasuredWidthPx] = useState<number | null>(null);
  const { fixedWidthPx } = options;

  useBrowserLayoutEffect(() => {
    if (fixedWidthPx !== undefined) return undefined;
    const element = ref.current;
    if (!element) return undefined;
    const update = () => {
      const width = Math.floor(element.getBoundingClientRect().width);
      if (width > 0) setMeasuredWidthPx(width);
    };
    update();
    if (typeof ResizeObserver === 'undefined') return undefined;
    const observer = new ResizeObserver(update);
    observer.observe(element);
    return () => observer.disconnect();
  }, [fixedWidthPx]);

  // Below the minimum the drawing keeps its layout and the SVG is scaled down by CSS (max-width: 100%).
  const widthPx = Math.max(options.minimumWidthPx ?? 280, fixedWidthPx ?? measuredWidthPx ?? options.fallbackWidthPx);
  return { ref, widthPx };
}

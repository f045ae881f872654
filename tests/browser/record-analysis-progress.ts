import type { Page } from 'playwright-core';

export interface ProgressSighting {
  framesDone: number;
  framesTotal: number;
  /** The phase sentence the page showed beside the bar. */
  phaseText: string;
}

export interface AnalysisProgressRecorder {
  /** Every distinct state of the run's progress bar the page rendered, in order. */
  sightings(): Promise<ProgressSighting[]>;
}

/**
 * Watches the page's DOM (not the API) for the progress bar of analysis
 * `version` and keeps every state it showed, however briefly: a poll from
 * the test could miss a state the page rendered for less than its interval.
 */
export async function recordAnalysisProgress(options: { page: Page; version: number }): Promise<AnalysisProgressRecorder> {
  const { page, version } = options;
  const key = `__paraxiaProgressSightings_v${version}`;
  await page.evaluate(
    ({ key, labelStart }) => {
      const seen: { framesDone: number; framesTotal: number; phaseText: string }[] = [];
      (window as unknown as Record<string, unknown>)[key] = seen;
      const look = () => {
        const bar = [...document.querySelectorAll('[role="progressbar"]')].find((element) =>
          (element.getAttribute('aria-label') ?? '').startsWith(labelStart),
        );
        if (!bar) return;
        const framesDone = Number(bar.getAttribute('aria-valuenow'));
        const framesTotal = Number(bar.getAttribute('aria-valuemax'));
        const heading = bar.parentElement?.querySelector('p')?.textContent ?? '';
        const last = seen[seen.length - 1];
        if (!last || last.framesDone !== framesDone || last.framesTotal !== framesTotal || last.phaseText !== heading) {
          seen.push({ framesDone, framesTotal, phaseText: heading });
        }
      };
      new MutationObserver(look).observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
      look();
    },
    { key, labelStart: `Analysis v${version}:` },
  );
  return {
    sightings: () => page.evaluate((key) => [...((window as unknown as Record<string, ProgressSighting[]>)[key] ?? [])], key),
  };
}

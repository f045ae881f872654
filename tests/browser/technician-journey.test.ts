/**
 * A technician's whole bench journey in a real browser (Debian's Chromium),
 * through the built client served by the real app, with PostgreSQL, fake S3
 * and fake SMTP from `npm test` and an analysis worker in this process. The
 * frames are a generated through-focus series whose true focal length is
 * known, so the number on the page can be checked against the truth.
 */
import { mkdir } from 'node:fs/promises';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startAnalysisWorker, type RunningAnalysisWorker } from '../../server/workers/analysis-worker';
import { cachedBenchMeasurement, type CachedBenchMeasurement } from '../../scripts/synth/cached-bench-measurement';
import { uniqueSuffix } from '../helpers/people';
import { shown, signInThroughPage, startBrowserStage, stopAll, watchForPageErrors, type BrowserStage } from './browser-pages';
import { createJourneyBench, type JourneyBench } from './journey-bench';
import { recordAnalysisProgress } from './record-analysis-progress';

const NOMINAL_FOCAL_LENGTH_MM = 100;
const TOLERANCE_PERCENT = 2;
const FRAMES_IN_SWEEP = 15;
/** Waits for the server's work (upload checks, the analysis) on a loaded two-core machine. */
const SLOW_STEP_MS = 150_000;

let stage: BrowserStage | undefined;
let worker: RunningAnalysisWorker | undefined;
let bench: JourneyBench;
let fixture: CachedBenchMeasurement;
let baseUrl: string;
const timings: Record<string, number> = {};
/** Measured figures of the run, printed at the end for people; the assertions are separate. */
const figures: Record<string, number> = {};

async function timed<T>(name: string, work: () => Promise<T>): Promise<T> {
  const startedMs = Date.now();
  try {
    return await work();
  } finally {
    timings[name] = Date.now() - startedMs;
  }
}

beforeAll(async () => {
  // The stage is kept as soon as it starts, so afterAll closes it even when the frames fail.
  const [started, generated] = await Promise.all([
    timed('client build, app and browser', async () =>
      (stage = await startBrowserStage({
        name: 'technician-journey',
        // This file's own queue, so workers of other test files never take its jobs.
        env: { PARAXIA_ANALYSIS_QUEUE_NAME: `browser-journey-${uniqueSuffix()}`, PARAXIA_ANALYSIS_POLLING_SECONDS: '0.5' },
      })),
    ),
    timed('bench frames', () =>
      cachedBenchMeasurement('finite-conjugate', (scenario) => ({
        ...scenario,
        sweeps: [{ ...scenario.sweeps[0], framesPerFocus: FRAMES_IN_SWEEP }],
      })),
    ),
  ]);
  fixture = generated;
  baseUrl = started.baseUrl;
  bench = await createJourneyBench({ testApp: started.testApp, fixture });
  // The worker makes each job's folder inside this one but does not make this one.
  const workerScratchDir = path.join(started.runDir, 'analysis-worker');
  await mkdir(workerScratchDir, { recursive: true });
  worker = await startAnalysisWorker({ env: started.testApp.deps.env, scratchDir: workerScratchDir });
}, 240_000);

afterAll(async () => {
  console.info(`technician journey: timings (ms) ${JSON.stringify(timings)}; figures ${JSON.stringify(figures)}; screenshots in ${stage?.screenshotDir}`);
  await stopAll([() => worker?.stop(), () => stage?.close()]);
}, 60_000);

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

function isoDateInDays(days: number): string {
  const date = new Date();
  date.setUTCDate(date.getUTCDate() + days);
  return date.toISOString().slice(0, 10);
}

/** "101.302 plus or minus 0.045 millimetres", as Quantity speaks it to screen readers. */
function parseSpokenMillimetres(text: string): { valueMm: number; expandedUncertaintyMm: number } {
  const match = /^(minus )?(\d+(?:\.\d+)?) plus or minus (\d+(?:\.\d+)?) millimetres$/.exec(text.trim());
  if (!match) throw new Error(`The focal length on the page is not "<value> plus or minus <U> millimetres": ${JSON.stringify(text)}.`);
  return { valueMm: (match[1] ? -1 : 1) * Number(match[2]), expandedUncertaintyMm: Number(match[3]) };
}

describe('the technician’s journey in a browser', () => {
  it('signing in, opening a work order, adding a lens, setting up, uploading, entering readings and analysing shows a focal length within 0.5 % of the generator’s truth, with conformity, focus curve and budget', async () => {
    if (!stage) throw new Error('beforeAll did not start the browser.');
    const { screenshot } = stage;
    const page = await stage.browser.context.newPage();
    const errors = watchForPageErrors(page);
    const suffix = uniqueSuffix();
    const workOrderTitle = `Incoming inspection, plano-convex batch ${suffix}`;
    const lensIdentifier = `PCX-100-${suffix}`;
    const sweep = fixture.manifest.sweeps[0] as { objectPositionMm: number; lensPositionMm: number; frames: { file: string; positionMm: number }[] };
    expect(sweep.frames).toHaveLength(FRAMES_IN_SWEEP);

    try {
      // 1. Sign in.
      await timed('sign in', async () => {
        await signInThroughPage(page, baseUrl, bench.technician);
        await shown(page.getByRole('heading', { level: 1, name: 'Open work' }));
        await shown(page.getByText(bench.technician.name, { exact: true }));
      });
      await screenshot(page, 'signed-in');

      // 2. A new work order for the client.
      await timed('work order', async () => {
        await page.getByRole('navigation', { name: 'Work trail' }).getByRole('link', { name: 'Work orders' }).click();
        await shown(page.getByRole('heading', { level: 1, name: 'Work orders' }));
        await page.getByRole('button', { name: 'New work order' }).click();
        const form = await shown(page.getByRole('form', { name: 'New work order' }));
        await form.getByLabel('Client organisation').selectOption({ label: bench.clientName });
        await form.getByLabel('Title').fill(workOrderTitle);
        await form.getByLabel('Due date (optional)').fill(isoDateInDays(30));
        await form.getByRole('radio', { name: /^Guarded acceptance/ }).check();
        await screenshot(page, 'work-order-form');
        await form.getByRole('button', { name: 'Open work order' }).click();
        await shown(page.getByRole('heading', { level: 1, name: workOrderTitle }));
      });
      expect(new URL(page.url()).pathname).toMatch(/^\/work-orders\/[0-9a-f-]{36}$/);
      await shown(page.getByText(bench.clientName, { exact: true }));
      await shown(page.getByText('Guarded, w = U', { exact: true }));
      await screenshot(page, 'work-order');

      // 3. The lens, nominal 100 mm ± 2 %.
      await timed('lens', async () => {
        await page.getByRole('button', { name: 'Add lens' }).click();
        const form = await shown(page.getByRole('form', { name: 'Add a lens' }));
        await form.getByLabel('Identifier or serial').fill(lensIdentifier);
        await form.getByLabel('Nominal', { exact: true }).fill(String(NOMINAL_FOCAL_LENGTH_MM));
        await form.getByLabel('Tolerance ±').fill(String(TOLERANCE_PERCENT));
        await form.getByRole('button', { name: 'Add lens' }).click();
        await shown(form.getByRole('status').filter({ hasText: `Added ${lensIdentifier}` }));
      });
      const lensRow = await shown(page.getByRole('row').filter({ hasText: lensIdentifier }));
      await screenshot(page, 'lens-added');

      // 4. A finite-conjugate measurement of that lens, with the register's equipment and the bench's fixed readings.
      await timed('measurement set-up', async () => {
        await lensRow.getByRole('link', { name: 'New measurement' }).click();
        await shown(page.getByRole('heading', { level: 1, name: 'New measurement' }));
        const form = await shown(page.getByRole('form', { name: 'New measurement' }));
        await form.getByRole('radio', { name: /^Finite conjugate/ }).check();
        for (const [group, item] of [
          ['Camera', bench.camera],
          ['Target', bench.target],
          ['Rail scale', bench.railScale],
        ] as const) {
          await form
            .getByRole('radiogroup', { name: group, exact: true })
            .getByRole('radio', { name: new RegExp(escapeRegExp(item.identifier)) })
            .check();
        }
        await form.getByLabel('Target (object) position (mm)').fill(String(sweep.objectPositionMm));
        await form.getByLabel('Lens mark position (mm)').fill(String(sweep.lensPositionMm));
        await screenshot(page, 'measurement-set-up');
        await form.getByRole('button', { name: 'Create measurement' }).click();
        await shown(page.getByRole('heading', { level: 1, name: new RegExp(`^${escapeRegExp(lensIdentifier)} — `) }));
      });
      expect(new URL(page.url()).pathname).toMatch(/^\/measurements\/[0-9a-f-]{36}$/);
      const sweepPanel = await shown(page.getByRole('region', { name: 'Frames of the sweep' }));
      await screenshot(page, 'measurement-created');

      // 5. Every frame of the sweep through the page's file input.
      await timed('frame upload', async () => {
        await sweepPanel.locator('input[type="file"]').setInputFiles(sweep.frames.map((frame) => path.join(fixture.folder, frame.file)));
        await shown(sweepPanel.getByRole('status').filter({ hasText: new RegExp(`${FRAMES_IN_SWEEP} of ${FRAMES_IN_SWEEP} files stored`) }), SLOW_STEP_MS);
      });
      await shown(sweepPanel.getByText(new RegExp(`^${FRAMES_IN_SWEEP} frames · 0 with readings`)));
      await screenshot(page, 'frames-stored');

      // 6. The rail readings pasted as a two-column table.
      await timed('readings', async () => {
        await sweepPanel.getByRole('radio', { name: 'Paste or upload a table' }).click();
        const table = ['file,position_mm', ...sweep.frames.map((frame) => `${path.basename(frame.file)},${frame.positionMm}`)].join('\n');
        await sweepPanel.getByLabel('Two columns per line: file name, rail reading in mm').fill(table);
        await shown(sweepPanel.getByText(new RegExp(`^${FRAMES_IN_SWEEP} of ${FRAMES_IN_SWEEP} frames get a reading`)));
        await screenshot(page, 'readings-pasted');
        await sweepPanel.getByRole('button', { name: 'Save readings' }).click();
        await shown(sweepPanel.getByText(new RegExp(`^${FRAMES_IN_SWEEP} frames · ${FRAMES_IN_SWEEP} with readings · ${FRAMES_IN_SWEEP} in analysis`)));
      });
      await screenshot(page, 'readings-saved');

      // 7. Analyse, follow the progress to the end, read the result.
      const progress = await recordAnalysisProgress({ page, version: 1 });
      const headline = page.getByRole('region', { name: 'Measured focal length' });
      const failure = page.getByText('Analysis v1 failed', { exact: true }).first();
      const progressBar = page.getByRole('progressbar', { name: /^Analysis v1:/ });
      await timed('analysis', async () => {
        await page.getByRole('button', { name: 'Analyse', exact: true }).click();
        await progressBar.or(headline).or(failure).first().waitFor({ state: 'visible', timeout: SLOW_STEP_MS });
        await screenshot(page, 'analysing');
        await headline.or(failure).first().waitFor({ state: 'visible', timeout: SLOW_STEP_MS });
        if (await failure.isVisible()) {
          throw new Error(`The analysis failed on the page: ${await failure.locator('..').innerText()}`);
        }
      });
      await progressBar.waitFor({ state: 'detached' });
      const sightings = await progress.sightings();
      expect(sightings.length, 'the page showed the run’s progress at least once').toBeGreaterThan(0);
      for (const sighting of sightings) expect(sighting.framesTotal).toBe(FRAMES_IN_SWEEP);
      const framesDoneSeen = sightings.map((s) => s.framesDone);
      expect(framesDoneSeen).toEqual([...framesDoneSeen].sort((a, b) => a - b));
      figures.progressStatesSeen = sightings.length;
      figures.mostFramesSeenDone = Math.max(...framesDoneSeen);
      await shown(page.getByRole('button', { name: 'Re-run analysis (v2)' }));
      await shown(page.locator('main header').getByText('Analysed', { exact: true }));
      await headline.scrollIntoViewIfNeeded();
      await screenshot(page, 'result');

      const spoken = await shown(headline.getByText(/ plus or minus .* millimetres$/).first());
      const { valueMm: focalLengthMm, expandedUncertaintyMm } = parseSpokenMillimetres((await spoken.textContent()) ?? '');
      const truthMm = fixture.truth.focalLengthMm;
      figures.focalLengthOnPageMm = focalLengthMm;
      figures.expandedUncertaintyOnPageMm = expandedUncertaintyMm;
      figures.truthFocalLengthMm = truthMm;
      expect(Math.abs(focalLengthMm - truthMm) / truthMm).toBeLessThan(0.005);
      expect(expandedUncertaintyMm).toBeGreaterThan(0);

      // Guarded acceptance with w = U (ILAC-G8:09/2019): conforms inside the tolerance band narrowed by U on each side.
      const lowerMm = NOMINAL_FOCAL_LENGTH_MM * (1 - TOLERANCE_PERCENT / 100);
      const upperMm = NOMINAL_FOCAL_LENGTH_MM * (1 + TOLERANCE_PERCENT / 100);
      const expectedWord =
        focalLengthMm - expandedUncertaintyMm >= lowerMm && focalLengthMm + expandedUncertaintyMm <= upperMm
          ? 'Conforms'
          : focalLengthMm + expandedUncertaintyMm < lowerMm || focalLengthMm - expandedUncertaintyMm > upperMm
            ? 'Does not conform'
            : 'Undecided';
      expect(expectedWord, 'the generator’s lens lies well inside 100 mm ± 2 %').toBe('Conforms');
      await shown(headline.getByText(expectedWord, { exact: true }));

      const focusCurve = await shown(page.getByRole('img', { name: /^Focus measure against rail position for sweep 1:/ }));
      // The generator spoiled no frame, so every frame has a focus value to draw.
      expect(await focusCurve.locator('title').first().textContent()).toContain(`: ${FRAMES_IN_SWEEP} frames drawn;`);
      const budget = await shown(page.getByRole('table', { name: /^Uncertainty budget of f′/ }));
      expect(await budget.getByRole('rowheader').count()).toBeGreaterThanOrEqual(2);

      expect(errors, 'uncaught errors in the page and API answers of 500 or more').toEqual([]);
    } catch (error) {
      await screenshot(page, 'failure');
      throw error;
    }
  }, 300_000);
});

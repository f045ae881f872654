import os from 'node:os';
import type { MeasurementResult } from '../../shared/schemas/measurement-result';
import type { AnalysisProgress } from '../../shared/measure/engine/frame-source';
import { analyseMeasurement } from '../../shared/measure/engine/analyse-measurement';
import { loadMeasurementFolder } from './load-measurement-folder';
import { SharpFrameSource } from './sharp-frame-source';

export interface MeasureFolderOptions {
  concurrency?: number;
  onProgress?: (progress: AnalysisProgress) => void;
  monteCarloDraws?: number;
  /** Record every focus operator's measure per frame, not only the chosen one's. */
  everyFocusOperator?: boolean;
}

/** The one engine entry point on the server side: the command line and the analysis worker both call it. */
export async function measureFolder(folder: string, options: MeasureFolderOptions = {}): Promise<MeasurementResult> {
  const manifest = await loadMeasurementFolder(folder);
  return analyseMeasurement({
    manifest,
    source: new SharpFrameSource(folder),
    concurrency: options.concurrency ?? Math.max(2, os.availableParallelism()),
    monteCarloDraws: options.monteCarloDraws,
    everyFocusOperator: options.everyFocusOperator,
    onProgress: options.onProgress,
  });
}

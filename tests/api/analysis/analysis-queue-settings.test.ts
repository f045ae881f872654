import { describe, expect, it } from 'vitest';
import { checkAnalysisQueueSettings, defaultAnalysisQueueSettings, readAnalysisQueueSettings } from '../../../server/services/analysis-queue';

describe('readAnalysisQueueSettings', () => {
  it('gives the defaults when no PARAXIA_ANALYSIS_* variable is set, or one is empty', () => {
    expect(readAnalysisQueueSettings({})).toEqual(defaultAnalysisQueueSettings);
    expect(readAnalysisQueueSettings({ PARAXIA_ANALYSIS_EXPIRE_SECONDS: '' })).toEqual(defaultAnalysisQueueSettings);
    expect(defaultAnalysisQueueSettings).toMatchObject({ queueName: 'analyse-measurement', retryLimit: 2 });
  });

  it('reads every variable', () => {
    expect(
      readAnalysisQueueSettings({
        PARAXIA_ANALYSIS_QUEUE_NAME: 'analyse-lab-2',
        PARAXIA_ANALYSIS_EXPIRE_SECONDS: '40',
        PARAXIA_ANALYSIS_RETRY_LIMIT: '0',
        PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS: '3',
        PARAXIA_ANALYSIS_MAINTENANCE_SECONDS: '5',
        PARAXIA_ANALYSIS_POLLING_SECONDS: '0.5',
        PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: '0',
      }),
    ).toEqual({
      queueName: 'analyse-lab-2',
      expireInSeconds: 40,
      retryLimit: 0,
      retryDelaySeconds: 3,
      maintenanceIntervalSeconds: 5,
      pollingIntervalSeconds: 0.5,
      orphanCheckSeconds: 0,
    });
  });

  it('names the variable and the value in a sentence when one is bad', () => {
    expect(() => readAnalysisQueueSettings({ PARAXIA_ANALYSIS_EXPIRE_SECONDS: 'soon' })).toThrow(
      'PARAXIA_ANALYSIS_EXPIRE_SECONDS must be a whole number from 1 to 82800 (got "soon").',
    );
    // pg-boss polls no faster than every 0.5 s (its own configuration check).
    expect(() => readAnalysisQueueSettings({ PARAXIA_ANALYSIS_POLLING_SECONDS: '0.1' })).toThrow(
      'PARAXIA_ANALYSIS_POLLING_SECONDS must be a number from 0.5 to 600 (got "0.1").',
    );
    expect(() => readAnalysisQueueSettings({ PARAXIA_ANALYSIS_QUEUE_NAME: 'Analyse Measurement' })).toThrow(
      'PARAXIA_ANALYSIS_QUEUE_NAME must be 1 to 61 lower-case letters, digits or hyphens, starting with a letter or digit (got "Analyse Measurement").',
    );
  });
});

describe('checkAnalysisQueueSettings', () => {
  it('fills defaults and names the bad option', () => {
    expect(checkAnalysisQueueSettings({ retryLimit: 4 })).toEqual({ ...defaultAnalysisQueueSettings, retryLimit: 4 });
    expect(() => checkAnalysisQueueSettings({ retryLimit: 2.5 })).toThrow('retryLimit must be a whole number from 0 to 20, got 2.5.');
    expect(() => checkAnalysisQueueSettings({ expireInSeconds: 0 })).toThrow('expireInSeconds must be a whole number from 1 to 82800, got 0.');
  });
});

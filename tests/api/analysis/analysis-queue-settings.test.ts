import { describe, expect, it } from 'vitest';
import { parseEnv } from '../../../server/env';
import { analysisQueueSettingsFromEnv, checkAnalysisQueueSettings, defaultAnalysisQueueSettings } from '../../../server/services/analysis-queue';

describe('analysisQueueSettingsFromEnv', () => {
  it('gives the defaults when no PARAXIA_ANALYSIS_* variable is set, or one is empty', () => {
    expect(analysisQueueSettingsFromEnv(parseEnv({}))).toEqual(defaultAnalysisQueueSettings);
    expect(analysisQueueSettingsFromEnv(parseEnv({ PARAXIA_ANALYSIS_EXPIRE_SECONDS: '' }))).toEqual(defaultAnalysisQueueSettings);
    expect(defaultAnalysisQueueSettings).toMatchObject({ queueName: 'analyse-measurement', retryLimit: 2 });
  });

  it('reads every variable', () => {
    expect(
      analysisQueueSettingsFromEnv(
        parseEnv({
          PARAXIA_ANALYSIS_QUEUE_NAME: 'analyse-lab-2',
          PARAXIA_ANALYSIS_EXPIRE_SECONDS: '40',
          PARAXIA_ANALYSIS_RETRY_LIMIT: '0',
          PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS: '3',
          PARAXIA_ANALYSIS_MAINTENANCE_SECONDS: '5',
          PARAXIA_ANALYSIS_POLLING_SECONDS: '0.5',
          PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: '0',
        }),
      ),
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

  // A bad value of each variable is refused by parseEnv with a sentence: server/env.test.ts.
});

describe('checkAnalysisQueueSettings', () => {
  it('fills defaults and names the bad option', () => {
    expect(checkAnalysisQueueSettings({ retryLimit: 4 })).toEqual({ ...defaultAnalysisQueueSettings, retryLimit: 4 });
    expect(() => checkAnalysisQueueSettings({ retryLimit: 2.5 })).toThrow('retryLimit must be a whole number from 0 to 20, got 2.5.');
    expect(() => checkAnalysisQueueSettings({ expireInSeconds: 0 })).toThrow('expireInSeconds must be a whole number from 1 to 82800, got 0.');
  });
});

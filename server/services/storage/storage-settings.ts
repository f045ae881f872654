import type { StorageSettings } from '../../../shared/schemas/storage';
import { numericSettings, type Env } from '../../env';

export const defaultStorageSettings: StorageSettings = {
  retentionDefaultDays: numericSettings.PARAXIA_RETENTION_DAYS.default,
  orphanMinimumAgeMinutes: numericSettings.PARAXIA_ORPHAN_MIN_AGE_MINUTES.default,
};

/** PARAXIA_RETENTION_DAYS (default 365) and PARAXIA_ORPHAN_MIN_AGE_MINUTES (default 60), checked by server/env.ts. */
export function storageSettingsFromEnv(env: Pick<Env, 'PARAXIA_RETENTION_DAYS' | 'PARAXIA_ORPHAN_MIN_AGE_MINUTES'>): StorageSettings {
  return { retentionDefaultDays: env.PARAXIA_RETENTION_DAYS, orphanMinimumAgeMinutes: env.PARAXIA_ORPHAN_MIN_AGE_MINUTES };
}

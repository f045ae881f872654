import type { StorageSettings } from '../../../shared/schemas/storage';
import { RETENTION_DAYS_MAX, RETENTION_DAYS_MIN } from '../../../shared/schemas/storage';

export const defaultStorageSettings: StorageSettings = { retentionDefaultDays: 365, orphanMinimumAgeMinutes: 60 };

const VARIABLES: Record<keyof StorageSettings, { variable: string; min: number; max: number }> = {
  retentionDefaultDays: { variable: 'PARAXIA_RETENTION_DAYS', min: RETENTION_DAYS_MIN, max: RETENTION_DAYS_MAX },
  orphanMinimumAgeMinutes: { variable: 'PARAXIA_ORPHAN_MIN_AGE_MINUTES', min: 0, max: 7 * 24 * 60 },
};

/** Reads PARAXIA_RETENTION_DAYS (default 365) and PARAXIA_ORPHAN_MIN_AGE_MINUTES (default 60); unset or empty means the default. */
export function readStorageSettings(source: Record<string, string | undefined> = process.env): StorageSettings {
  const settings = { ...defaultStorageSettings };
  for (const [key, { variable, min, max }] of Object.entries(VARIABLES) as [keyof StorageSettings, (typeof VARIABLES)[keyof StorageSettings]][]) {
    const raw = source[variable];
    if (raw === undefined || raw.trim() === '') continue;
    const value = Number(raw);
    if (!Number.isInteger(value) || value < min || value > max) {
      throw new Error(`${variable} must be a whole number from ${min} to ${max} (got ${JSON.stringify(raw)}).`);
    }
    settings[key] = value;
  }
  return settings;
}

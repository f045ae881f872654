import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf } from '../../services/catalogue-queries';
import { findOrphanObjects } from '../../services/storage/find-orphan-objects';
import { measureStorageUsage } from '../../services/storage/measure-storage-usage';
import { previewRetention } from '../../services/storage/preview-retention';
import { purgeRawFrames } from '../../services/storage/purge-raw-frames';
import { removeOrphanObjects } from '../../services/storage/remove-orphan-objects';
import { storageSettingsFromEnv } from '../../services/storage/storage-settings';
import type { OrphanListQuery, OrphanRemovalBody, RetentionPreviewQuery, RetentionPurgeBody, StorageUsageQuery } from './storage.schemas';

export function getStorageSettings(deps: AppDeps): RequestHandler {
  const settings = storageSettingsFromEnv(deps.env);
  return (_req, res) => {
    res.status(HttpStatus.OK).json({ settings });
  };
}

export function getStorageUsage(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    res.status(HttpStatus.OK).json(await measureStorageUsage(deps, res.locals.query as StorageUsageQuery));
  };
}

export function getRetentionPreview(deps: AppDeps): RequestHandler {
  const settings = storageSettingsFromEnv(deps.env);
  return async (_req, res) => {
    const query = res.locals.query as RetentionPreviewQuery;
    const preview = await previewRetention(deps.db, {
      olderThanDays: query.olderThanDays ?? settings.retentionDefaultDays,
      organisationId: query.organisationId ?? null,
    });
    res.status(HttpStatus.OK).json(preview);
  };
}

export function postRetentionPurge(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    res.status(HttpStatus.OK).json(await purgeRawFrames(deps, res.locals.body as RetentionPurgeBody, actorOf(req)));
  };
}

export function getOrphanObjects(deps: AppDeps): RequestHandler {
  const settings = storageSettingsFromEnv(deps.env);
  return async (_req, res) => {
    const query = res.locals.query as OrphanListQuery;
    res.status(HttpStatus.OK).json(
      await findOrphanObjects(deps, { organisationId: query.organisationId ?? null, minimumAgeMinutes: settings.orphanMinimumAgeMinutes }),
    );
  };
}

export function postOrphanRemoval(deps: AppDeps): RequestHandler {
  const settings = storageSettingsFromEnv(deps.env);
  return async (req, res) => {
    const { keys } = res.locals.body as OrphanRemovalBody;
    res.status(HttpStatus.OK).json(await removeOrphanObjects(deps, { keys, minimumAgeMinutes: settings.orphanMinimumAgeMinutes }, actorOf(req)));
  };
}

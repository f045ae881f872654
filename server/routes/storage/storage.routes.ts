import { validateBody, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import {
  getOrphanObjects,
  getRetentionPreview,
  getStorageSettings,
  getStorageUsage,
  postOrphanRemoval,
  postRetentionPurge,
} from './storage.handlers';
import { orphanListQuery, orphanRemovalBody, retentionPreviewQuery, retentionPurgeBody, storageUsageQuery } from './storage.schemas';

export const storageRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/storage/settings',
    roles: ['admin'],
    summary: 'The default retention age and the minimum age of an object offered as an orphan.',
    handlers: (deps) => [getStorageSettings(deps)],
  },
  {
    method: 'get',
    path: '/api/storage/usage',
    roles: ['admin'],
    summary: 'Bytes and object counts by kind per organisation, work order and measurement, read from object storage; work orders and measurements paged, largest first.',
    handlers: (deps) => [validateQuery(storageUsageQuery), getStorageUsage(deps)],
  },
  {
    method: 'get',
    path: '/api/storage/retention/preview',
    roles: ['admin'],
    summary: 'The raw frames of measurements first certified more than N days ago: measurements, frame count, bytes and a token naming the set.',
    handlers: (deps) => [validateQuery(retentionPreviewQuery), getRetentionPreview(deps)],
  },
  {
    method: 'post',
    path: '/api/storage/retention/purge',
    roles: ['admin'],
    summary: 'Deletes the previewed raw frame objects (thumbnails, previews, results and certificates stay); 409 when the set changed since the preview.',
    handlers: (deps) => [validateBody(retentionPurgeBody), postRetentionPurge(deps)],
  },
  {
    method: 'get',
    path: '/api/storage/orphans',
    roles: ['admin'],
    summary: 'Objects in storage that no frame or certificate points at, older than the minimum age.',
    handlers: (deps) => [validateQuery(orphanListQuery), getOrphanObjects(deps)],
  },
  {
    method: 'post',
    path: '/api/storage/orphans/removal',
    roles: ['admin'],
    summary: 'Removes the named orphan objects, each checked again against storage and the database; keys that gained a record are kept.',
    handlers: (deps) => [validateBody(orphanRemovalBody), postOrphanRemoval(deps)],
  },
];

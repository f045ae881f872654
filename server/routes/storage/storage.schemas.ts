export {
  orphanListQuery,
  orphanRemovalBody,
  retentionPreviewQuery,
  retentionPurgeBody,
  storageUsageQuery,
  type OrphanListQuery,
  type OrphanRemovalBody,
  type RetentionPreviewQuery,
  type RetentionPurgeBody,
  type StorageUsageQuery,
} from '../../../shared/schemas/storage';

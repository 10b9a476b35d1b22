/** What other features and the server may use from registry: runs anywhere (no React Native). */
export { designPose } from '@/features/registry/chain-geometry';
export {
  auditHref,
  bulletinEditHref,
  bulletinHref,
  bulletinsHref,
  newBulletinHref,
} from '@/features/registry/hrefs';
export { csvCell, readCsv } from '@/features/registry/design-file/csv-text';

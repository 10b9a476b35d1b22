/** What other features and the server may use from sync: runs anywhere (no React Native). */
export {
  readAssignments,
  readCurrentDesign,
  readDecisions,
  readDesignVersion,
  readRide,
  readRides,
  readTemplates,
} from '@/features/sync/cache';

/** What other features and the server may use from rides: runs anywhere (no React Native). */
export { RIDES_STALE_MS, rideKeys, useRidesQuery } from '@/features/rides/api';
export {
  newRideHref,
  rideDesignHref,
  rideEditHref,
  rideHref,
  rideImportHref,
  rideDesignEditHref,
  rideLogHref,
  rideLogbookHref,
  rideNdtHref,
  rideIncidentsHref,
  rideIncidentNewHref,
  ridePartsHref,
  rideScheduleHref,
  rideStatusHref,
  rideVersionHref,
  ridesHref,
} from '@/features/rides/hrefs';
export { eases, statusChoices } from '@/features/rides/status-rules';
export {
  PLATE_PATH,
  parsePlateCode,
  parsePlatePath,
  platePath,
  plateUrl,
  type PlateParse,
  type PlateRefusal,
  type PlateTarget,
} from '@/features/rides/plate-url';

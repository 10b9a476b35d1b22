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
  rideNdtHref,
  rideScheduleHref,
  rideStatusHref,
  rideVersionHref,
  ridesHref,
} from '@/features/rides/hrefs';
export { eases, statusChoices } from '@/features/rides/status-rules';

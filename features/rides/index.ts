/** What other features may use from rides: everything else in the folder is its own. */
export { RIDES_STALE_MS, rideKeys, useRidesQuery } from '@/features/rides/api';
export {
  newRideHref,
  rideDesignHref,
  rideEditHref,
  rideHref,
  rideImportHref,
  rideScheduleHref,
  rideStatusHref,
  rideVersionHref,
  ridesHref,
} from '@/features/rides/hrefs';
export { RideCard } from '@/features/rides/ride-card';
export { RideClassFilter, RideStatusFilter } from '@/features/rides/ride-filters';
export { RideGrid } from '@/features/rides/ride-grid';
export { eases, statusChoices } from '@/features/rides/status-rules';

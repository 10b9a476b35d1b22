/** What other features and the server may use from rides: runs anywhere (no React Native). */
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
export { eases, statusChoices } from '@/features/rides/status-rules';

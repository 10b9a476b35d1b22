/** What other features may render or hook into from rides (needs the app's runtime). */
export { RIDES_STALE_MS, rideKeys, useRidesQuery } from '@/features/rides/api';
export { RideCard } from '@/features/rides/ride-card';
export { RideClassFilter, RideStatusFilter } from '@/features/rides/ride-filters';
export { RideGrid } from '@/features/rides/ride-grid';
